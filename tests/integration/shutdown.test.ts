// A stop during traffic (a rolling deploy): the built server on a port of its own gets SIGTERM in
// the middle of a stream of requests, slow uploads and a password reset whose e-mail goes out after
// the answer. What it had accepted must be answered (no 5xx, no reset connection), the e-mail must
// still go out, nothing may use the pool after it ended, and it must exit 0 by itself.
import { spawn, type ChildProcess } from 'node:child_process';
import { once } from 'node:events';
import { request } from 'node:http';
import { join } from 'node:path';
import { afterAll, expect, it } from 'vitest';
import { freshEmail, mailTo, signUp } from '$support/client';
import { freePort } from '$support/free-port';

interface Sent {
	what: string;
	/** When its connection was open (ms, performance.now()); undefined when it never opened. */
	connectedAt?: number;
	status?: number;
	error?: string;
	answeredAt?: number;
}

const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));

/**
 * One request on a connection of its own (no keep-alive pool, so "accepted before the signal" is
 * plain); the body, if any, written in `pieces` parts `gapMs` apart (a slow client's upload).
 */
function send(
	base: string,
	what: string,
	opts: { method?: string; path: string; headers?: Record<string, string>; body?: string; pieces?: number; gapMs?: number }
): { sent: Sent; done: Promise<Sent>; abort: () => Promise<Sent> } {
	const sent: Sent = { what };
	let cut = () => undefined as void;
	const done = new Promise<Sent>((resolve) => {
		const body = opts.body === undefined ? undefined : Buffer.from(opts.body);
		const req = request(new URL(opts.path, base), {
			method: opts.method ?? 'GET',
			agent: false,
			headers: { ...opts.headers, ...(body ? { 'content-length': String(body.length) } : {}) }
		});
		req.on('socket', (socket) => socket.on('connect', () => (sent.connectedAt = performance.now())));
		cut = () => void req.destroy();
		req.on('response', (res) => {
			sent.status = res.statusCode;
			res.on('data', () => undefined);
			res.on('end', () => resolve(Object.assign(sent, { answeredAt: performance.now() })));
			res.on('error', (err) => resolve(Object.assign(sent, { error: err.message })));
		});
		req.on('error', (err: NodeJS.ErrnoException) => resolve(Object.assign(sent, { error: err.code ?? err.message })));
		if (!body) return void req.end();
		const pieces = opts.pieces ?? 1;
		const size = Math.ceil(body.length / pieces);
		void (async () => {
			for (let i = 0; i < pieces; i++) {
				if (i) await sleep(opts.gapMs ?? 0);
				req.write(body.subarray(i * size, (i + 1) * size));
			}
			req.end();
		})();
	});
	/** The client gives up: its connection closed, whatever the server is doing. */
	const abort = () => {
		cut();
		return done;
	};
	return { sent, done, abort };
}

const children: ChildProcess[] = [];
afterAll(async () => {
	for (const child of children) {
		if (child.exitCode === null && child.signalCode === null) {
			child.kill('SIGKILL');
			await once(child, 'exit');
		}
	}
});

/** The built server on a free port of its own, its output kept. */
async function startApp() {
	const port = await freePort();
	const base = `http://127.0.0.1:${port}`;
	const env: NodeJS.ProcessEnv = { ...process.env, NODE_ENV: 'production', HOST: '127.0.0.1', PORT: String(port), ORIGIN: base };
	env.SHUTDOWN_TIMEOUT = '10';
	const server = spawn(process.execPath, [join(import.meta.dirname, '..', '..', 'build', 'index.js')], {
		env,
		stdio: ['ignore', 'pipe', 'pipe']
	});
	children.push(server);
	const out = { base, server, log: '' };
	server.stdout.on('data', (b: Buffer) => (out.log += b.toString()));
	server.stderr.on('data', (b: Buffer) => (out.log += b.toString()));
	const exited = (once(server, 'exit') as Promise<[number | null, NodeJS.Signals | null]>).then(([code, signal]) => ({ code, signal }));
	for (let i = 0; ; i++) {
		if (server.exitCode !== null) throw new Error(`the server exited with code ${server.exitCode}:\n${out.log}`);
		const up = await fetch(`${base}/api/health`).then(
			(r) => r.ok,
			() => false
		);
		if (up) break;
		if (i > 150) throw new Error(`the server did not answer within 15 s:\n${out.log}`);
		await sleep(100);
	}
	/** How it ended, or "still running" after 20 s. */
	const ending = () => Promise.race([exited, sleep(20_000).then(() => 'still running')]);
	return Object.assign(out, { ending });
}

/** A password reset posted as the page's form does: answered at once, its e-mail written and sent after (mail-queue.ts). */
const resetForm = (base: string, email: string) => ({
	method: 'POST',
	path: '/reset',
	headers: { origin: base, accept: 'application/json', 'x-sveltekit-action': 'true', 'content-type': 'application/x-www-form-urlencoded' },
	body: new URLSearchParams({ email }).toString()
});

/** A person signed in through the suite's server with one build: a second process reads the same sessions (database + AUTH_SECRET). */
async function signedInPerson(label: string) {
	const email = freshEmail(label);
	const person = await signUp('Stop Tester', email);
	const made = await person.send<{ id: string }>('POST', '/api/v1/builds', { name: `Stopped ${label}`, engine: 'Single 250 cc' });
	expect(made.status).toBe(201);
	return { email, buildId: made.body.id, cookie: [...person.cookies].map(([k, v]) => `${k}=${v}`).join('; ') };
}

it('finishes what it accepted when stopped mid-stream, sends the queued e-mail, closes the pool last and exits 0', async () => {
	const { email, buildId, cookie } = await signedInPerson('shutdown');
	const app = await startApp();
	const { base, server } = app;

	const signedIn = { cookie, origin: base };
	const all: Promise<Sent>[] = [];
	const sentList: Sent[] = [];
	const fire = (what: string, opts: Parameters<typeof send>[2]) => {
		const s = send(base, what, opts);
		sentList.push(s.sent);
		all.push(s.done);
		return s.done;
	};

	// Four clients in a loop over a page, the API and a file until well after the signal.
	let streaming = true;
	const routes: [string, Parameters<typeof send>[2]][] = [
		['builds API', { path: '/api/v1/builds', headers: { ...signedIn, accept: 'application/json' } }],
		['build page', { path: `/builds/${buildId}`, headers: { ...signedIn, accept: 'text/html' } }],
		[
			'wheel.svg',
			{ path: '/api/v1/wheel.svg?teeth=60&missing=2&od=120&depth=5&bore=25&keyway=din6885&shaft=25&tipRadius=0.4&rootRadius=0.6' }
		],
		['health', { path: '/api/health' }]
	];
	const loops = routes.map(async ([what, opts]) => {
		while (streaming) {
			const s = await fire(what, opts);
			// Refused once it has stopped listening: that is the balancer's cue to go elsewhere.
			if (s.error === 'ECONNREFUSED') await sleep(20);
		}
	});

	await sleep(500);
	// Slow clients: each build's JSON trickles in over about 2 s, so they are mid-body at the signal.
	const uploads = [1, 2, 3].map((n) =>
		fire(`slow upload ${n}`, {
			method: 'POST',
			path: '/api/v1/builds',
			headers: { ...signedIn, accept: 'application/json', 'content-type': 'application/json' },
			body: JSON.stringify({ name: `Slow upload ${n}`, engine: 'Twin 650 cc', notes: 'x'.repeat(200) }),
			pieces: 20,
			gapMs: 100
		})
	);
	await sleep(300);
	// Answered at once; its e-mail is written and sent after the answer (mail-queue.ts).
	const reset = await fire('password reset', resetForm(base, email));
	expect(reset.status).toBe(200);
	const signalAt = performance.now();
	server.kill('SIGTERM');
	await sleep(1500);
	streaming = false;
	await Promise.all([...loops, ...uploads]);
	const results = await Promise.all(all);

	expect(await app.ending(), app.log).toEqual({ code: 0, signal: null });

	// Accepted: its connection was open a moment before the signal (one still in the kernel's
	// queue when the server stops listening is refused there, and never reached the app).
	const accepted = results.filter((s) => s.connectedAt !== undefined && s.connectedAt < signalAt - 250);
	const failed = accepted.filter((s) => s.error || !s.status || s.status >= 500);
	expect(failed, app.log).toEqual([]);
	// Not vacuous: each looping client had answers before the signal, beside the three uploads.
	expect(accepted.length).toBeGreaterThan(6);
	for (const upload of await Promise.all(uploads)) {
		expect(upload.status, `${upload.what}: ${upload.error ?? ''}`).toBe(201);
		expect(upload.answeredAt!).toBeGreaterThan(signalAt);
	}
	// After the signal the port refuses new connections rather than answering them with errors.
	const late = results.filter((s) => s.connectedAt === undefined);
	expect(late.every((s) => s.error === 'ECONNREFUSED')).toBe(true);

	expect(app.log).not.toMatch(/Cannot use a pool|after calling end|mail-queue/i);
	expect((await mailTo(email, 'Reset your')).link).toContain('/reset/');
}, 60_000);

it('lets handlers whose clients have gone, and the e-mail queued just before, finish before it closes the pool', async () => {
	// adapter-node waits for connections only: with every client gone it signalled at once, and the
	// pool ended under the handlers still reading a build and the queued e-mail (issue 20's bench log).
	const { email, buildId, cookie } = await signedInPerson('shutdown-gone');
	const app = await startApp();
	const reset = send(app.base, 'password reset', resetForm(app.base, email));
	expect((await reset.done).status).toBe(200);
	const gone = [1, 2, 3, 4, 5, 6].map((n) =>
		send(app.base, `build page ${n}`, {
			path: n % 2 ? `/builds/${buildId}` : `/api/v1/builds/${buildId}`,
			headers: { cookie, accept: 'text/html' }
		})
	);
	// Each has sent its request; then the client gives up, before any answer.
	await sleep(30);
	const closed = gone.map((g) => g.abort());
	app.server.kill('SIGTERM');
	await Promise.all(closed);

	expect(await app.ending(), app.log).toEqual({ code: 0, signal: null });
	expect(app.log).not.toMatch(/Cannot use a pool|after calling end|mail-queue/i);
	expect((await mailTo(email, 'Reset your')).link).toContain('/reset/');
}, 60_000);
