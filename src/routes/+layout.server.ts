import { signedInUser, workshopCookie } from '$lib/server/access';
import { db } from '$lib/server/db';
import { workshopsOf } from '$lib/server/workshops';
import type { LayoutServerLoad } from './$types';

export const load: LayoutServerLoad = async (event) => {
	const me = await signedInUser(event);
	const workshops = me ? await workshopsOf(db(), me.id) : [];
	const chosen = event.cookies.get(workshopCookie);
	return {
		theme: event.locals.theme,
		user: me ? { name: me.name, email: me.email } : null,
		workshops,
		currentWorkshopId: (workshops.find((w) => w.id === chosen) ?? workshops[0])?.id ?? null
	};
};
