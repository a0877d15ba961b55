import { and, eq, lt } from 'drizzle-orm';
import type { Queryable } from './db';
import { userSession } from './db/schema';

/**
 * A session lives at most this long from sign-in, however often it is used (an absolute limit,
 * after OWASP's Session Management cheat sheet); the cookie's own lifetime is the same.
 */
export const sessionLifetimeS = 30 * 24 * 60 * 60;

/** A new row for a browser that just signed in; its id goes into the session cookie. Old rows of the user go. */
export async function startSession(database: Queryable, userId: string): Promise<string> {
	await database
		.delete(userSession)
		.where(and(eq(userSession.userId, userId), lt(userSession.createdAt, new Date(Date.now() - sessionLifetimeS * 1000))));
	const [row] = await database.insert(userSession).values({ userId }).returning({ id: userSession.id });
	return row!.id;
}

/** Sign-out: this browser's session ends, the user's others go on. */
export async function endSession(database: Queryable, sessionId: string): Promise<void> {
	await database.delete(userSession).where(eq(userSession.id, sessionId));
}

/** Password change or reset, "sign out everywhere", a cleared password: every session of the user ends now. */
export async function endAllSessions(database: Queryable, userId: string): Promise<void> {
	await database.delete(userSession).where(eq(userSession.userId, userId));
}

/** The session id a token carries, if it is one of ours (tokens from before sessions had rows carry none). */
export function sessionIdOf(value: unknown): string | null {
	return typeof value === 'string' && /^[0-9a-f-]{36}$/.test(value) ? value : null;
}
