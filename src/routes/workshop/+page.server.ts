import { fail, redirect } from '@sveltejs/kit';
import { invitationId, invite, memberId, memberRole, workshopId } from '$lib/schemas/workshop';
import { parseForm } from '$lib/schemas/form';
import { chooseWorkshop, objectAccess, workshopAccess } from '$lib/server/access';
import { logActivity } from '$lib/server/activity';
import { db } from '$lib/server/db';
import { sendMail } from '$lib/server/mail';
import { mailRefusal, reserveMail } from '$lib/server/mail-throttle';
import { invitationMessage } from '$lib/server/messages';
import { linkTo } from '$lib/server/origin';
import { redirectTarget } from '$lib/server/redirect-target';
import { createInvitation, membersOf, pendingInvitations, removeMember, revokeInvitation, setRole } from '$lib/server/workshops';
import type { Actions, PageServerLoad } from './$types';

const memberRefusals = {
	'not-a-member': 'That person is not a member of this workshop.',
	'last-owner': 'A workshop needs at least one owner: make someone else owner first.'
} as const;

/** Someone outside the workshop is "no such member" (404, as for any id not among yours); the last owner is a conflict. */
const memberStatus = { 'not-a-member': 404, 'last-owner': 409 } as const;

export const load: PageServerLoad = async (event) => {
	const access = await workshopAccess(event, 'read');
	return {
		workshop: access.workshop,
		me: access.user.id,
		can: access.can,
		members: await membersOf(db(), access.workshop.id),
		invitations: access.can.manage ? await pendingInvitations(db(), access.workshop.id) : []
	};
};

export const actions: Actions = {
	invite: async (event) => {
		const form = await event.request.formData();
		const parsed = parseForm(invite, form);
		if (!parsed.ok) {
			await workshopAccess(event, 'manage');
			return fail(400, { action: 'invite', email: String(form.get('email') ?? ''), errors: parsed.errors });
		}
		const fromBuild = parsed.data.buildId ? await objectAccess(event, 'manage', 'build', parsed.data.buildId) : null;
		if (fromBuild && parsed.data.workshopId && fromBuild.workshop.id !== parsed.data.workshopId)
			return fail(400, { action: 'invite', errors: { buildId: 'buildId: a build of the workshop invited into' } });
		const access = fromBuild ?? (await workshopAccess(event, 'manage', parsed.data.workshopId));
		const allowed = await reserveMail(db(), 'invitation', { address: parsed.data.email, client: event.getClientAddress() });
		if (!allowed.ok) return fail(429, { action: 'invite', email: parsed.data.email, message: mailRefusal(allowed) });
		// The invitation and the build's log entry that tells of it are written together or not at all.
		const token = await db().transaction(async (tx) => {
			const created = await createInvitation(tx, {
				workshopId: access.workshop.id,
				email: parsed.data.email,
				role: parsed.data.role as 'editor' | 'viewer',
				invitedBy: access.user.id
			});
			if (fromBuild)
				await logActivity(tx, {
					buildId: fromBuild.buildId,
					actorId: access.user.id,
					kind: 'invitation',
					summary: `${parsed.data.email} invited into ${access.workshop.name} as ${parsed.data.role}`
				});
			return created.token;
		});
		await sendMail(
			invitationMessage({
				to: parsed.data.email,
				workshop: access.workshop.name,
				inviter: access.user.name,
				role: parsed.data.role,
				url: linkTo(`/invite/${token}`)
			})
		);
		return { action: 'invite', invited: parsed.data.email };
	},

	role: async (event) => {
		const access = await workshopAccess(event, 'manage');
		const parsed = parseForm(memberRole, await event.request.formData());
		if (!parsed.ok) return fail(400, { action: 'role', errors: parsed.errors });
		const result = await setRole(db(), access.workshop.id, parsed.data.userId, parsed.data.role as 'owner' | 'editor' | 'viewer');
		if (!result.ok) return fail(memberStatus[result.reason], { action: 'role', message: memberRefusals[result.reason] });
		return { action: 'role' };
	},

	remove: async (event) => {
		const access = await workshopAccess(event, 'manage');
		const parsed = parseForm(memberId, await event.request.formData());
		if (!parsed.ok) return fail(400, { action: 'remove', errors: parsed.errors });
		const result = await removeMember(db(), access.workshop.id, parsed.data.userId);
		if (!result.ok) return fail(memberStatus[result.reason], { action: 'remove', message: memberRefusals[result.reason] });
		return { action: 'remove' };
	},

	revoke: async (event) => {
		const access = await workshopAccess(event, 'manage');
		const parsed = parseForm(invitationId, await event.request.formData());
		if (!parsed.ok) return fail(400, { action: 'revoke', errors: parsed.errors });
		if (!(await revokeInvitation(db(), access.workshop.id, parsed.data.invitationId))) {
			return fail(404, { action: 'revoke', message: 'No such open invitation.' });
		}
		return { action: 'revoke' };
	},

	switch: async (event) => {
		const form = await event.request.formData();
		const parsed = parseForm(workshopId, form);
		if (!parsed.ok) return fail(400, { action: 'switch', errors: parsed.errors });
		await chooseWorkshop(event, parsed.data.workshopId);
		redirect(303, redirectTarget(form.get('redirectTo')));
	}
};
