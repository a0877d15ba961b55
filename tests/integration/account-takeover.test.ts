// Issue 14, items 1-5: the account-takeover paths a hostile review found, each tried again over
// real HTTP against the built server (NODE_ENV=production, as `npm start` serves it).
// Expected answers: RFC 9110 (421 Misdirected Request for a name the server does not serve, 303
// See Other after a form post), the WHATWG URL Standard for how a browser reads a Location, and
// OWASP's Session Management and Forgot Password cheat sheets for what sign-out and a reset end
// (common practice).
import { request } from 'node:http';
import { eq } from 'drizzle-orm';
import { afterAll, describe, expect, it } from 'vitest';
import { connect } from '../../src/lib/server/db';
import { user } from '../../src/lib/server/db/schema';
import { appUrl, Client, freshEmail, mailTo, signUp } from '../support/client';

const database = connect(process.env.DATABASE_URL!);
afterAll(() => database.$client.end());

const app = new URL(appUrl);
const mailbox = process.env.MAILBOX_URL!;

/** One request with headers fetch will not let us set (Host), as an attacker's client sends it. */
function raw(
	method: string,
	path: string,
	headers: Record<string, string>,
	body?: string
): Promise<{ status: number; location?: string; text: string }> {
	return new Promise((resolve, reject) => {
		const req = request(
			{
				host: app.hostname,
				port: app.port,
				method,
				path,
				headers: { ...headers, ...(body ? { 'content-length': String(Buffer.byteLength(body)) } : {}) }
			},
			(res) => {
				const chunks: Buffer[] = [];
				res.on('data', (c: Buffer) => chunks.push(c));
				res.on('end', () =>
					resolve({ status: res.statusCode!, location: res.headers.location, text: Buffer.concat(chunks).toString('utf8') })
				);
			}
		);
		req.on('error', reject);
		req.end(body);
	});
}

const formPost = (extra: Record<string, string>) => ({
	'content-type': 'application/x-www-form-urlencoded',
	accept: 'application/json',
	'x-sveltekit-action': 'true',
	origin: app.origin,
	...extra
});

async function messagesTo(
	address: string
): Promise<{ id: string; subject: string; text: string; attachments: { filename: string; contentType: string }[] }[]> {
	return (await fetch(`${mailbox}/messages?to=${encodeURIComponent(address)}`)).json();
}

/** Waits a moment for mail that must not come: sending happens before the action answers, so a short wait is enough. */
async function noMailTo(address: string) {
	await new Promise((r) => setTimeout(r, 300));
	expect(await messagesTo(address)).toEqual([]);
}

const linksIn = (text: string) => [...text.matchAll(/https?:\/\/\S+/g)].map((m) => m[0]);

async function userRow(email: string) {
	const [row] = await database.select().from(user).where(eq(user.email, email));
	return row!;
}

const signedIn = async (c: Client) => (await c.json('/api/v1/builds')).status === 200;

function cloneOf(client: Client) {
	const copy = new Client();
	for (const [k, v] of client.cookies) copy.cookies.set(k, v);
	return copy;
}

describe('1. links in e-mails come from ORIGIN, never from the request', () => {
	it('refuses a sign-in link request made under another Host, and mails nothing', async () => {
		const victim = freshEmail('host-victim');
		const res = await raw('POST', '/signin?/link', formPost({ host: 'evil.example' }), new URLSearchParams({ email: victim }).toString());
		expect(res.status).toBe(421);
		await noMailTo(victim);
	});

	it('refuses a forwarded host or scheme nobody configured', async () => {
		const victim = freshEmail('fwd-victim');
		const body = new URLSearchParams({ email: victim }).toString();
		const byHost = await raw('POST', '/signin?/link', formPost({ host: app.host, 'x-forwarded-host': 'evil.example' }), body);
		const byProto = await raw('POST', '/signin?/link', formPost({ host: app.host, 'x-forwarded-proto': 'https' }), body);
		expect([byHost.status, byProto.status]).toEqual([421, 421]);
		await noMailTo(victim);
	});

	it('builds every link of the sign-in, confirmation, reset and invitation mails on ORIGIN', async () => {
		const email = freshEmail('links');
		const owner = await signUp('Links Owner', email);
		expect((await new Client().action('/signin', 'link', { email })).type).toBe('redirect');
		expect((await new Client().action('/reset', '', { email })).type).toBe('success');
		const invitee = freshEmail('links-invitee');
		expect((await owner.action('/workshop', 'invite', { email: invitee, role: 'viewer' })).type).toBe('success');
		await mailTo(invitee, 'Invitation');
		const texts = [...(await messagesTo(email)), ...(await messagesTo(invitee))].map((m) => m.text);
		expect(texts.length).toBeGreaterThanOrEqual(4);
		for (const link of texts.flatMap(linksIn)) {
			expect(new URL(link).origin).toBe(app.origin);
			// Auth.js puts where to go next into its link: that is on ORIGIN too.
			const next = new URL(link).searchParams.get('callbackUrl');
			if (next) expect(new URL(next).origin).toBe(app.origin);
		}
	});

	it('refuses pages under another name (DNS rebinding), and still answers a health probe from this machine', async () => {
		expect((await raw('GET', '/builds', { host: 'rebound.example' })).status).toBe(421);
		expect((await raw('GET', '/api/health', { host: `localhost:${app.port}` })).status).toBe(200);
		expect((await raw('GET', '/', { host: app.host })).status).toBe(200);
	});
});

describe('2. an address is the account holder’s only once a link mailed to it is opened', () => {
	it('keeps someone who signed up with another’s address out of workshops, and out of the account once the owner uses a link', async () => {
		const victim = freshEmail('prereg-victim');
		// The attacker signs up with the victim's address and a password of their own, and never sees the victim's mail.
		const attacker = await signUp('Not The Owner', victim, 'attacker password 1', { confirm: false });
		expect((await userRow(victim)).emailVerified).toBeNull();

		// A workshop invites the address; even holding the link, the unconfirmed account cannot join.
		const ownerEmail = freshEmail('prereg-owner');
		const owner = await signUp('Shop Owner', ownerEmail);
		const shopId = (await owner.json<{ workshop: { id: string } }>('/api/v1/builds')).body.workshop.id;
		await owner.action('/workshop', 'invite', { email: victim, role: 'editor' });
		const invitation = new URL((await mailTo(victim, 'Invitation')).link).pathname;
		const refused = await attacker.action(invitation, '', {});
		expect(refused.status).toBe(403);
		expect(String(refused.data!.message)).toMatch(/Confirm your address/);
		expect((await attacker.json(`/api/v1/builds?workshop=${shopId}`)).status).toBe(404);

		// The victim signs in by e-mail link in their own browser: the link proves the address.
		const real = new Client();
		await real.action('/signin', 'link', { email: victim, redirectTo: invitation });
		const mail = await mailTo(victim, 'Confirm your');
		expect((await real.follow(mail.link)).status).toBe(200);

		// The password nobody verified is gone, and the attacker's session with it.
		const row = await userRow(victim);
		expect(row.emailVerified).not.toBeNull();
		expect(row.passwordHash).toBeNull();
		expect(await signedIn(attacker)).toBe(false);
		expect((await new Client().action('/signin', 'password', { email: victim, password: 'attacker password 1' })).status).toBe(400);

		// The victim joins.
		expect(await real.action(invitation, '', {})).toMatchObject({ type: 'redirect', location: '/builds' });
		expect((await real.json(`/api/v1/builds?workshop=${shopId}`)).status).toBe(200);
	});

	it('keeps the password when the sign-up browser opens its own confirmation link', async () => {
		const email = freshEmail('own-confirm');
		const client = await signUp('Own Confirm', email, 'my own password 1');
		const row = await userRow(email);
		expect(row.emailVerified).not.toBeNull();
		expect(row.passwordConfirmedAt).not.toBeNull();
		expect(await signedIn(client)).toBe(true);
		expect((await new Client().action('/signin', 'password', { email, password: 'my own password 1' })).type).toBe('redirect');
	});

	it('sends a new confirmation link from the account page, and none to a confirmed account', async () => {
		const email = freshEmail('resend');
		const client = await signUp('Resend', email, 'long enough password', { confirm: false });
		expect(await client.action('/account', 'confirm', { redirectTo: '/account' })).toMatchObject({
			type: 'success',
			data: { sent: email }
		});
		expect((await messagesTo(email)).filter((m) => m.subject.startsWith('Confirm your')).length).toBe(2);
		await client.follow((await mailTo(email, 'Confirm your')).link);
		expect((await client.action('/account', 'confirm', {})).status).toBe(409);
	});
});

describe('3. sessions end on the server', () => {
	it('a copy of the cookie is worth nothing after sign-out', async () => {
		const email = freshEmail('replay');
		const client = await signUp('Replay', email);
		const stolen = cloneOf(client);
		expect(await signedIn(stolen)).toBe(true);
		await client.action('/signout', '', {});
		expect(await signedIn(stolen)).toBe(false);
	});

	it('signing out one browser leaves the account’s other browsers signed in', async () => {
		const email = freshEmail('two-browsers');
		const laptop = await signUp('Two Browsers', email);
		const phone = new Client();
		await phone.action('/signin', 'password', { email, password: 'long enough password' });
		await phone.action('/signout', '', {});
		expect(await signedIn(laptop)).toBe(true);
	});

	it('a password reset ends every session', async () => {
		const email = freshEmail('reset-ends');
		const laptop = await signUp('Reset Ends', email);
		const phone = new Client();
		await phone.action('/signin', 'password', { email, password: 'long enough password' });
		await new Client().action('/reset', '', { email });
		const path = new URL((await mailTo(email, 'Reset')).link).pathname;
		expect((await new Client().action(path, '', { password: 'a brand new password', confirm: 'a brand new password' })).type).toBe(
			'redirect'
		);
		expect([await signedIn(laptop), await signedIn(phone)]).toEqual([false, false]);
	});

	it('a password change ends every other session and keeps this one', async () => {
		const email = freshEmail('change');
		const laptop = await signUp('Change', email, 'the old password 1');
		const phone = new Client();
		await phone.action('/signin', 'password', { email, password: 'the old password 1' });
		const wrong = await laptop.action('/account', 'password', {
			current: 'not it at all',
			password: 'the new password 1',
			confirm: 'the new password 1'
		});
		expect(wrong.status).toBe(400);
		expect(wrong.data!.errors).toEqual({ current: 'current: not the current password' });
		expect(await signedIn(phone)).toBe(true);

		const done = await laptop.action('/account', 'password', {
			current: 'the old password 1',
			password: 'the new password 1',
			confirm: 'the new password 1'
		});
		expect(done).toMatchObject({ type: 'success', data: { changed: true } });
		expect([await signedIn(laptop), await signedIn(phone)]).toEqual([true, false]);
		expect((await new Client().action('/signin', 'password', { email, password: 'the old password 1' })).status).toBe(400);
		expect((await new Client().action('/signin', 'password', { email, password: 'the new password 1' })).type).toBe('redirect');
	});

	it('"sign out everywhere" ends every session, this one too', async () => {
		const email = freshEmail('everywhere');
		const laptop = await signUp('Everywhere', email);
		const phone = new Client();
		await phone.action('/signin', 'password', { email, password: 'long enough password' });
		const stolen = cloneOf(phone);
		const result = await laptop.action('/account', 'everywhere', {});
		expect(result.type).toBe('redirect');
		expect([await signedIn(laptop), await signedIn(phone), await signedIn(stolen)]).toEqual([false, false, false]);
	});
});

describe('4. the local mailbox', () => {
	it('is not served under another host name, even from this machine', async () => {
		const res = await raw('GET', '/dev/mail/__data.json', { host: 'evil.example' });
		expect(res.status).not.toBe(200);
		expect(res.text).not.toMatch(/sign-in link|Reset/);
	});

	it('opens an attachment, byte for byte as it reached the SMTP server', async () => {
		const email = freshEmail('attach-owner');
		const owner = await signUp('Attach Owner', email);
		const buildId = (await owner.send<{ id: string }>('POST', '/api/v1/builds', { name: 'Attachment bench', engine: 'single' })).body.id;
		const params = { units: 'mm', teeth: '36', missing: '1', od: '100', depth: '5', thickness: '3', bore: '20' };
		const designId = (await owner.send<{ id: string }>('POST', `/api/v1/builds/${buildId}/designs`, { name: 'Attachment wheel', params }))
			.body.id;
		const fabricator = freshEmail('attach-fab');
		expect((await owner.send('POST', `/api/v1/builds/${buildId}/cutting-packages`, { designId, to: fabricator, quantity: 1 })).status).toBe(
			201
		);
		await mailTo(fabricator, 'Cutting order');
		const [message] = await messagesTo(fabricator);
		// The SMTP fake's own parse of the message (mailparser) is the oracle.
		const full = (await (await fetch(`${mailbox}/messages/${message!.id}`)).json()) as {
			attachments: { filename: string; contentBase64: string }[];
		};
		expect(full.attachments.length).toBeGreaterThanOrEqual(2);
		for (const [i, a] of full.attachments.entries()) {
			const res = await new Client().get(`/dev/mail/${message!.id}/${i}`);
			expect(res.status).toBe(200);
			expect(res.headers.get('content-disposition')).toContain(encodeURIComponent(a.filename));
			expect(Buffer.from(await res.arrayBuffer()).equals(Buffer.from(a.contentBase64, 'base64'))).toBe(true);
		}
		expect((await new Client().get(`/dev/mail/${message!.id}/${full.attachments.length}`)).status).toBe(404);
		expect((await new Client().get('/dev/mail/no-such-message/0')).status).toBe(404);
	});
});

describe('5. where a sign-in sends the browser', () => {
	const password = 'long enough password';
	let email: string;
	const signInTo = async (redirectTo: string) =>
		(await new Client().action('/signin', 'password', { email, password, redirectTo })).location;

	it('sends any address off this origin to /builds, however it is written', async () => {
		email = freshEmail('redirects');
		await signUp('Redirects', email, password);
		// The review's payload: a tab between the slashes, which a browser drops (WHATWG URL), leaving //evil.example.
		expect(await signInTo('/\t/evil.example/x')).toBe('/builds');
		expect(await signInTo('//evil.example/x')).toBe('/builds');
		expect(await signInTo('/\\evil.example/x')).toBe('/builds');
		expect(await signInTo('https://evil.example/')).toBe('/builds');
		expect(await signInTo('/builds/some-build?tab=tapes')).toBe('/builds/some-build?tab=tapes');
	});

	it('answers a line break in redirectTo with a redirect, not a 500', async () => {
		const client = await signUp('Line Break', freshEmail('linebreak'));
		for (const query of ['%0a', '%2F%0a%2Fevil.example', '%2Fbuilds%0d%0aSet-Cookie:%20x=1']) {
			const res = await client.get(`/signin?redirectTo=${query}`);
			expect(res.status).toBe(303);
			const location = res.headers.get('location')!;
			expect(new URL(location, app.origin).origin).toBe(app.origin);
			expect(location).toMatch(/^\/[^/\\]/);
			expect(location).not.toMatch(/[\u0000-\u001f]/);
		}
		expect((await client.get('/signin?redirectTo=%0a')).headers.get('location')).toBe('/builds');
	});

	it('applies the same check to the workshop switch', async () => {
		const client = await signUp('Switcher', freshEmail('switcher'));
		const shopId = (await client.json<{ workshop: { id: string } }>('/api/v1/builds')).body.workshop.id;
		expect((await client.action('/workshop', 'switch', { workshopId: shopId, redirectTo: '/\t/evil.example' })).location).toBe('/builds');
	});
});
