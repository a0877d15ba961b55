// The two local set-ups: `local` for npm start, `test` for npm test. They share one private
// PostgreSQL cluster (separate databases) and use separate ports for everything else, so the
// tests can run while the app is being used.
import { join } from 'node:path';

export const root = join(import.meta.dirname, '..');
export const dataDir = join(root, '.data');
export const runDir = join(dataDir, 'run');

/** Moves every port at once, so two checkouts can run their stacks side by side (PW_PORT_OFFSET=100). */
const offset = Number(process.env.PW_PORT_OFFSET ?? 0);

export const postgres = {
	port: Number(process.env.PW_PG_PORT ?? 54329 + offset),
	host: '127.0.0.1',
	role: 'phasewright',
	password: 'phasewright'
};

export type ProfileName = 'local' | 'test';

export interface Profile {
	name: ProfileName;
	appPort: number;
	database: string;
	smtpPort: number;
	mailboxPort: number;
	s3Port: number;
	bucket: string;
}

export function profile(name: ProfileName): Profile {
	if (name === 'local') {
		return {
			name,
			appPort: Number(process.env.PORT ?? 3000 + offset),
			database: 'phasewright',
			smtpPort: 2525 + offset,
			mailboxPort: 2580 + offset,
			s3Port: 4568 + offset,
			bucket: 'phasewright-uploads'
		};
	}
	return {
		name,
		appPort: Number(process.env.PW_TEST_PORT ?? 3100 + offset),
		database: 'phasewright_test',
		smtpPort: 2625 + offset,
		mailboxPort: 2680 + offset,
		s3Port: 4668 + offset,
		bucket: 'phasewright-test-uploads'
	};
}

export function databaseUrl(p: Profile) {
	return `postgres://${postgres.role}:${postgres.password}@${postgres.host}:${postgres.port}/${p.database}`;
}

/** The fakes' well-known credentials (s3rver accepts these and only these). */
const s3Fake = { accessKeyId: 'S3RVER', secretAccessKey: 'S3RVER' };

/** The environment the app and the tests see for a profile. Real endpoints given by the caller win (local only). */
export function appEnv(p: Profile): Record<string, string> {
	const local: Record<string, string> = {
		DATABASE_URL: databaseUrl(p),
		SMTP_URL: `smtp://127.0.0.1:${p.smtpPort}`,
		MAILBOX_URL: `http://127.0.0.1:${p.mailboxPort}`,
		// The SMTP fake runs (stack.ts removes this when SMTP_URL points at a real server): /dev/mail may open.
		PW_MAIL_FAKE: '1',
		S3_ENDPOINT: `http://127.0.0.1:${p.s3Port}`,
		S3_BUCKET: p.bucket,
		S3_ACCESS_KEY_ID: s3Fake.accessKeyId,
		S3_SECRET_ACCESS_KEY: s3Fake.secretAccessKey,
		HOST: '127.0.0.1',
		PORT: String(p.appPort),
		// adapter-node assumes https unless told the public origin; form posts are checked against it.
		ORIGIN: `http://127.0.0.1:${p.appPort}`,
		APP_URL: `http://127.0.0.1:${p.appPort}`,
		// adapter-node refuses bodies over 512 KB unless told; a phone photo is a few MB (one photo per request, 20 MB cap).
		BODY_SIZE_LIMIT: process.env.BODY_SIZE_LIMIT ?? '21M'
	};
	// Every test reaches the app from 127.0.0.1, so the per-client e-mail limit (mail-throttle.ts) would
	// count the whole run as one client. Its default is checked by tests/integration/hardening.test.ts
	// on an instance of its own, with a client address per test.
	if (p.name === 'test') local.MAIL_LIMIT_PER_CLIENT = '100000';
	return local;
}

/** Which hosted services the caller has pointed at real endpoints (npm start only). */
export function realEndpoints(env: NodeJS.ProcessEnv = process.env) {
	return {
		database: !!env.DATABASE_URL,
		mail: !!env.SMTP_URL,
		storage: !!env.S3_BUCKET
	};
}
