// Web security as seen over HTTP: sign-in throttling under bursts, session cookie attributes,
// response headers and the Content-Security-Policy (also in Chromium), cross-site writes, and how
// uploaded photos are served. Sources: OWASP's Authentication, Session Management, HTTP Security
// Response Headers and CSRF Prevention cheat sheets (common practice); RFC 6265bis (cookie
// attributes), RFC 6797 (HSTS), W3C CSP Level 3, the Fetch standard (CORS preflight).
import { spawn, type ChildProcess } from 'node:child_process';
import { once } from 'node:events';
import { join } from 'node:path';
import sharp from 'sharp';
import { sql } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { connect } from '../../src/lib/server/db';
import { listKeys } from '../../src/lib/server/storage';
import { throttlePolicy } from '../../src/lib/server/throttle';
import { contextFor, launch } from '../e2e/browser';
import { appUrl, Client, freshEmail, signUp } from '../support/client';
import { freePort } from '$support/free-port';

const database = connect(process.env.DATABASE_URL!);
afterAll(() => database.$client.end());

const evil = 'http://evil.example';
const password = 'long enough password';

// ---- A second instance of the built server, as it runs behind a TLS-terminating proxy ----
// ORIGIN says https (what the proxy serves), the client address comes from X-Forwarded-For (so
// each test can sign in from an address of its own: RFC 5737 documentation ranges), and it shares
// the test database. This is how adapter-node is deployed behind a proxy (its README).

interface Instance {
	url: string;
	origin: string;
	child: ChildProcess;
}

async function startBehindProxy(): Promise<Instance> {
	const port = await freePort();
	const url = `http://127.0.0.1:${port}`;
	const child = spawn(process.execPath, [join(import.meta.dirname, '..', '..', 'build', 'index.js')], {
		env: {
			...process.env,
			NODE_ENV: 'production',
			HOST: '127.0.0.1',
			PORT: String(port),
			ORIGIN: `https://127.0.0.1:${port}`,
			ADDRESS_HEADER: 'x-forwarded-for',
			XFF_DEPTH: '1'
		},
		stdio: ['ignore', 'ignore', 'inherit']
	});
	for (let i = 0; i < 150; i++) {
		if (child.exitCode !== null) throw new Error(`the second server exited with code ${child.exitCode}`);
		try {
			await fetch(`${url}/api/health`);
			return { url, origin: `https://127.0.0.1:${port}`, child };
		} catch {
			await new Promise((r) => setTimeout(r, 100));
		}
	}
	throw new Error('the second server did not answer within 15 s');
}

let proxied: Instance;
beforeAll(async () => {
	proxied = await startBehindProxy();
}, 30_000);
afterAll(async () => {
	if (proxied?.child.exitCode === null) {
		proxied.child.kill('SIGTERM');
		await once(proxied.child, 'exit');
	}
});

/** A password sign-in posted the way the sign-in form's `enhance` posts it. */
function signInVia(instance: { url: string; origin: string }, email: string, pass: string, clientAddress?: string) {
	return fetch(`${instance.url}/signin?/password`, {
		method: 'POST',
		headers: {
			origin: instance.origin,
			accept: 'application/json',
			'x-sveltekit-action': 'true',
			'content-type': 'application/x-www-form-urlencoded',
			...(clientAddress ? { 'x-forwarded-for': clientAddress } : {})
		},
		body: new URLSearchParams({ email, password: pass })
	});
}

/** The status the action reports: `fail(429)` answers 200 with the status inside, as `enhance` expects. */
async function actionStatus(res: Response): Promise<number> {
	const body = (await res.json()) as { type: string; status?: number };
	return body.type === 'redirect' ? 303 : (body.status ?? res.status);
}

let addressCounter = 1;
/** A client address of its own per use (RFC 5737 TEST-NET-3), so tests never share a throttle key. */
const clientAddress = () => `203.0.113.${addressCounter++}`;

function tally(statuses: number[]) {
	const counts: Record<number, number> = {};
	for (const s of statuses) counts[s] = (counts[s] ?? 0) + 1;
	return counts;
}

describe('sign-in throttling over HTTP', () => {
	it('checks at most ten passwords of one address in a burst of parallel guesses, then refuses even the right one', async () => {
		const email = freshEmail('burst');
		await signUp('Burst', email, password);
		const from = clientAddress();
		const guesses = await Promise.all(
			Array.from({ length: 25 }, (_, i) => signInVia(proxied, email, `wrong guess ${i}`, from).then(actionStatus))
		);
		const counts = tally(guesses);
		// Ten failures lock the address (throttle.ts; OWASP: lock or slow after a small number).
		// Exactly the limit is checked, however the 25 interleave; every other guess is refused unchecked.
		expect(counts, JSON.stringify(counts)).toEqual({ 400: throttlePolicy.lockAfter.email, 429: 25 - throttlePolicy.lockAfter.email });
		expect(await signInVia(proxied, email, password, clientAddress()).then(actionStatus)).toBe(429);
		// The lock is the address's: another account from the same client still signs in.
		const other = freshEmail('burst-neighbour');
		await signUp('Neighbour', other, password);
		expect(await signInVia(proxied, other, password, from).then(actionStatus)).toBe(303);
	}, 60_000);

	it('checks at most fifty passwords from one client address, spread over many addresses, then refuses that client', async () => {
		const from = clientAddress();
		const guesses = await Promise.all(
			Array.from({ length: 60 }, (_, i) => signInVia(proxied, freshEmail(`spray${i}`), 'a guessed password', from).then(actionStatus))
		);
		const counts = tally(guesses);
		expect(counts, JSON.stringify(counts)).toEqual({ 400: throttlePolicy.lockAfter.client, 429: 60 - throttlePolicy.lockAfter.client });
		const email = freshEmail('sprayed');
		await signUp('Sprayed', email, password);
		expect(await signInVia(proxied, email, password, from).then(actionStatus)).toBe(429);
		// From anywhere else the same account signs in.
		expect(await signInVia(proxied, email, password, clientAddress()).then(actionStatus)).toBe(303);
	}, 60_000);

	it('says it is throttled in the answer, not with a generic failure', async () => {
		const email = freshEmail('told');
		const from = clientAddress();
		await Promise.all(
			Array.from({ length: throttlePolicy.lockAfter.email }, () => signInVia(proxied, email, 'nope', from).then(actionStatus))
		);
		const res = await signInVia(proxied, email, 'nope', from);
		const body = (await res.json()) as { status: number; data: string };
		expect(body.status).toBe(429);
		expect(body.data).toMatch(/Too many failed sign-ins/);
	}, 60_000);
});

// ---- Cookies ----

function cookieNamed(lines: string[], name: RegExp) {
	const line = lines.find((l) => name.test(l.split('=')[0]!));
	if (!line) throw new Error(`no Set-Cookie for ${name} among: ${lines.map((l) => l.split('=')[0]).join(', ')}`);
	const [pair, ...attrs] = line.split(';').map((s) => s.trim());
	const attributes = new Map(
		attrs.map((a) => {
			const [k, v] = a.split('=');
			return [k!.toLowerCase(), v ?? true] as const;
		})
	);
	return { name: pair!.split('=')[0]!, attributes };
}

describe('session cookies', () => {
	it('over http: HttpOnly, SameSite=Lax, whole site; not Secure (the browser would drop it)', async () => {
		const email = freshEmail('cookie');
		await signUp('Cookie', email, password);
		const res = await signInVia({ url: appUrl, origin: new URL(appUrl).origin }, email, password);
		expect(await actionStatus(res.clone())).toBe(303);
		const session = cookieNamed(res.headers.getSetCookie(), /authjs\.session-token$/);
		expect(session.attributes.get('httponly')).toBe(true);
		expect(String(session.attributes.get('samesite')).toLowerCase()).toMatch(/^(lax|strict)$/);
		expect(session.attributes.get('path')).toBe('/');
		expect(session.attributes.has('secure')).toBe(false);
	});

	it('over https: also Secure, under the __Secure- prefix (RFC 6265bis), and the workshop choice cookie too', async () => {
		const email = freshEmail('cookie-tls');
		await signUp('Cookie TLS', email, password);
		const res = await signInVia(proxied, email, password, clientAddress());
		expect(await actionStatus(res.clone())).toBe(303);
		const session = cookieNamed(res.headers.getSetCookie(), /authjs\.session-token$/);
		expect(session.name).toBe('__Secure-authjs.session-token');
		expect(session.attributes.get('secure')).toBe(true);
		expect(session.attributes.get('httponly')).toBe(true);
		expect(String(session.attributes.get('samesite')).toLowerCase()).toMatch(/^(lax|strict)$/);

		// The workshop switcher's cookie, set by a signed-in form post.
		const cookie = res.headers
			.getSetCookie()
			.map((l) => l.split(';')[0])
			.join('; ');
		const builds = await fetch(`${proxied.url}/api/v1/builds`, { headers: { cookie } });
		expect(builds.status).toBe(200);
		const workshopId = ((await builds.json()) as { workshop: { id: string } }).workshop.id;
		const switched = await fetch(`${proxied.url}/workshop?/switch`, {
			method: 'POST',
			headers: {
				cookie,
				origin: proxied.origin,
				accept: 'application/json',
				'x-sveltekit-action': 'true',
				'content-type': 'application/x-www-form-urlencoded'
			},
			body: new URLSearchParams({ workshopId })
		});
		expect(await actionStatus(switched.clone())).toBe(303);
		const choice = cookieNamed(switched.headers.getSetCookie(), /^pw-workshop$/);
		expect([
			choice.attributes.get('secure'),
			choice.attributes.get('httponly'),
			String(choice.attributes.get('samesite')).toLowerCase()
		]).toEqual([true, true, 'lax']);
	});
});

// ---- Response headers ----

/** What every answer carries, page or not. */
function expectCommonHeaders(res: Response, what: string) {
	const h = res.headers;
	expect(h.get('x-content-type-options'), what).toBe('nosniff');
	expect(h.get('referrer-policy'), what).toMatch(/^(no-referrer|same-origin|strict-origin|strict-origin-when-cross-origin)$/);
	const framing = h.get('x-frame-options') === 'DENY' || /frame-ancestors 'none'/.test(h.get('content-security-policy') ?? '');
	expect(framing, `${what}: X-Frame-Options DENY or frame-ancestors 'none'`).toBe(true);
	expect(h.get('permissions-policy'), what).toMatch(/(^|,\s*)camera=\(self\)/);
	expect(h.get('permissions-policy'), what).toMatch(/(^|,\s*)microphone=\(\)/);
	expect(h.get('permissions-policy'), what).toMatch(/(^|,\s*)geolocation=\(\)/);
}

function directives(policy: string) {
	return new Map(
		policy
			.split(';')
			.map((d) => d.trim())
			.filter(Boolean)
			.map((d) => {
				const [name, ...values] = d.split(/\s+/);
				return [name!, values] as const;
			})
	);
}

/** A page's policy: scripts only from the site or with this response's nonce, never inline at large. */
async function expectPagePolicy(res: Response, what: string) {
	const policy = res.headers.get('content-security-policy');
	expect(policy, what).toBeTruthy();
	const d = directives(policy!);
	const scripts = d.get('script-src') ?? d.get('default-src') ?? [];
	expect(scripts, what).not.toContain("'unsafe-inline'");
	expect(scripts, what).not.toContain("'unsafe-eval'");
	expect(
		scripts.every((s) => s === "'self'" || /^'nonce-[A-Za-z0-9+/=]+'$/.test(s) || /^'sha256-/.test(s)),
		`${what}: ${scripts.join(' ')}`
	).toBe(true);
	expect(d.get('object-src'), what).toEqual(["'none'"]);
	expect(d.get('base-uri'), what).toEqual(["'self'"]);
	expect(d.get('frame-ancestors'), what).toEqual(["'none'"]);
	const nonce = scripts.find((s) => s.startsWith("'nonce-"))?.slice(7, -1);
	const html = await res.text();
	const tags = [...html.matchAll(/<script\b[^>]*>/g)].map((m) => m[0]);
	expect(tags.length, `${what}: the page hydrates with SvelteKit's inline script`).toBeGreaterThan(0);
	// Every script element is allowed by the policy: from a file of the site, or carrying the nonce.
	for (const tag of tags) {
		const external = /\ssrc="\/[^/]/.test(tag);
		const nonced = nonce !== undefined && tag.includes(`nonce="${nonce}"`);
		expect(external || nonced, `${what}: ${tag}`).toBe(true);
	}
	return { nonce, html };
}

describe('security headers', () => {
	let signedIn: Client;
	let buildId: string;
	beforeAll(async () => {
		signedIn = await signUp('Headers', freshEmail('headers'));
		buildId = (await signedIn.send<{ id: string }>('POST', '/api/v1/builds', { name: 'Header bench' })).body.id;
	});

	it('pages: a nonce-based CSP without unsafe-inline scripts, a new nonce each time, and the common headers', async () => {
		const seen = new Set<string>();
		for (const [client, path] of [
			[new Client(), '/'],
			[new Client(), '/wheel'],
			[new Client(), '/tape'],
			[new Client(), '/signin'],
			[signedIn, '/builds'],
			[signedIn, `/builds/${buildId}`],
			[new Client(), '/no-such-page']
		] as const) {
			const res = await client.get(path);
			expect([200, 404], path).toContain(res.status);
			expectCommonHeaders(res, path);
			const { nonce } = await expectPagePolicy(res, path);
			expect(nonce, path).toBeTruthy();
			seen.add(nonce!);
		}
		// A nonce is single use (CSP Level 3, 7.1): no two answers share one.
		expect(seen.size).toBe(7);
	});

	it('keeps the theme from the cookie in the first paint, with no inline script needed for it', async () => {
		const res = await fetch(`${appUrl}/`, { headers: { cookie: 'pw-theme=dark' } });
		const { html } = await expectPagePolicy(res, '/ (dark)');
		expect(html).toMatch(/<html[^>]*\sdata-theme="dark"/);
		const light = await (await fetch(`${appUrl}/`, { headers: { cookie: 'pw-theme=light' } })).text();
		expect(light).toMatch(/<html[^>]*\sdata-theme="light"/);
		// An unknown value is not echoed into the page.
		const odd = await (await fetch(`${appUrl}/`, { headers: { cookie: 'pw-theme="><script>alert(1)</script>' } })).text();
		expect(odd).toMatch(/<html[^>]*\sdata-theme="system"/);
		expect(odd).not.toContain('alert(1)');
	});

	it('API answers and files: the common headers and a policy that loads nothing', async () => {
		const anonymous = new Client();
		const answers: [string, Response][] = [
			['GET /api/v1/wheel', await anonymous.get('/api/v1/wheel?teeth=36&missing=1&od=100&depth=5')],
			['GET /api/v1/wheel.svg', await anonymous.get('/api/v1/wheel.svg?teeth=36&missing=1&od=100&depth=5')],
			['GET /api/v1/wheel.dxf', await anonymous.get('/api/v1/wheel.dxf?teeth=36&missing=1&od=100&depth=5')],
			['GET /api/v1/builds (401)', await anonymous.get('/api/v1/builds')],
			['GET /api/v1/builds (signed in)', await signedIn.get('/api/v1/builds')],
			['GET /api/v1/wheel (400)', await anonymous.get('/api/v1/wheel?teeth=0')],
			['GET /api/health', await anonymous.get('/api/health')]
		];
		for (const [what, res] of answers) {
			expectCommonHeaders(res, what);
			const d = directives(res.headers.get('content-security-policy') ?? '');
			expect(d.get('default-src'), what).toEqual(["'none'"]);
			expect(d.get('frame-ancestors'), what).toEqual(["'none'"]);
			await res.arrayBuffer();
		}
		expect(answers[1]![1].headers.get('content-type')).toMatch(/^image\/svg\+xml/);
	});

	it('Strict-Transport-Security only over https (RFC 6797 7.2: not over plain http), for a year at least', async () => {
		for (const path of ['/', '/api/v1/wheel?teeth=36&od=100&depth=5']) {
			const plain = await fetch(`${appUrl}${path}`);
			expect(plain.headers.get('strict-transport-security'), path).toBeNull();
			const tls = await fetch(`${proxied.url}${path}`);
			const hsts = tls.headers.get('strict-transport-security');
			expect(hsts, path).toMatch(/^max-age=\d+/);
			// At least one year: what the HSTS preload list asks for (common practice).
			expect(Number(/max-age=(\d+)/.exec(hsts!)![1])).toBeGreaterThanOrEqual(31_536_000);
		}
	});

	it('pages run under the policy in Chromium: no violation reported, the page hydrates, the theme switch works', async () => {
		const browser = await launch();
		try {
			const context = await contextFor(browser, signedIn.cookies);
			await context.addInitScript(() => {
				(window as unknown as { violations: string[] }).violations = [];
				document.addEventListener('securitypolicyviolation', (e) =>
					(window as unknown as { violations: string[] }).violations.push(`${e.violatedDirective} ${e.blockedURI}`)
				);
			});
			const page = await context.newPage();
			const errors: string[] = [];
			page.on('console', (m) => {
				if (m.type() === 'error') errors.push(m.text());
			});
			const designId = (
				await signedIn.send<{ id: string }>('POST', `/api/v1/builds/${buildId}/designs`, {
					name: 'Header wheel',
					params: { teeth: '36', missing: '1', od: '100', depth: '5' }
				})
			).body.id;
			const form = new FormData();
			form.append(
				'file',
				new Blob(
					[
						new Uint8Array(
							await sharp({ create: { width: 40, height: 30, channels: 3, background: 'grey' } })
								.png()
								.toBuffer()
						)
					],
					{ type: 'image/png' }
				),
				'header.png'
			);
			const photoId = (await signedIn.send<{ photos: { id: string }[] }>('POST', `/api/v1/builds/${buildId}/photos`, form)).body.photos[0]!
				.id;
			const pages = [
				'/',
				'/wheel',
				'/tape',
				'/tdc',
				'/phasing',
				'/builds',
				`/builds/${buildId}`,
				`/builds/${buildId}/designs/${designId}`,
				`/builds/${buildId}/photos/${photoId}`,
				`/wheel?design=${designId}`,
				'/workshop'
			];
			for (const path of pages) {
				const res = await page.goto(`${appUrl}${path}`);
				expect(res?.status(), path).toBe(200);
				// The theme switch is a hydrated button: pressing it changes <html data-theme>.
				const before = await page.locator('html').getAttribute('data-theme');
				// Pressed until it answers: a press before hydration does nothing.
				await expect
					.poll(
						async () => {
							await page.getByTestId('theme-switch').click();
							return page.locator('html').getAttribute('data-theme');
						},
						{ message: path, timeout: 10_000 }
					)
					.not.toBe(before);
				expect(await page.evaluate(() => (window as unknown as { violations: string[] }).violations), path).toEqual([]);
			}
			expect(errors.filter((e) => /Content.Security.Policy|Refused to/i.test(e))).toEqual([]);
		} finally {
			await browser.close();
		}
	}, 90_000);
});

// ---- Cross-site writes ----

describe('writes from another origin', () => {
	let client: Client;
	let workshopId: string;
	let buildId: string;
	const cookieOf = (c: Client) => [...c.cookies].map(([k, v]) => `${k}=${v}`).join('; ');
	const builds = async () =>
		(await database.execute<{ n: number }>(sql`select count(*)::int as n from build where workshop_id = ${workshopId}`)).rows[0]!.n;
	const photos = async () => ({
		rows: (await database.execute<{ n: number }>(sql`select count(*)::int as n from wheel_photo where build_id = ${buildId}`)).rows[0]!.n,
		objects: (await listKeys(`photos/${workshopId}/${buildId}/`)).length
	});

	beforeAll(async () => {
		client = await signUp('Cross site', freshEmail('csrf'));
		workshopId = (await client.json<{ workshop: { id: string } }>('/api/v1/builds')).body.workshop.id;
		buildId = (await client.send<{ id: string }>('POST', '/api/v1/builds', { name: 'CSRF bench' })).body.id;
	});

	const post = (path: string, body: BodyInit, headers: Record<string, string>) =>
		fetch(`${appUrl}${path}`, { method: 'POST', redirect: 'manual', headers: { cookie: cookieOf(client), ...headers }, body });

	it('refuses a form action posted from another origin, or with no origin at all (SvelteKit csrf.checkOrigin)', async () => {
		const before = await builds();
		const form = { 'content-type': 'application/x-www-form-urlencoded' };
		expect((await post('/builds?/create', new URLSearchParams({ name: 'From evil' }), { ...form, origin: evil })).status).toBe(403);
		expect((await post('/builds?/create', new URLSearchParams({ name: 'From nowhere' }), form)).status).toBe(403);
		expect(
			(await post('/signin?/password', new URLSearchParams({ email: 'a@example.test', password: 'x' }), { ...form, origin: evil })).status
		).toBe(403);
		expect(await builds()).toBe(before);
		// The same post from the site itself goes through: the origin is what was refused.
		expect(
			await actionStatus(
				await post('/builds?/create', new URLSearchParams({ name: 'From the site' }), {
					...form,
					origin: new URL(appUrl).origin,
					accept: 'application/json',
					'x-sveltekit-action': 'true'
				})
			)
		).toBe(200);
		expect(await builds()).toBe(before + 1);
	});

	it('refuses a multipart photo upload from another origin, storing nothing', async () => {
		const before = await photos();
		const png = await sharp({ create: { width: 8, height: 8, channels: 3, background: 'white' } })
			.png()
			.toBuffer();
		const form = new FormData();
		form.append('file', new Blob([new Uint8Array(png)], { type: 'image/png' }), 'evil.png');
		const res = await post(`/api/v1/builds/${buildId}/photos`, form, { origin: evil });
		expect(res.status).toBe(403);
		expect(await photos()).toEqual(before);
	});

	it('refuses JSON API writes from another origin, with a simple content type (text/plain) or not', async () => {
		const before = await builds();
		const body = JSON.stringify({ name: 'Posted as text' });
		expect((await post('/api/v1/builds', body, { origin: evil, 'content-type': 'text/plain' })).status).toBe(403);
		expect((await post('/api/v1/builds', body, { origin: evil, 'content-type': 'application/json' })).status).toBe(403);
		const patch = await fetch(`${appUrl}/api/v1/builds/${buildId}`, {
			method: 'PATCH',
			headers: { cookie: cookieOf(client), origin: evil, 'content-type': 'application/json' },
			body: JSON.stringify({ notes: 'evil' })
		});
		expect(patch.status).toBe(403);
		const del = await fetch(`${appUrl}/api/v1/builds/${buildId}`, {
			method: 'DELETE',
			headers: { cookie: cookieOf(client), origin: evil }
		});
		expect(del.status).toBe(403);
		expect(await builds()).toBe(before);
		const { rows } = await database.execute<{ notes: string }>(sql`select notes from build where id = ${buildId}`);
		expect(rows[0]!.notes).toBe('');
		// The site's own pages send their origin and get through.
		expect(
			(
				await post('/api/v1/builds', JSON.stringify({ name: 'Posted by the site' }), {
					origin: new URL(appUrl).origin,
					'content-type': 'application/json'
				})
			).status
		).toBe(201);
	});

	it('grants no other origin CORS access: a preflight gets no Access-Control-Allow-Origin (Fetch standard, CORS protocol)', async () => {
		const res = await fetch(`${appUrl}/api/v1/builds`, {
			method: 'OPTIONS',
			headers: { origin: evil, 'access-control-request-method': 'POST', 'access-control-request-headers': 'content-type' }
		});
		expect(res.headers.get('access-control-allow-origin')).toBeNull();
		expect(res.headers.get('access-control-allow-credentials')).toBeNull();
		const get = await fetch(`${appUrl}/api/v1/builds`, { headers: { cookie: cookieOf(client), origin: evil } });
		expect(get.headers.get('access-control-allow-origin')).toBeNull();
	});
});

// ---- Uploaded photos as served ----

describe('uploaded photos as served', () => {
	it('come back with the type their bytes were stored as, nosniff, inline, and a policy that runs nothing', async () => {
		const client = await signUp('Served', freshEmail('served'));
		const buildId = (await client.send<{ id: string }>('POST', '/api/v1/builds', { name: 'Served bench' })).body.id;
		const png = await sharp({ create: { width: 12, height: 10, channels: 3, background: 'grey' } })
			.png()
			.toBuffer();
		const webp = await sharp({ create: { width: 12, height: 10, channels: 3, background: 'grey' } })
			.webp()
			.toBuffer();
		const form = new FormData();
		// Names and declared types that say otherwise: the bytes decide (photos/intake.ts).
		form.append('file', new Blob([new Uint8Array(png)], { type: 'text/html' }), 'wheel.html');
		form.append('file', new Blob([new Uint8Array(webp)], { type: 'image/svg+xml' }), 'wheel.svg');
		const up = await client.send<{ photos: { id: string; name: string }[] }>('POST', `/api/v1/builds/${buildId}/photos`, form);
		expect(up.status).toBe(201);
		const byName: Record<string, string> = { 'wheel.html': 'image/png', 'wheel.svg': 'image/webp' };
		expect(up.body.photos.map((p) => p.name).sort()).toEqual(Object.keys(byName));
		for (const photo of up.body.photos) {
			const type = byName[photo.name]!;
			const res = await client.get(`/api/v1/photos/${photo.id}`);
			expect(res.status).toBe(200);
			expect(res.headers.get('content-type')).toBe(type);
			expect(res.headers.get('x-content-type-options')).toBe('nosniff');
			expect(res.headers.get('content-disposition')).toMatch(/^inline; filename\*=UTF-8''/);
			expect(directives(res.headers.get('content-security-policy') ?? '').get('default-src')).toEqual(["'none'"]);
			// The bytes really are that type (sharp reads them back).
			expect((await sharp(Buffer.from(await res.arrayBuffer())).metadata()).format).toBe(type.slice(6));
			const thumb = await client.get(`/api/v1/photos/${photo.id}/thumbnail`);
			expect([thumb.headers.get('content-type'), thumb.headers.get('x-content-type-options')]).toEqual(['image/webp', 'nosniff']);
			await thumb.arrayBuffer();
		}
	});
});
