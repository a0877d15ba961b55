import { availableParallelism } from 'node:os';
import { z } from 'zod';

/**
 * Every setting the server reads, in one place, from the environment. Read lazily: `vite build`
 * imports server modules to analyse them, and must not need a database address to do so.
 * The names and their local defaults are listed in README.md.
 */
const Env = z.object({
	DATABASE_URL: z.url({ protocol: /^postgres(ql)?$/ }),
	/**
	 * Connections the app's pool may hold. By default twice the cores plus one, the starting point
	 * the PostgreSQL wiki gives ("Number Of Database Connections"): more only queue inside the server.
	 */
	DATABASE_POOL_MAX: z.coerce.number().int().min(1).max(200).optional(),
	SMTP_URL: z.url({ protocol: /^smtps?$/ }),
	MAIL_FROM: z.string().min(3).default('Phasewright <no-reply@phasewright.invalid>'),
	S3_ENDPOINT: z.url().optional(),
	S3_REGION: z.string().min(1).default('us-east-1'),
	S3_BUCKET: z.string().min(3).max(63),
	S3_ACCESS_KEY_ID: z.string().min(1).optional(),
	S3_SECRET_ACCESS_KEY: z.string().min(1).optional(),
	S3_FORCE_PATH_STYLE: z.enum(['true', 'false']).optional(),
	/** Signs the session cookies (JWT). At least 32 random characters: `openssl rand -base64 33`. */
	AUTH_SECRET: z.string().min(32, { error: 'AUTH_SECRET: at least 32 characters' }),
	/**
	 * The public address of the app (adapter-node reads it too). Every link in every e-mail is built
	 * from it, never from the request's Host or X-Forwarded-* headers.
	 */
	ORIGIN: z.url({ protocol: /^https?$/, error: 'ORIGIN: the public address, like https://phasewright.example' }),
	/** E-mail-sending requests one client address may make per 15 minutes (mail-throttle.ts); the local test profile raises it, since every test comes from 127.0.0.1. */
	MAIL_LIMIT_PER_CLIENT: z.coerce.number().int().min(1).default(20),
	/** HTTP address of the local SMTP fake's message list; set by the local scripts only. */
	MAILBOX_URL: z.url().optional(),
	/** "1" where the local scripts run the SMTP fake (never with a real SMTP_URL): opens /dev/mail to loopback. */
	PW_MAIL_FAKE: z.enum(['1']).optional()
});

export type Config = ReturnType<typeof parseConfig>;

export function parseConfig(env: Record<string, string | undefined>) {
	const parsed = Env.safeParse(env);
	if (!parsed.success) {
		const lines = parsed.error.issues.map((i) => `  ${i.path.join('.')}: ${i.message}`);
		throw new Error(`Phasewright is not configured:\n${lines.join('\n')}\nSee README.md, "Configuration".`);
	}
	const e = parsed.data;
	return {
		databaseUrl: e.DATABASE_URL,
		databasePoolMax: e.DATABASE_POOL_MAX ?? 2 * availableParallelism() + 1,
		smtpUrl: e.SMTP_URL,
		mailFrom: e.MAIL_FROM,
		s3: {
			endpoint: e.S3_ENDPOINT,
			region: e.S3_REGION,
			bucket: e.S3_BUCKET,
			credentials:
				e.S3_ACCESS_KEY_ID && e.S3_SECRET_ACCESS_KEY
					? { accessKeyId: e.S3_ACCESS_KEY_ID, secretAccessKey: e.S3_SECRET_ACCESS_KEY }
					: undefined,
			// Self-hosted S3-compatible stores rarely have per-bucket DNS names.
			forcePathStyle: e.S3_FORCE_PATH_STYLE ? e.S3_FORCE_PATH_STYLE === 'true' : !!e.S3_ENDPOINT
		},
		authSecret: e.AUTH_SECRET,
		/** scheme://host[:port] only, no path or trailing slash. */
		origin: new URL(e.ORIGIN).origin,
		mailboxUrl: e.MAILBOX_URL,
		mailFake: e.PW_MAIL_FAKE === '1',
		mailLimitPerClient: e.MAIL_LIMIT_PER_CLIENT
	};
}

let current: Config | undefined;

export function config(): Config {
	current ??= parseConfig(process.env);
	return current;
}
