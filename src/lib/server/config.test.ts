import { describe, expect, it } from 'vitest';
import { parseConfig } from './config';

const minimal = {
	DATABASE_URL: 'postgres://u:p@127.0.0.1:5432/db',
	SMTP_URL: 'smtp://127.0.0.1:25',
	S3_BUCKET: 'uploads',
	AUTH_SECRET: 'x'.repeat(32),
	ORIGIN: 'https://phasewright.example/'
};

describe('server configuration', () => {
	it('fills the documented defaults', () => {
		const c = parseConfig(minimal);
		expect(c.s3.region).toBe('us-east-1');
		expect(c.s3.forcePathStyle).toBe(false);
		expect(c.s3.credentials).toBeUndefined();
		expect(c.mailboxUrl).toBeUndefined();
		expect(c.mailFake).toBe(false);
		// The origin alone: links are built as origin + path.
		expect(c.origin).toBe('https://phasewright.example');
	});

	it('uses path-style addressing for a self-hosted endpoint unless told otherwise', () => {
		expect(parseConfig({ ...minimal, S3_ENDPOINT: 'http://127.0.0.1:4568' }).s3.forcePathStyle).toBe(true);
		expect(parseConfig({ ...minimal, S3_ENDPOINT: 'http://127.0.0.1:4568', S3_FORCE_PATH_STYLE: 'false' }).s3.forcePathStyle).toBe(false);
	});

	it('names every missing or malformed variable', () => {
		expect(() => parseConfig({ DATABASE_URL: 'mysql://x', S3_BUCKET: 'b' })).toThrow(/DATABASE_URL[\s\S]*SMTP_URL/);
	});
});
