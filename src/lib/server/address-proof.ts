import { createHmac, timingSafeEqual } from 'node:crypto';
import type { Cookies } from '@sveltejs/kit';
import { eq, sql } from 'drizzle-orm';
import { config } from './config';
import type { Database } from './db';
import { user } from './db/schema';
import { endAllSessions } from './sessions';

// An account is unconfirmed until someone opens a link mailed to its address (Auth.js's sign-in
// link). A password set before that is one nobody verified: whoever signed up may not own the
// address. The browser that signed up carries a proof of the password it set (this cookie); when
// the link is opened there, the password stands. Opened anywhere else, the link proves the
// address but not the password: the password is cleared and every other session ends.

export const proofCookie = 'pw-signup-proof';
const proofLifetimeS = 7 * 24 * 60 * 60;

/** Ties the cookie to this account and this password: a later password (or account) makes it worthless. */
function proofOf(userId: string, passwordHash: string): string {
	return createHmac('sha256', config().authSecret).update(`signup-proof\n${userId}\n${passwordHash}`).digest('base64url');
}

function sameProof(a: string, b: string): boolean {
	const x = Buffer.from(a);
	const y = Buffer.from(b);
	return x.length === y.length && timingSafeEqual(x, y);
}

/** Marks the browser that just signed up as the one that chose the account's password. */
export async function rememberSignUp(database: Database, cookies: Cookies, userId: string, secure: boolean): Promise<void> {
	const [row] = await database.select({ passwordHash: user.passwordHash }).from(user).where(eq(user.id, userId));
	if (!row?.passwordHash) return;
	cookies.set(proofCookie, `${userId}.${proofOf(userId, row.passwordHash)}`, {
		path: '/',
		httpOnly: true,
		sameSite: 'lax',
		secure,
		maxAge: proofLifetimeS
	});
}

export type Confirmation = 'confirmed' | 'password-kept' | 'password-cleared' | 'already';

/** The address of `userId` was proved by a link (Auth.js's sign-in link was opened). */
export async function confirmAddress(database: Database, userId: string, proofCookieValue: string | undefined): Promise<Confirmation> {
	return database.transaction(async (tx) => {
		const [row] = await tx
			.select({ passwordHash: user.passwordHash, passwordConfirmedAt: user.passwordConfirmedAt, emailVerified: user.emailVerified })
			.from(user)
			.where(eq(user.id, userId))
			.for('update');
		if (!row) return 'already';
		await tx
			.update(user)
			.set({ emailVerified: sql`coalesce(${user.emailVerified}, now())` })
			.where(eq(user.id, userId));
		if (!row.passwordHash || row.passwordConfirmedAt) return row.emailVerified ? 'already' : 'confirmed';
		const [cookieUser, proof] = (proofCookieValue ?? '').split('.');
		if (cookieUser === userId && proof && sameProof(proof, proofOf(userId, row.passwordHash))) {
			await tx.update(user).set({ passwordConfirmedAt: new Date() }).where(eq(user.id, userId));
			return 'password-kept';
		}
		await tx.update(user).set({ passwordHash: null }).where(eq(user.id, userId));
		await endAllSessions(tx, userId);
		return 'password-cleared';
	});
}

/** Whether the address's account exists and is still unconfirmed (its sign-in link then says "confirm"). */
export async function isUnconfirmed(database: Database, email: string): Promise<boolean> {
	const [row] = await database.select({ emailVerified: user.emailVerified }).from(user).where(eq(user.email, email.toLowerCase()));
	return !!row && !row.emailVerified;
}

/** What the account page and the invitation page say about the account. */
export async function accountState(database: Database, userId: string): Promise<{ confirmed: boolean; hasPassword: boolean }> {
	const [row] = await database
		.select({ emailVerified: user.emailVerified, passwordHash: user.passwordHash })
		.from(user)
		.where(eq(user.id, userId));
	return { confirmed: !!row?.emailVerified, hasPassword: !!row?.passwordHash };
}
