import { signedInUser, workshopCookie, workshopsFor } from '$lib/server/access';
import type { LayoutServerLoad } from './$types';

export const load: LayoutServerLoad = async (event) => {
	const me = await signedInUser(event);
	const workshops = me ? await workshopsFor(event, me.id) : [];
	const chosen = event.cookies.get(workshopCookie);
	return {
		theme: event.locals.theme,
		user: me ? { name: me.name, email: me.email } : null,
		workshops,
		currentWorkshopId: (workshops.find((w) => w.id === chosen) ?? workshops[0])?.id ?? null
	};
};
