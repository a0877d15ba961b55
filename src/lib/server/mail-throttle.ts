import { config } from './config';
import type { Queryable } from './db';
import { countInWindow, releaseAttempt } from './throttle';

/**
 * Every request that makes us send an e-mail is counted before anything is sent, per recipient
 * address (of that kind of message), per client address (all kinds together) and, for cutting
 * packages, per workshop; past a limit the request is refused and nothing is sent. Counted in
 * PostgreSQL with the sign-in throttle's atomic upsert (throttle.ts), so a burst of parallel
 * requests cannot slip past the limit, and the limit holds across server processes.
 * The request is counted whether or not the address has an account, so a refusal says nothing
 * about accounts. Limits: common practice (OWASP Forgot Password and Denial of Service cheat
 * sheets), sized so that a person retrying never meets them.
 */
export const mailLimits = {
	windowMs: 15 * 60_000,
	/** Messages of one kind to one address per window. */
	perAddress: 5,
	/** Cutting packages one workshop may send per hour. */
	packagesPerWorkshop: 20,
	packageWindowMs: 60 * 60_000
} as const;

/** E-mail-sending requests from one client address per window (MAIL_LIMIT_PER_CLIENT, 20 unless set). */
export const perClientLimit = () => config().mailLimitPerClient;

export type MailKind = 'sign-in-link' | 'sign-up' | 'reset' | 'invitation' | 'cutting-package';

export type MailVerdict = { ok: true } | { ok: false; by: 'address' | 'client' | 'workshop'; retryAfterS: number };

/** Counts one e-mail-sending request; refused ones give their counts back (they send nothing). */
export async function reserveMail(
	database: Queryable,
	kind: MailKind,
	who: { address: string; client: string; workshopId?: string }
): Promise<MailVerdict> {
	const checks = [
		{
			by: 'address' as const,
			key: `mail:${kind}:to:${who.address.toLowerCase()}`,
			limit: mailLimits.perAddress,
			windowMs: mailLimits.windowMs
		},
		{ by: 'client' as const, key: `mail:client:${who.client}`, limit: perClientLimit(), windowMs: mailLimits.windowMs },
		...(who.workshopId
			? [
					{
						by: 'workshop' as const,
						key: `mail:${kind}:workshop:${who.workshopId}`,
						limit: mailLimits.packagesPerWorkshop,
						windowMs: mailLimits.packageWindowMs
					}
				]
			: [])
	];
	let refused: MailVerdict | null = null;
	for (const check of checks) {
		const { count, windowStart } = await countInWindow(database, check.key, check.windowMs);
		if (count > check.limit && !refused) {
			refused = {
				ok: false,
				by: check.by,
				retryAfterS: Math.max(1, Math.ceil((windowStart.getTime() + check.windowMs - Date.now()) / 1000))
			};
		}
	}
	if (!refused) return { ok: true };
	await releaseAttempt(
		database,
		checks.map((c) => c.key)
	);
	return refused;
}

const whose = {
	address: 'Too many e-mails were asked for this address',
	client: 'Too many e-mails were asked for from your network',
	workshop: 'This workshop has sent as many cutting packages as it may in an hour'
} as const;

/** What a refused request is told: why, and when to try again. Nothing was sent. */
export function mailRefusal(verdict: Extract<MailVerdict, { ok: false }>): string {
	const minutes = Math.ceil(verdict.retryAfterS / 60);
	return `${whose[verdict.by]}; nothing was sent. Try again in ${minutes} minute${minutes === 1 ? '' : 's'}.`;
}

/** Where Auth.js goes instead of sending a sign-in link past the limit; null while within it. */
export async function linkThrottledTarget(database: Queryable, address: string, client: string): Promise<string | null> {
	const verdict = await reserveMail(database, 'sign-in-link', { address, client });
	if (verdict.ok) return null;
	return `/signin?${new URLSearchParams({ error: 'MailThrottled', by: verdict.by, retry: String(verdict.retryAfterS) })}`;
}

/** The refusal a throttled sign-in link's target (above) stands for, or null when it is not one. */
export function throttledFrom(target: URL): string | null {
	if (target.searchParams.get('error') !== 'MailThrottled') return null;
	const by = target.searchParams.get('by');
	const retryAfterS = Number(target.searchParams.get('retry'));
	return mailRefusal({
		ok: false,
		by: by === 'client' || by === 'workshop' ? by : 'address',
		retryAfterS: Number.isFinite(retryAfterS) && retryAfterS > 0 ? Math.min(retryAfterS, 3600) : 900
	});
}
