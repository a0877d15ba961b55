import { fail, redirect } from '@sveltejs/kit';
import { chooseWorkshop, requireUser, signedInUser } from '$lib/server/access';
import { accountState } from '$lib/server/address-proof';
import { db } from '$lib/server/db';
import { acceptInvitation, invitationByToken } from '$lib/server/workshops';
import type { Actions, PageServerLoad } from './$types';

const refusals = {
	unknown: 'This invitation link is not valid. Check that the whole link was copied.',
	expired: 'This invitation has expired. Ask the workshop owner for a new one.',
	used: 'This invitation was accepted already; each link works once.',
	'wrong-account': 'This invitation is for another e-mail address. Sign in with the address it was sent to.',
	unconfirmed: 'Confirm your address first: open the link we mailed to it (or send a new one below), then accept.'
} as const;

const refusalStatus = { unknown: 410, expired: 410, used: 410, 'wrong-account': 403, unconfirmed: 403 } as const;

export const load: PageServerLoad = async (event) => {
	const found = await invitationByToken(db(), event.params.token);
	const me = await signedInUser(event);
	if (found.state !== 'valid') return { state: found.state, message: refusals[found.state], signedInAs: me?.email ?? null };
	return {
		state: found.state,
		message: null,
		workshop: found.workshopName,
		inviter: found.inviter,
		role: found.invitation.role,
		email: found.invitation.email,
		signedInAs: me?.email ?? null,
		confirmed: me ? (await accountState(db(), me.id)).confirmed : false
	};
};

export const actions: Actions = {
	default: async (event) => {
		const me = await requireUser(event);
		const result = await acceptInvitation(db(), event.params.token, me);
		if (!result.ok)
			return fail(refusalStatus[result.reason], { message: refusals[result.reason], unconfirmed: result.reason === 'unconfirmed' });
		await chooseWorkshop(event, result.workshopId);
		redirect(303, '/builds');
	}
};
