import { createHash, randomBytes } from 'node:crypto';

/** A random link token for an e-mail; the database keeps only its hash, so a leaked table opens nothing. */
export function newToken(): { token: string; hash: string } {
	const token = randomBytes(32).toString('base64url');
	return { token, hash: hashToken(token) };
}

export function hashToken(token: string): string {
	return createHash('sha256').update(token).digest('hex');
}
