import { fail, redirect } from '@sveltejs/kit';
import { changePassword as changeSchema } from '$lib/schemas/account';
import { parseForm } from '$lib/schemas/form';
import { requireUser } from '$lib/server/access';
import { accountState } from '$lib/server/address-proof';
import { db } from '$lib/server/db';
import { changePassword } from '$lib/server/password-change';
import { redirectTarget } from '$lib/server/redirect-target';
import { endAllSessions } from '$lib/server/sessions';
import { endSession, passwordSignIn, sendSignInLink } from '$lib/server/sign-in';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	const me = await requireUser(event);
	return { email: me.email, name: me.name, ...(await accountState(db(), me.id)) };
};

export const actions: Actions = {
	/** Mails a link that confirms the address (Auth.js's sign-in link) and comes back to `redirectTo`. */
	confirm: async (event) => {
		const me = await requireUser(event);
		const form = await event.request.formData();
		if ((await accountState(db(), me.id)).confirmed) return fail(409, { action: 'confirm', message: 'This address is confirmed already.' });
		await sendSignInLink(event, me.email, redirectTarget(form.get('redirectTo'), '/account'));
		return { action: 'confirm', sent: me.email };
	},

	password: async (event) => {
		const me = await requireUser(event);
		const parsed = parseForm(changeSchema, await event.request.formData());
		if (!parsed.ok) return fail(400, { action: 'password', errors: parsed.errors });
		const changed = await changePassword(db(), me, parsed.data.current, parsed.data.password, event.getClientAddress());
		if (!changed.ok) {
			return fail(changed.reason === 'throttled' ? 429 : 400, {
				action: 'password',
				errors: {
					current:
						changed.reason === 'throttled' ? 'current: too many failed attempts; wait 15 minutes' : 'current: not the current password'
				}
			});
		}
		// Every session ended, this one too: sign this browser in again with the new password.
		await passwordSignIn(event, me.email, parsed.data.password);
		return { action: 'password', changed: true };
	},

	/** Ends every session of the account, this browser's too. */
	everywhere: async (event) => {
		const me = await requireUser(event);
		await endAllSessions(db(), me.id);
		await endSession(event);
		redirect(303, '/signin?redirectTo=%2Faccount');
	}
};
