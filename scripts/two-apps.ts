// Two app processes behind one balancer (PW_TWO_APPS=1 with npm start, npm test or npm run bench;
// scripts/app.ts runs this instead of the single server). It shows that nothing one process keeps
// in memory is needed by the other: every request goes to the next process in turn, so a session,
// a throttle count or a queued e-mail made in one is read or sent by the other.
//
// The balancer is node:http, round-robin, with a keep-alive pool per process: a dozen lines to read,
// where a proxy package (http-proxy has had no release since 2020) would add a dependency for it.
// A process that refuses the connection (stopping, or not up yet) is skipped for requests without
// a body, which is what makes a rolling restart behind it lose nothing.
//
// Run as `tsx scripts/two-apps.ts <build dir>` with the app's environment: the balancer listens on
// HOST:PORT, the apps on two free loopback ports. SIGTERM/SIGINT stop the balancer from accepting,
// pass the signal to both apps (each finishes what it has: src/lib/server/shutdown.ts) and exit 0
// once they have. SIGHUP restarts them one at a time, as a rolling deploy does.
import { spawn, type ChildProcess } from 'node:child_process';
import { once } from 'node:events';
import http from 'node:http';
import { createServer } from 'node:net';
import { join } from 'node:path';

export interface Upstream {
	port: number;
	served: number;
	/** Taken out of the rotation (being restarted): no new requests go to it. */
	out?: boolean;
}

/** A round-robin proxy over `upstreams` on 127.0.0.1. */
export function balancer(upstreams: Upstream[]): http.Server {
	const agent = new http.Agent({ keepAlive: true, maxSockets: 64 });
	let turn = 0;
	const forward = (req: http.IncomingMessage, res: http.ServerResponse, tries: number) => {
		const live = upstreams.filter((u) => !u.out);
		const pool = live.length ? live : upstreams;
		const up = pool[turn++ % pool.length]!;
		const out = http.request(
			{ host: '127.0.0.1', port: up.port, method: req.method, path: req.url, headers: req.headers, agent },
			(answer) => {
				up.served++;
				res.writeHead(answer.statusCode ?? 502, answer.statusMessage, answer.rawHeaders);
				answer.pipe(res);
			}
		);
		out.on('error', (err: NodeJS.ErrnoException) => {
			const bodiless = req.method === 'GET' || req.method === 'HEAD';
			if (err.code === 'ECONNREFUSED' && bodiless && tries < upstreams.length) return forward(req, res, tries + 1);
			if (!res.headersSent) res.writeHead(502, { 'content-type': 'text/plain' }).end(`balancer: ${err.code ?? err.message}\n`);
			else res.destroy(err);
		});
		res.on('close', () => {
			if (!res.writableFinished) out.destroy();
		});
		req.pipe(out);
	};
	return http.createServer((req, res) => forward(req, res, 1));
}

async function freePort(): Promise<number> {
	const probe = createServer().listen(0, '127.0.0.1');
	await once(probe, 'listening');
	const port = (probe.address() as { port: number }).port;
	probe.close();
	await once(probe, 'close');
	return port;
}

async function answering(port: number) {
	for (let i = 0; i < 300; i++) {
		const up = await fetch(`http://127.0.0.1:${port}/api/health`).then(
			() => true,
			() => false
		);
		if (up) return;
		await new Promise((r) => setTimeout(r, 100));
	}
	throw new Error(`the app on port ${port} did not answer within 30 s`);
}

async function main() {
	const dir = process.argv[2] ?? 'build';
	const host = process.env.HOST ?? '127.0.0.1';
	const port = Number(process.env.PORT ?? 3000);
	const upstreams: Upstream[] = [];
	const apps: ChildProcess[] = [];
	let stopping = false;
	const restarting = new Set<number>();
	const startApp = (i: number) => {
		const up = upstreams[i]!;
		const child = spawn(process.execPath, [join(process.cwd(), dir, 'index.js')], {
			env: { ...process.env, HOST: '127.0.0.1', PORT: String(up.port) },
			stdio: ['ignore', 'inherit', 'inherit']
		});
		child.on('exit', (code, signal) => {
			console.log(`app ${i + 1} (port ${up.port}) exited: ${signal ?? code}`);
			// One app dying on its own is a fault: stop the other too, so the caller sees it.
			if (!stopping && !restarting.has(i)) void stop('SIGTERM');
		});
		apps[i] = child;
	};
	for (const i of [0, 1]) {
		upstreams.push({ port: await freePort(), served: 0 });
		startApp(i);
	}
	// Listening only once both answer, so the caller's own wait for the app means both are up.
	for (const up of upstreams) await answering(up.port);
	const server = balancer(upstreams);
	server.listen(port, host, () =>
		console.log(`Balancer on http://${host}:${port} over ports ${upstreams.map((u) => u.port).join(' and ')}`)
	);

	async function stop(signal: NodeJS.Signals) {
		if (stopping) return;
		stopping = true;
		server.close();
		server.closeIdleConnections();
		await Promise.all(
			apps.map(async (app) => {
				if (app.exitCode !== null || app.signalCode !== null) return;
				app.kill(signal);
				await once(app, 'exit');
			})
		);
		server.closeAllConnections();
		console.log(`balancer: ${upstreams.map((u) => `${u.served} answers from port ${u.port}`).join(', ')}`);
		process.exit(apps.every((a) => a.exitCode === 0) ? 0 : 1);
	}

	/**
	 * SIGHUP: a rolling restart, as a deploy behind a balancer does it. Each app in turn leaves the
	 * rotation, is stopped (it finishes what it has), and a new one on its port joins once it answers.
	 */
	async function rollingRestart() {
		for (const i of [0, 1]) {
			if (stopping) return;
			const up = upstreams[i]!;
			restarting.add(i);
			up.out = true;
			const old = apps[i]!;
			old.kill('SIGTERM');
			const [code] = (await once(old, 'exit')) as [number | null];
			console.log(`rolling restart: app ${i + 1} stopped with ${code}; starting it again`);
			startApp(i);
			await answering(up.port);
			up.out = false;
			restarting.delete(i);
		}
		console.log('rolling restart: done');
	}
	let rolling: Promise<void> | undefined;
	process.on('SIGHUP', () => {
		rolling ??= rollingRestart().finally(() => (rolling = undefined));
	});
	for (const signal of ['SIGTERM', 'SIGINT'] as const) process.on(signal, () => void stop(signal));
}

if (process.argv[1] && import.meta.filename === process.argv[1]) await main();
