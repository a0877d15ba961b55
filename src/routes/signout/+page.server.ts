import { redirect } from '@sveltejs/kit';
import { endSession } from '$lib/server/sign-in';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = () => redirect(303, '/');

export const actions: Actions = {
	default: async (event) => {
		await endSession(event);
		redirect(303, '/');
	}
};
