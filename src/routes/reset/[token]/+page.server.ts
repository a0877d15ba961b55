import { fail, redirect } from '@sveltejs/kit';
import { resetPassword as resetSchema } from '$lib/schemas/account';
import { parseForm } from '$lib/schemas/form';
import { passwordResetIsValid, resetPassword } from '$lib/server/accounts';
import { db } from '$lib/server/db';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ params }) => ({ valid: await passwordResetIsValid(db(), params.token) });

export const actions: Actions = {
	default: async ({ request, params }) => {
		const parsed = parseForm(resetSchema, await request.formData());
		if (!parsed.ok) return fail(400, { errors: parsed.errors });
		const updated = await resetPassword(db(), params.token, parsed.data.password);
		if (!updated) return fail(400, { message: 'This reset link has expired or was used already. Ask for a new one.' });
		redirect(303, `/signin?reset=1`);
	}
};
