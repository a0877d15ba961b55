import { and, asc, eq, gt, isNull } from 'drizzle-orm';
import type { Database, Queryable } from './db';
import { invitation, member, user, workshop, type Role } from './db/schema';
import { hashToken, newToken } from './tokens';

export const invitationLifetimeMs = 7 * 24 * 60 * 60_000;

export interface WorkshopMembership {
	id: string;
	name: string;
	role: Role;
}

/** The workshops a user belongs to, their own first, then by name. */
export async function workshopsOf(database: Queryable, userId: string): Promise<WorkshopMembership[]> {
	return database
		.select({ id: workshop.id, name: workshop.name, role: member.role })
		.from(member)
		.innerJoin(workshop, eq(member.workshopId, workshop.id))
		.where(eq(member.userId, userId))
		.orderBy(asc(member.createdAt), asc(workshop.name));
}

export async function membersOf(database: Queryable, workshopId: string) {
	return database
		.select({ userId: user.id, name: user.name, email: user.email, role: member.role, since: member.createdAt })
		.from(member)
		.innerJoin(user, eq(member.userId, user.id))
		.where(eq(member.workshopId, workshopId))
		.orderBy(asc(member.createdAt));
}

export async function pendingInvitations(database: Queryable, workshopId: string) {
	return database
		.select({ id: invitation.id, email: invitation.email, role: invitation.role, expiresAt: invitation.expiresAt })
		.from(invitation)
		.where(and(eq(invitation.workshopId, workshopId), isNull(invitation.acceptedAt), gt(invitation.expiresAt, new Date())))
		.orderBy(asc(invitation.createdAt));
}

export async function createInvitation(
	database: Queryable,
	input: { workshopId: string; email: string; role: Exclude<Role, 'owner'>; invitedBy: string | null }
) {
	const { token, hash } = newToken();
	const [row] = await database
		.insert(invitation)
		.values({ ...input, tokenHash: hash, expiresAt: new Date(Date.now() + invitationLifetimeMs) })
		.returning();
	return { token, invitation: row! };
}

export async function revokeInvitation(database: Queryable, workshopId: string, invitationId: string) {
	const gone = await database
		.delete(invitation)
		.where(and(eq(invitation.id, invitationId), eq(invitation.workshopId, workshopId), isNull(invitation.acceptedAt)))
		.returning({ id: invitation.id });
	return gone.length > 0;
}

export type InvitationState = 'valid' | 'expired' | 'used' | 'unknown';

export async function invitationByToken(database: Queryable, token: string) {
	const [row] = await database
		.select({ invitation, workshopName: workshop.name, inviter: user.name })
		.from(invitation)
		.innerJoin(workshop, eq(invitation.workshopId, workshop.id))
		.leftJoin(user, eq(invitation.invitedBy, user.id))
		.where(eq(invitation.tokenHash, hashToken(token)));
	if (!row) return { state: 'unknown' as const };
	const state: InvitationState = row.invitation.acceptedAt ? 'used' : row.invitation.expiresAt <= new Date() ? 'expired' : 'valid';
	return { state, invitation: row.invitation, workshopName: row.workshopName, inviter: row.inviter };
}

export type AcceptResult =
	{ ok: true; workshopId: string; role: Role } | { ok: false; reason: Exclude<InvitationState, 'valid'> | 'wrong-account' | 'unconfirmed' };

const rank: Record<Role, number> = { viewer: 1, editor: 2, owner: 3 };

/**
 * Accepts an invitation for the signed-in user. Single use even under concurrent clicks: the
 * row is locked, and spent in the same transaction that adds the member. Only the invited address
 * may accept, and only once that address is confirmed. Someone already in the workshop keeps the higher of their role and the invited one.
 */
export async function acceptInvitation(database: Database, token: string, by: { id: string; email: string }): Promise<AcceptResult> {
	return database.transaction(async (tx) => {
		const [inv] = await tx
			.select()
			.from(invitation)
			.where(eq(invitation.tokenHash, hashToken(token)))
			.for('update');
		if (!inv) return { ok: false, reason: 'unknown' };
		if (inv.acceptedAt) return { ok: false, reason: 'used' };
		if (inv.expiresAt <= new Date()) return { ok: false, reason: 'expired' };
		if (inv.email.toLowerCase() !== by.email.toLowerCase()) return { ok: false, reason: 'wrong-account' };
		// Sign-up does not prove the address: only an account whose address was confirmed by a link joins.
		const [me] = await tx.select({ emailVerified: user.emailVerified }).from(user).where(eq(user.id, by.id));
		if (!me?.emailVerified) return { ok: false, reason: 'unconfirmed' };

		const [existing] = await tx
			.select({ role: member.role })
			.from(member)
			.where(and(eq(member.workshopId, inv.workshopId), eq(member.userId, by.id)));
		const role = existing && rank[existing.role] > rank[inv.role] ? existing.role : inv.role;
		await tx
			.insert(member)
			.values({ workshopId: inv.workshopId, userId: by.id, role })
			.onConflictDoUpdate({ target: [member.workshopId, member.userId], set: { role } });
		await tx.update(invitation).set({ acceptedAt: new Date(), acceptedBy: by.id }).where(eq(invitation.id, inv.id));
		return { ok: true, workshopId: inv.workshopId, role };
	});
}

const owners = (rows: { role: Role }[]) => rows.filter((r) => r.role === 'owner').length;

export type MemberChange = { ok: true } | { ok: false; reason: 'not-a-member' | 'last-owner' };

/** Changes a member's role; a workshop always keeps at least one owner. */
export async function setRole(database: Database, workshopId: string, userId: string, role: Role): Promise<MemberChange> {
	return database.transaction(async (tx) => {
		// Lock the workshop's member rows so two owners demoting each other cannot leave none.
		const rows = await tx.select().from(member).where(eq(member.workshopId, workshopId)).for('update');
		const target = rows.find((r) => r.userId === userId);
		if (!target) return { ok: false, reason: 'not-a-member' };
		if (target.role === 'owner' && role !== 'owner' && owners(rows) <= 1) return { ok: false, reason: 'last-owner' };
		await tx
			.update(member)
			.set({ role })
			.where(and(eq(member.workshopId, workshopId), eq(member.userId, userId)));
		return { ok: true };
	});
}

export async function removeMember(database: Database, workshopId: string, userId: string): Promise<MemberChange> {
	return database.transaction(async (tx) => {
		const rows = await tx.select().from(member).where(eq(member.workshopId, workshopId)).for('update');
		const target = rows.find((r) => r.userId === userId);
		if (!target) return { ok: false, reason: 'not-a-member' };
		if (target.role === 'owner' && owners(rows) <= 1) return { ok: false, reason: 'last-owner' };
		await tx.delete(member).where(and(eq(member.workshopId, workshopId), eq(member.userId, userId)));
		return { ok: true };
	});
}
