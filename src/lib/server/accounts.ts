import { hash, verify } from '@node-rs/argon2';
import { and, eq, gt, sql } from 'drizzle-orm';
import type { Database, Queryable } from './db';
import { member, passwordReset, user, workshop } from './db/schema';
import { clearFailures, delayFor, releaseAttempt, reserveAttempt, throttleKeys, throttlePolicy } from './throttle';
import { endAllSessions } from './sessions';
import { hashToken, newToken } from './tokens';

export interface AccountUser {
	id: string;
	email: string;
	name: string | null;
}

// argon2id with the library's defaults (m = 19 MiB, t = 2, p = 1): OWASP's minimum recommendation.
const hashPassword = (plain: string) => hash(plain);

// Verified against when the address is unknown, so that a wrong address costs as long as a wrong password.
const decoyHash = hash('decoy password that matches nothing');

/** Every user owns one workshop of their own from the start. */
export async function createPersonalWorkshop(tx: Queryable, owner: { id: string; name: string | null; email: string }) {
	const label = owner.name?.trim() || owner.email.split('@')[0];
	const [shop] = await tx
		.insert(workshop)
		.values({ name: `${label}'s workshop`, slug: `w-${owner.id.slice(0, 8)}-${Date.now().toString(36)}` })
		.returning();
	await tx.insert(member).values({ workshopId: shop!.id, userId: owner.id, role: 'owner' });
	return shop!;
}

/** Sign-up: the user and their personal workshop, together or not at all. */
export async function createAccount(
	database: Database,
	input: { name: string; email: string; password: string }
): Promise<{ ok: true; user: AccountUser } | { ok: false; reason: 'taken' }> {
	const passwordHash = await hashPassword(input.password);
	return database.transaction(async (tx) => {
		const [created] = await tx
			.insert(user)
			.values({ name: input.name, email: input.email, passwordHash })
			.onConflictDoNothing({ target: user.email })
			.returning({ id: user.id, email: user.email, name: user.name });
		if (!created) return { ok: false as const, reason: 'taken' as const };
		await createPersonalWorkshop(tx, created);
		return { ok: true as const, user: created };
	});
}

export type PasswordCheck =
	{ ok: true; user: AccountUser } | { ok: false; reason: 'invalid' } | { ok: false; reason: 'throttled'; retryAfterS: number };

/**
 * Checks an e-mail and password. The answer for an unknown address and a wrong password is the
 * same, and takes as long. Repeated failures are slowed down and then refused (throttle.ts).
 */
export async function checkPassword(database: Database, email: string, password: string, client: string): Promise<PasswordCheck> {
	const keys = throttleKeys(email, client);
	// Counted before the check, so parallel attempts cannot slip past the limit (throttle.ts).
	const counts = await reserveAttempt(database, [keys.email, keys.client]);
	const byEmail = counts.get(keys.email)!;
	const byClient = counts.get(keys.client)!;
	const locked =
		(byEmail.failures > throttlePolicy.lockAfter.email && byEmail) || (byClient.failures > throttlePolicy.lockAfter.client && byClient);
	if (locked) {
		// A refused attempt is not checked, so it does not count as a failure.
		await releaseAttempt(database, [keys.email, keys.client]);
		const retryAfterS = Math.ceil((locked.windowStart.getTime() + throttlePolicy.windowMs - Date.now()) / 1000);
		return { ok: false, reason: 'throttled', retryAfterS };
	}

	const [found] = await database.select().from(user).where(eq(user.email, email));
	const good = found?.passwordHash ? await verify(found.passwordHash, password) : (await verify(await decoyHash, password), false);
	if (good && found) {
		await clearFailures(database, keys.email);
		await releaseAttempt(database, [keys.client]);
		return { ok: true, user: { id: found.id, email: found.email, name: found.name } };
	}
	const wait = delayFor(Math.max(byEmail.failures, byClient.failures));
	if (wait) await new Promise((r) => setTimeout(r, wait));
	return { ok: false, reason: 'invalid' };
}

export const resetLinkLifetimeMs = 60 * 60_000;

/** A reset token for the address's account, or null when there is no such account (the caller says the same either way). */
export async function createPasswordReset(database: Database, email: string): Promise<{ token: string; user: AccountUser } | null> {
	const [found] = await database.select({ id: user.id, email: user.email, name: user.name }).from(user).where(eq(user.email, email));
	if (!found) return null;
	const { token, hash: tokenHash } = newToken();
	await database.insert(passwordReset).values({ tokenHash, userId: found.id, expiresAt: new Date(Date.now() + resetLinkLifetimeMs) });
	return { token, user: found };
}

export async function passwordResetIsValid(database: Database, token: string): Promise<boolean> {
	const [row] = await database
		.select({ userId: passwordReset.userId })
		.from(passwordReset)
		.where(and(eq(passwordReset.tokenHash, hashToken(token)), gt(passwordReset.expiresAt, new Date())));
	return !!row;
}

/**
 * Sets the new password, spends every reset link of that user and ends every session. The link
 * came by e-mail, so the address and the new password are confirmed (address-proof.ts).
 */
export async function resetPassword(database: Database, token: string, newPassword: string): Promise<AccountUser | null> {
	const passwordHash = await hashPassword(newPassword);
	return database.transaction(async (tx) => {
		const [row] = await tx
			.delete(passwordReset)
			.where(and(eq(passwordReset.tokenHash, hashToken(token)), gt(passwordReset.expiresAt, new Date())))
			.returning({ userId: passwordReset.userId });
		if (!row) return null;
		await tx.delete(passwordReset).where(eq(passwordReset.userId, row.userId));
		const [updated] = await tx
			.update(user)
			.set({ passwordHash, passwordConfirmedAt: new Date(), emailVerified: sql`coalesce(${user.emailVerified}, now())` })
			.where(eq(user.id, row.userId))
			.returning({ id: user.id, email: user.email, name: user.name });
		await endAllSessions(tx, row.userId);
		await clearFailures(tx, throttleKeys(updated!.email, '').email);
		return updated ?? null;
	});
}
