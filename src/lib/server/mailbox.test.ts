import { describe, expect, it } from 'vitest';
import { mailboxOpen } from './mailbox';

const local = { mailboxUrl: 'http://127.0.0.1:2680', mailFake: true, smtpUrl: 'smtp://127.0.0.1:2625', origin: 'http://127.0.0.1:3100' };
const here = { client: '127.0.0.1', host: '127.0.0.1:3100' };

describe('who may see the local mailbox', () => {
	it('opens to this machine under the configured host while the SMTP fake runs', () => {
		expect(mailboxOpen(local, here)).toBe(true);
		expect(mailboxOpen(local, { client: '::1', host: '127.0.0.1:3100' })).toBe(true);
	});

	it('stays shut to other machines and other host names (a rebound DNS name)', () => {
		expect(mailboxOpen(local, { client: '192.0.2.7', host: '127.0.0.1:3100' })).toBe(false);
		expect(mailboxOpen(local, { client: '127.0.0.1', host: 'evil.example' })).toBe(false);
		expect(mailboxOpen(local, { client: '127.0.0.1', host: null })).toBe(false);
	});

	it('stays shut without the fake: no flag, no MAILBOX_URL, or a real SMTP server', () => {
		expect(mailboxOpen({ ...local, mailFake: false }, here)).toBe(false);
		expect(mailboxOpen({ ...local, mailboxUrl: undefined }, here)).toBe(false);
		expect(mailboxOpen({ ...local, smtpUrl: 'smtps://user:pw@smtp.mailhost.example:465' }, here)).toBe(false);
	});
});
