import { eq } from 'drizzle-orm';
import { afterAll, describe, expect, it } from 'vitest';
import { connect } from '../../src/lib/server/db';
import { signInFailure, user } from '../../src/lib/server/db/schema';
import { throttleKeys, throttlePolicy } from '../../src/lib/server/throttle';
import { Client, freshEmail, mailTo, signUp } from '../support/client';

const database = connect(process.env.DATABASE_URL!);
afterAll(() => database.$client.end());

const usersWith = async (email: string) => (await database.select().from(user).where(eq(user.email, email))).length;

type BuildsAnswer = { workshop: { id: string; name: string }; role: string; builds: unknown[] };

describe('sign-up', () => {
	it('creates the account with a personal workshop it owns, and signs in', async () => {
		const email = freshEmail('builder');
		const client = new Client();
		const result = await client.action('/signup', '', { name: 'Ana Builder', email, password: 'a long enough secret' });
		expect(result).toMatchObject({ type: 'redirect', location: '/builds' });

		const { status, body } = await client.json<BuildsAnswer>('/api/v1/builds');
		expect(status).toBe(200);
		expect(body.workshop.name).toBe("Ana Builder's workshop");
		expect(body.role).toBe('owner');
		expect(body.builds).toEqual([]);

		const [row] = await database.select().from(user).where(eq(user.email, email));
		expect(row!.passwordHash).toMatch(/^\$argon2id\$/);
	});

	it('stores the address in lower case and signs in with any case', async () => {
		const email = freshEmail('MixedCase');
		await signUp('Case', email);
		expect(await usersWith(email.toLowerCase())).toBe(1);
		const result = await new Client().action('/signin', 'password', { email: email.toUpperCase(), password: 'long enough password' });
		expect(result.type).toBe('redirect');
	});

	it('refuses malformed input, naming each field and its range, and stores nothing', async () => {
		const email = freshEmail('short');
		const result = await new Client().action('/signup', '', { name: '', email: 'not-an-address', password: 'short' });
		expect(result.status).toBe(400);
		expect(result.data!.errors).toEqual({
			name: 'name: 1 to 80 characters',
			email: 'email: an address like name@example.com',
			password: 'password: 10 to 200 characters'
		});
		const again = await new Client().action('/signup', '', { name: 'X', email, password: 'short' });
		expect(again.status).toBe(400);
		expect(await usersWith(email)).toBe(0);
	});

	it('does not say on the page that an address is taken; the owner of the address hears by e-mail', async () => {
		const email = freshEmail('taken');
		await signUp('First', email);
		const result = await new Client().action('/signup', '', { name: 'Second', email, password: 'another long secret' });
		expect(result).toMatchObject({ type: 'success', data: { checkEmail: true } });
		expect((await mailTo(email, 'already have')).subject).toBe('You already have a Phasewright account');
		expect(await usersWith(email)).toBe(1);
	});
});

describe('sign-in with e-mail and password', () => {
	it('signs in and out', async () => {
		const email = freshEmail('inout');
		await signUp('In Out', email, 'correct horse battery');
		const client = new Client();
		expect((await client.json('/api/v1/builds')).status).toBe(401);
		const result = await client.action('/signin', 'password', { email, password: 'correct horse battery', redirectTo: '/workshop' });
		expect(result).toMatchObject({ type: 'redirect', location: '/workshop' });
		expect((await client.json('/api/v1/builds')).status).toBe(200);
		// The session cookie is out of reach of page scripts, and not sent on cross-site posts.
		expect([...client.cookies.keys()].some((k) => k.includes('authjs.session-token'))).toBe(true);

		await client.action('/signout', '', {});
		expect((await client.json('/api/v1/builds')).status).toBe(401);
	});

	it('gives the same answer for a wrong password and an unknown address', async () => {
		const email = freshEmail('known');
		await signUp('Known', email, 'the right password');
		const wrong = await new Client().action('/signin', 'password', { email, password: 'the wrong password' });
		const unknown = await new Client().action('/signin', 'password', { email: freshEmail('nobody'), password: 'the wrong password' });
		expect(wrong.status).toBe(400);
		expect(unknown.status).toBe(400);
		expect(wrong.data!.message).toBe(unknown.data!.message);
		expect(String(wrong.data!.message)).not.toMatch(/exist|unknown|no account/i);
	});

	it('refuses a malformed address by naming the field', async () => {
		const result = await new Client().action('/signin', 'password', { email: 'bench@', password: 'x' });
		expect(result.status).toBe(400);
		expect(result.data!.errors).toEqual({ email: 'email: an address like name@example.com' });
	});

	it('refuses further attempts once an address has failed too often, even with the right password', async () => {
		const email = freshEmail('guessed');
		await signUp('Guessed', email, 'the right password');
		// Ten failures already in this window (recorded directly: the real delays would take ~16 s).
		await database.insert(signInFailure).values({ key: throttleKeys(email, '').email, failures: throttlePolicy.lockAfter.email });
		const result = await new Client().action('/signin', 'password', { email, password: 'the right password' });
		expect(result.status).toBe(429);
		expect(String(result.data!.message)).toMatch(/Too many failed sign-ins/);
	});

	it('slows down after the free failures', async () => {
		const email = freshEmail('slow');
		await database.insert(signInFailure).values({ key: throttleKeys(email, '').email, failures: throttlePolicy.freeFailures });
		const started = performance.now();
		const result = await new Client().action('/signin', 'password', { email, password: 'whatever it is' });
		expect(result.status).toBe(400);
		// The 4th failure waits at least the base delay (throttle.ts).
		expect(performance.now() - started).toBeGreaterThanOrEqual(throttlePolicy.baseDelayMs);
	});
});

describe('sign-in link by e-mail', () => {
	it('sends a single-use link that signs in (and creates the account with its workshop on first use)', async () => {
		const email = freshEmail('linker');
		const client = new Client();
		const sent = await client.action('/signin', 'link', { email, redirectTo: '/builds' });
		expect(sent).toMatchObject({ type: 'redirect', location: '/signin/check-email' });

		const mail = await mailTo(email, 'sign-in link');
		expect(mail.link).toContain('/auth/callback/nodemailer');
		const landing = await client.follow(mail.link);
		expect(landing.status).toBe(200);
		const { status, body } = await client.json<BuildsAnswer>('/api/v1/builds');
		expect(status).toBe(200);
		expect(body.role).toBe('owner');

		// Used once: a second browser gets nothing from it.
		const other = new Client();
		await other.follow(mail.link);
		expect((await other.json('/api/v1/builds')).status).toBe(401);
	});
});

describe('password reset by e-mail', () => {
	it('sets a new password through a single-use link; the old one stops working', async () => {
		const email = freshEmail('forgetful');
		await signUp('Forgetful', email, 'the old password');
		const request = await new Client().action('/reset', '', { email });
		expect(request).toMatchObject({ type: 'success', data: { sent: true } });
		const mail = await mailTo(email, 'Reset');
		const path = new URL(mail.link).pathname;

		const weak = await new Client().action(path, '', { password: 'short', confirm: 'short' });
		expect(weak.data!.errors).toEqual({ password: 'password: 10 to 200 characters' });
		const done = await new Client().action(path, '', { password: 'the new password', confirm: 'the new password' });
		expect(done).toMatchObject({ type: 'redirect', location: '/signin?reset=1' });

		expect((await new Client().action('/signin', 'password', { email, password: 'the old password' })).status).toBe(400);
		expect((await new Client().action('/signin', 'password', { email, password: 'the new password' })).type).toBe('redirect');
		const reused = await new Client().action(path, '', { password: 'a third password', confirm: 'a third password' });
		expect(reused.status).toBe(400);
	});

	it('answers the same for an address without an account, and sends nothing', async () => {
		const email = freshEmail('stranger');
		const result = await new Client().action('/reset', '', { email });
		expect(result).toMatchObject({ type: 'success', data: { sent: true } });
		// Mail is handed to SMTP before the action answers, so a short look is enough.
		await expect(mailTo(email, '', 5)).rejects.toThrow(/no message/);
	});
});
