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

/** Failures counted in the current window for each key (expired windows count as zero). */
export async function failureCounts(database: Queryable, keys: string[]): Promise<Map<string, { failures: number; windowStart: Date }>> {
	const rows = await database.select().from(signInFailure).where(inArray(signInFailure.key, keys));
	const now = Date.now();
	return new Map(
		rows
			.filter((r) => now - r.windowStart.getTime() < throttlePolicy.windowMs)
			.map((r) => [r.key, { failures: r.failures, windowStart: r.windowStart }])
	);
}

export async function recordFailure(database: Queryable, keys: string[]) {
	const windowStart = new Date(Date.now() - throttlePolicy.windowMs);
	for (const key of keys) {
		await database
			.insert(signInFailure)
			.values({ key, failures: 1 })
			.onConflictDoUpdate({
				target: signInFailure.key,
				set: {
					failures: sql`case when ${signInFailure.windowStart} < ${windowStart} then 1 else ${signInFailure.failures} + 1 end`,
					windowStart: sql`case when ${signInFailure.windowStart} < ${windowStart} then now() else ${signInFailure.windowStart} end`
				}
			});
	}
}

export async function clearFailures(database: Queryable, key: string) {
	await database.delete(signInFailure).where(inArray(signInFailure.key, [key]));
}
