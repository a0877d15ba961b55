import { hash } from '@node-rs/argon2';
import { eq } from 'drizzle-orm';
import { checkPassword } from './accounts';
import type { Database } from './db';
import { user } from './db/schema';
import { endAllSessions } from './sessions';

export type PasswordChange = { ok: true } | { ok: false; reason: 'invalid' | 'throttled' };

/**
 * A signed-in user sets a new password, knowing the current one (checked and throttled as a
 * sign-in). Every session ends; the caller signs this browser in again. The new password counts
 * as confirmed only when the address is (address-proof.ts): else whoever knows it is still unproved.
 */
export async function changePassword(
	database: Database,
	me: { id: string; email: string },
	current: string,
	next: string,
	client: string
): Promise<PasswordChange> {
	const check = await checkPassword(database, me.email, current, client);
	if (!check.ok) return { ok: false, reason: check.reason };
	if (check.user.id !== me.id) return { ok: false, reason: 'invalid' };
	const passwordHash = await hash(next);
	await database.transaction(async (tx) => {
		const [row] = await tx.select({ emailVerified: user.emailVerified }).from(user).where(eq(user.id, me.id)).for('update');
		await tx
			.update(user)
			.set({ passwordHash, passwordConfirmedAt: row?.emailVerified ? new Date() : null })
			.where(eq(user.id, me.id));
		await endAllSessions(tx, me.id);
	});
	return { ok: true };
}
