import { inArray, sql } from 'drizzle-orm';
import type { Queryable } from './db';
import { signInFailure } from './db/schema';

/**
 * Slowing down password guessing (common practice, after OWASP's authentication cheat sheet):
 * failures are counted per e-mail address and per client address over a 15-minute window. From
 * the fourth failure on, each answer waits longer (0.25 s doubling, at most 4 s); past the limit
 * the key is refused until the window ends. A success clears the e-mail's count.
 */
export const throttlePolicy = {
	windowMs: 15 * 60_000,
	freeFailures: 3,
	baseDelayMs: 250,
	maxDelayMs: 4_000,
	lockAfter: { email: 10, client: 50 }
} as const;

export const throttleKeys = (email: string, client: string) => ({ email: `email:${email}`, client: `client:${client}` });

export function delayFor(failures: number): number {
	const over = failures - throttlePolicy.freeFailures;
	if (over <= 0) return 0;
	return Math.min(throttlePolicy.baseDelayMs * 2 ** (over - 1), throttlePolicy.maxDelayMs);
}

/**
 * Counts an attempt against each key before its password is checked, one atomic upsert per key,
 * and returns the counts with this attempt in them. Counting first is what holds the limit
 * under parallel attempts: read-then-record let a burst of guesses all see the count from before
 * them (25 parallel guesses were all checked against a limit of 10). An attempt that turns out
 * not to be a failure gives its count back with releaseAttempt().
 */
export async function reserveAttempt(database: Queryable, keys: string[]): Promise<Map<string, { failures: number; windowStart: Date }>> {
	const counts = new Map<string, { failures: number; windowStart: Date }>();
	for (const key of keys) {
		const row = await countInWindow(database, key, throttlePolicy.windowMs);
		counts.set(key, { failures: row.count, windowStart: row.windowStart });
	}
	return counts;
}

/**
 * Counts one event against a key in a fixed window of its own, in one atomic upsert, and returns
 * the count with this event in it and when the window began. The sign-in throttle above and the
 * e-mail throttle (mail-throttle.ts) both count here, under keys of their own.
 */
export async function countInWindow(database: Queryable, key: string, windowMs: number): Promise<{ count: number; windowStart: Date }> {
	const windowStart = new Date(Date.now() - windowMs);
	const [row] = await database
		.insert(signInFailure)
		.values({ key, failures: 1 })
		.onConflictDoUpdate({
			target: signInFailure.key,
			set: {
				failures: sql`case when ${signInFailure.windowStart} < ${windowStart} then 1 else ${signInFailure.failures} + 1 end`,
				windowStart: sql`case when ${signInFailure.windowStart} < ${windowStart} then now() else ${signInFailure.windowStart} end`
			}
		})
		.returning({ count: signInFailure.failures, windowStart: signInFailure.windowStart });
	return row!;
}

/** Gives back an attempt counted by reserveAttempt() that was not a failure (refused unchecked, or a success). */
export async function releaseAttempt(database: Queryable, keys: string[]) {
	if (!keys.length) return;
	await database
		.update(signInFailure)
		.set({ failures: sql`greatest(${signInFailure.failures} - 1, 0)` })
		.where(inArray(signInFailure.key, keys));
}

export async function clearFailures(database: Queryable, key: string) {
	await database.delete(signInFailure).where(inArray(signInFailure.key, [key]));
}
