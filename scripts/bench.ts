// npm run bench: the same set-up as npm test (fresh test database, the test ports, a fresh build),
// then every figure issue 8 asks for, printed in one table at the end and asserted nowhere:
// the in-process benches of bench/ (Vitest bench), the export endpoints under autocannon beside a
// same-size static answer of the same app, a signed-in 50-connection load on the builds API and
// pages, and the designer page's JavaScript gzipped. Loopback only; every run stops by itself.
//
// PW_BENCH_SECONDS (default 60): length of the signed-in load; PW_BENCH_ENDPOINT_SECONDS (default
// 10): length of each endpoint run (each after a 2 s warm-up). While working on something:
// `npm run bench -- --quick` sets both to 5; `--only=vitest,endpoints,load,size` runs those parts;
// PW_BENCH_CPU_PROF=<dir> has the server write a CPU profile there (node --cpu-prof) when it stops.
// `npm run bench -- --scale` instead seeds issue 20's big shop, measures its lists, builds and
// history route by route (PW_BENCH_SCALE_SECONDS each, 8; 5 with --quick) and removes it again
// (scripts/bench/scale.ts). Every figure is printed beside its aim.
import type { ChildProcess } from 'node:child_process';
import { spawn } from 'node:child_process';
import { once } from 'node:events';
import { existsSync, mkdirSync, readFileSync, rmSync } from 'node:fs';
import { cpus, loadavg, totalmem } from 'node:os';
import { join } from 'node:path';
import { benchBuild, buildApp, buildIsStale, builtServer, serveApp, shutdownEnv, waitForApp } from './app';
import { pageScripts, type PageScripts } from './bench/bundle';
import { load, loadTogether, percentile, type LoadResult, type LoadRun } from './bench/load';
import { measureScale, scaleReport, scaleRoutes, type ScaleFigure } from './bench/scale';
import { removeScale, seedScale } from './bench/scale-seed';
import { sql } from 'drizzle-orm';
import { connect } from '../src/lib/server/db';
import { profile, root } from './profile';
import { runningProfile } from './run-state';
import { bringUp } from './stack';
import { step, StepError, StepFailed } from './steps';

const quick = process.argv.includes('--quick');
const scale = process.argv.includes('--scale');
const parts = ['vitest', 'endpoints', 'load', 'size'] as const;
const onlyArg = process.argv
	.find((a) => a.startsWith('--only='))
	?.slice('--only='.length)
	.split(',');
const unknown = onlyArg?.filter((a) => !(parts as readonly string[]).includes(a)) ?? [];
if (unknown.length) {
	console.error(`--only: some of ${parts.join(', ')} (got ${unknown.join(', ')}).`);
	process.exit(1);
}
// --scale is a run of its own unless --only names parts to run beside it.
const runs = (part: (typeof parts)[number]) => (onlyArg ? onlyArg.includes(part) : !scale);
function seconds(name: string, fallback: number): number {
	const raw = process.env[name];
	const value = raw === undefined || raw === '' ? fallback : Number(raw);
	if (!Number.isFinite(value) || value < 1 || value > 600) {
		console.error(`${name}: a number of seconds from 1 to 600 (got ${raw}).`);
		process.exit(1);
	}
	return value;
}
const loadSeconds = seconds('PW_BENCH_SECONDS', quick ? 5 : 60);
const endpointSeconds = seconds('PW_BENCH_ENDPOINT_SECONDS', quick ? 5 : 10);
const scaleSeconds = seconds('PW_BENCH_SCALE_SECONDS', quick ? 5 : 8);
/** Issue 20's aim for the signed-in load: p95 under this at 50 connections. */
const signedInAimMs = 100;
const warmupSeconds = 2;
const endpointConnections = 10;

const bin = (name: string) => join(root, 'node_modules', '.bin', name);
const results = join(root, 'test-results');
const vitestJson = join(results, 'bench.json');

const p = profile('test');
const already = runningProfile('test');
if (already) {
	console.error(`npm test (or another npm run bench) is running (pid ${already.pid}): the bench uses the same ports and test database.`);
	console.error('Wait for it to finish, then run `npm run bench` again.');
	process.exit(1);
}

let stack: Awaited<ReturnType<typeof bringUp>> | undefined;
let app: ChildProcess | undefined;
let vitest: ChildProcess | undefined;

async function tearDown() {
	for (const child of [vitest, app]) {
		if (child && child.exitCode === null && child.signalCode === null) {
			child.kill('SIGTERM');
			await once(child, 'exit');
		}
	}
	await stack?.shutdown();
}
for (const signal of ['SIGINT', 'SIGTERM'] as const) {
	process.on(signal, () => void tearDown().then(() => process.exit(130)));
}

// ---- what is measured -------------------------------------------------------------------------

interface VitestBench {
	name: string;
	median: number;
	mean: number;
	p99: number;
	sampleCount: number;
}
interface VitestReport {
	files: { filepath: string; groups: { fullName: string; benchmarks: VitestBench[] }[] }[];
}

/** The 60-2 wheel of bench/wheel.bench.ts; `od` is what changes between requests. */
const wheelQuery = (od: string) => `teeth=60&missing=2&od=${od}&depth=5&bore=25&keyway=din6885&shaft=25&tipRadius=0.4&rootRadius=0.6`;
/** A new value per request, none repeated within 100,000 requests, so no cache can answer. */
const varying = (from: number) => {
	let k = 0;
	return () => (from + (k++ % 100_000) / 1000).toFixed(3);
};

interface Endpoint {
	name: string;
	aim: number;
	same: string;
	fresh: () => string;
}
const endpoints = (): Endpoint[] => {
	const od = varying(100);
	const pdfOd = varying(100);
	const diameter = varying(100);
	return [
		{ name: 'wheel.dxf', aim: 0.67, same: `/api/v1/wheel.dxf?${wheelQuery('120')}`, fresh: () => `/api/v1/wheel.dxf?${wheelQuery(od())}` },
		{ name: 'wheel.svg', aim: 0.67, same: `/api/v1/wheel.svg?${wheelQuery('120')}`, fresh: () => `/api/v1/wheel.svg?${wheelQuery(od())}` },
		{ name: 'tape.pdf', aim: 0.33, same: '/api/v1/tape.pdf?diameter=150', fresh: () => `/api/v1/tape.pdf?diameter=${diameter()}` },
		{
			name: 'wheel.pdf',
			aim: 0.33,
			same: `/api/v1/wheel.pdf?${wheelQuery('120')}`,
			fresh: () => `/api/v1/wheel.pdf?${wheelQuery(pdfOd())}`
		}
	];
};

interface EndpointFigures {
	endpoint: Endpoint;
	bytes: number;
	floor: LoadResult;
	cached: LoadResult;
	uncached: LoadResult;
}

async function measured(run: LoadRun): Promise<LoadResult> {
	await load({ ...run, seconds: warmupSeconds });
	return load(run);
}

async function endpointFigures(url: string, e: Endpoint): Promise<EndpointFigures> {
	const first = await fetch(new URL(e.same, url));
	if (first.status !== 200) throw new StepError(`${e.same} answered ${first.status}.`, 'Read the server output above.');
	const bytes = (await first.arrayBuffer()).byteLength;
	const base = { url, connections: endpointConnections, seconds: endpointSeconds };
	const floor = await measured({ ...base, label: `static ${bytes} B`, path: () => `/api/bench/static?bytes=${bytes}` });
	const cached = await measured({ ...base, label: `${e.name} same params`, path: () => e.same });
	const uncached = await measured({ ...base, label: `${e.name} new params`, path: e.fresh });
	return { endpoint: e, bytes, floor, cached, uncached };
}

interface SignedInLoad {
	routes: LoadResult[];
	all: { responses: number; rps: number; p50: number; p95: number; p99: number; errors: number };
}

async function signedInLoad(url: string, env: Record<string, string>): Promise<SignedInLoad> {
	// The test client reads the app's address and the fake mailbox's (signing up confirms the
	// address by mail) from the environment, as it does under npm test.
	Object.assign(process.env, env, { APP_URL: url });
	const { signUp, freshEmail } = await import('../tests/support/client');
	const client = await signUp('Bench Runner', freshEmail('bench'));
	let buildId = '';
	for (let i = 1; i <= 12; i++) {
		const made = await client.send<{ id: string }>('POST', '/api/v1/builds', {
			name: `Bench build ${i}`,
			engine: `Single ${100 + i * 25} cc`
		});
		if (made.status !== 201) throw new StepError(`POST /api/v1/builds answered ${made.status}.`, 'Read the server output above.');
		buildId ||= made.body.id;
	}
	const cookie = [...client.cookies].map(([k, v]) => `${k}=${v}`).join('; ');
	const routes: [string, string, string][] = [
		['GET /api/v1/builds', '/api/v1/builds', 'application/json'],
		['GET /api/v1/builds/:id', `/api/v1/builds/${buildId}`, 'application/json'],
		['GET /builds', '/builds', 'text/html'],
		['GET /builds/:id', `/builds/${buildId}`, 'text/html'],
		['GET /wheel', '/wheel', 'text/html']
	];
	for (const [label, path, accept] of routes) {
		const res = await client.get(path, { accept });
		if (res.status !== 200) throw new StepError(`${label} answered ${res.status} signed in.`, 'Read the server output above.');
	}
	const runs = routes.map(([label, path, accept]): LoadRun => ({
		label,
		url,
		connections: 10,
		seconds: loadSeconds,
		path: () => path,
		headers: { cookie, accept }
	}));
	await loadTogether(runs.map((r) => ({ ...r, seconds: warmupSeconds })));
	const measuredRoutes = await loadTogether(runs);
	const merged = measuredRoutes.flatMap((r) => r.latencies).sort((a, b) => a - b);
	return {
		routes: measuredRoutes,
		all: {
			responses: merged.length,
			rps: measuredRoutes.reduce((s, r) => s + r.rps, 0),
			p50: percentile(merged, 0.5),
			p95: percentile(merged, 0.95),
			p99: percentile(merged, 0.99),
			errors: measuredRoutes.reduce((s, r) => s + r.errors, 0)
		}
	};
}

/**
 * The big shop: a new account made owner of a seeded workshop, its routes measured one by one,
 * then the workshop removed (even when a measurement fails).
 */
async function scaleRun(url: string, env: Record<string, string>): Promise<{ figures: ScaleFigure[]; seedSeconds: number }> {
	Object.assign(process.env, env, { APP_URL: url });
	const { signUp, freshEmail } = await import('../tests/support/client');
	const email = freshEmail('bench-scale');
	const client = await signUp('Bench Runner', email);
	const database = connect(env.DATABASE_URL!);
	try {
		const found = await database.execute<{ id: string }>(sql`select id from "user" where email = ${email}`);
		const started = performance.now();
		const shop = await step(
			'Big shop seeded (SQL, generate_series)',
			() => seedScale(database, found.rows[0]!.id, (line) => console.log(`    ${line}`)),
			(s) => `workshop ${s.workshopId}`
		);
		const seedSeconds = (performance.now() - started) / 1000;
		try {
			// The seeded workshop is the one its pages and API work in: access.ts's workshopCookie (not
			// imported: access.ts reaches SvelteKit's modules, which a script cannot load).
			client.cookies.set('pw-workshop', shop.workshopId);
			const headers = { cookie: [...client.cookies].map(([k, v]) => `${k}=${v}`).join('; ') };
			const get = async (path: string, accept: string) => {
				const res = await client.get(path, { accept });
				return { status: res.status, text: await res.text() };
			};
			const routes = await scaleRoutes(get, shop);
			const figures = await step(
				`Big shop routes, 10 connections, ${scaleSeconds} s each`,
				() => measureScale(url, routes, headers, scaleSeconds, get),
				(f) => `${f.length} routes`
			);
			return { figures, seedSeconds };
		} finally {
			await step(
				'Big shop removed',
				() => removeScale(database, shop.workshopId),
				() => 'gone'
			);
		}
	} finally {
		await database.$client.end();
	}
}

/** Waits until the server answers at once again: the requests it had queued are done. */
async function drain(url: string) {
	for (let i = 0; i < 50; i++) {
		const start = performance.now();
		await fetch(`${url}/api/health`).catch(() => undefined);
		if (performance.now() - start < 50) return;
	}
}

// ---- the table --------------------------------------------------------------------------------

const ms = (v: number) => (Number.isFinite(v) ? (v >= 100 ? v.toFixed(0) : v >= 10 ? v.toFixed(1) : v.toFixed(2)) : '-');
const pad = (cells: (string | number)[], widths: number[]) =>
	cells.map((c, i) => (i === 0 ? String(c).padEnd(widths[i]!) : String(c).padStart(widths[i]!))).join('  ');

function printReport(r: {
	vitest?: VitestReport;
	exports: EndpointFigures[];
	signedIn?: SignedInLoad;
	scripts?: PageScripts;
	scale?: { figures: ScaleFigure[]; seedSeconds: number };
	loadBefore: number[];
}) {
	const out: string[] = [];
	const cpu = cpus();
	out.push('', '════ Benchmarks ════');
	out.push(
		`${new Date().toISOString().slice(0, 16).replace('T', ' ')} UTC · ${cpu.length} × ${cpu[0]?.model ?? 'unknown CPU'} · ${(totalmem() / 2 ** 30).toFixed(0)} GiB · Node ${process.version}`
	);
	out.push(
		`load average before the runs: ${r.loadBefore.map((v) => v.toFixed(2)).join(' ')} (other work on the machine shows in every figure)`
	);

	if (r.vitest) {
		out.push('', 'In process (Vitest bench), ms per run');
		const w = [62, 8, 8, 8, 8];
		out.push(pad(['', 'median', 'mean', 'p99', 'runs'], w));
		for (const f of r.vitest.files)
			for (const g of f.groups)
				for (const b of g.benchmarks) out.push(pad([b.name.slice(0, 62), ms(b.median), ms(b.mean), ms(b.p99), b.sampleCount], w));
		out.push(
			'  aims: live preview recompute under 1 ms; signal check under 5 ms; photo reading of a 12-megapixel photo under 1 s (issue 17)'
		);
	}

	if (r.exports.length) {
		out.push(
			'',
			`Export endpoints (autocannon, ${endpointConnections} connections, ${endpointSeconds} s each after ${warmupSeconds} s of warm-up); ratio = req/s ÷ the same-size static answer's`
		);
		const w = [26, 9, 9, 9, 9, 9, 7, 8];
		out.push(pad(['', 'bytes', 'req/s', 'p50 ms', 'p95 ms', 'p99 ms', 'ratio', 'aim'], w));
		for (const e of r.exports) {
			const row = (l: LoadResult, ratio: string, aim: string) =>
				pad([l.label, e.bytes, l.rps.toFixed(0), ms(l.p50), ms(l.p95), ms(l.p99), ratio, aim], w);
			out.push(row(e.floor, '1', ''));
			const aim = (l: LoadResult) => `≥${e.endpoint.aim} ${l.rps / e.floor.rps >= e.endpoint.aim ? '✓' : '✗'}`;
			out.push(row(e.cached, (e.cached.rps / e.floor.rps).toFixed(2), ''));
			out.push(row(e.uncached, (e.uncached.rps / e.floor.rps).toFixed(2), aim(e.uncached)));
			const errors = e.floor.errors + e.cached.errors + e.uncached.errors;
			if (errors) out.push(`  ✗ ${errors} errors or non-2xx answers in the runs above`);
		}
		out.push('  aims (issue 20), files made anew (new params): DXF and SVG at 0.67 of the static floor, PDFs at 0.33');
	}

	if (r.signedIn) {
		const s = r.signedIn;
		out.push('', `Signed-in load (autocannon, 50 connections: 10 per route, all at once, ${loadSeconds} s)`);
		const w = [26, 9, 9, 9, 9, 9, 8];
		const aim = (p95: number) => `< ${signedInAimMs} ${p95 < signedInAimMs ? '✓' : '✗'}`;
		const wa = [...w, 9];
		out.push(pad(['', 'answers', 'req/s', 'p50 ms', 'p95 ms', 'p99 ms', 'errors', 'aim p95'], wa));
		for (const l of s.routes)
			out.push(pad([l.label, l.responses, l.rps.toFixed(0), ms(l.p50), ms(l.p95), ms(l.p99), l.errors, aim(l.p95)], wa));
		out.push(
			pad(
				['all routes', s.all.responses, s.all.rps.toFixed(0), ms(s.all.p50), ms(s.all.p95), ms(s.all.p99), s.all.errors, aim(s.all.p95)],
				wa
			)
		);
		out.push(
			`  aims: p95 under ${signedInAimMs} ms at 50 connections (issue 20); 0 errors${s.all.errors ? `  ✗ got ${s.all.errors}` : ' ✓'}`
		);
	}

	if (r.scripts) {
		const kb = (b: number) => (b / 1024).toFixed(1);
		out.push(
			'',
			`Designer page (/wheel) JavaScript: ${kb(r.scripts.gzip)} KB gzipped (${kb(r.scripts.bytes)} KB raw) in ${r.scripts.files.length} files; aim ≤ 150 KB`
		);
		out.push(
			`  largest: ${r.scripts.files
				.slice(0, 5)
				.map((f) => `${f.file.split('/').pop()} ${kb(f.gzip)} KB`)
				.join(', ')}`
		);
	}
	if (r.scale) out.push(...scaleReport(r.scale.figures, scaleSeconds, r.scale.seedSeconds));
	console.log(out.join('\n'));
}

// ---- the run ----------------------------------------------------------------------------------

let exitCode = 1;
try {
	const loadBefore = loadavg();
	stack = await bringUp(p, { freshDatabase: true });
	// Its own build, with the floor endpoint (bench-floor.ts) that the product's build leaves out.
	await step(
		'Build (with the bench floor)',
		() => (buildIsStale(benchBuild) ? (buildApp(benchBuild), `built into ${benchBuild.dir}/`) : 'up to date'),
		(r) => r
	);

	let vitestReport: VitestReport | undefined;
	if (runs('vitest')) {
		console.log('▸ In-process benches (Vitest bench: bench/*.bench.ts)');
		mkdirSync(results, { recursive: true });
		rmSync(vitestJson, { force: true });
		// Not spawnSync: the fakes run in this process and must keep answering.
		vitest = spawn(bin('vitest'), ['bench', '--run', '--project', 'unit', `--outputJson=${vitestJson}`], {
			cwd: root,
			stdio: 'inherit',
			env: { ...process.env, ...stack.env }
		});
		await once(vitest, 'exit');
		vitestReport = existsSync(vitestJson) ? (JSON.parse(readFileSync(vitestJson, 'utf8')) as VitestReport) : undefined;
		if (!vitestReport) console.error('  ✗ Vitest wrote no bench results (see above)');
	}

	const profileDir = process.env.PW_BENCH_CPU_PROF;
	const serverEnv = stack.env;
	// As serveApp does, with node's profiler flags (which NODE_OPTIONS does not take).
	const server = profileDir
		? spawn(process.execPath, ['--cpu-prof', `--cpu-prof-dir=${profileDir}`, builtServer(benchBuild)], {
				cwd: root,
				env: { ...process.env, NODE_ENV: 'production', ...shutdownEnv(), ...serverEnv },
				stdio: ['ignore', 'inherit', 'inherit']
			})
		: serveApp(serverEnv, benchBuild);
	app = server;
	stack.track(server);
	const url = stack.env.APP_URL!;
	await step(
		`Bench server on ${url} (${benchBuild.dir}/)`,
		() => waitForApp(url, server),
		(s) => `health check answered ${s}`
	);

	const scripts = runs('size')
		? await step(
				'Designer page JavaScript (from the build)',
				() => pageScripts('/wheel', benchBuild.dir),
				(s) => `${s.files.length} files`
			)
		: undefined;

	const exports: EndpointFigures[] = [];
	for (const e of runs('endpoints') ? endpoints() : []) {
		exports.push(
			await step(
				`${e.name}: static floor, same params, new params`,
				() => endpointFigures(url, e),
				(f) => `${f.cached.rps.toFixed(0)} / ${f.uncached.rps.toFixed(0)} req/s against ${f.floor.rps.toFixed(0)}`
			)
		);
		await drain(url);
	}
	const signedIn = runs('load')
		? await step(
				`Signed-in load, 50 connections, ${loadSeconds} s`,
				() => signedInLoad(url, stack!.env),
				(s) => `${s.all.responses} answers, ${s.all.errors} errors`
			)
		: undefined;
	await drain(url);
	const scaleFigures = scale ? await scaleRun(url, stack.env) : undefined;
	// autocannon stops sending at its deadline; let the server finish what it had already taken.
	await drain(url);

	printReport({ vitest: vitestReport, exports, signedIn, scripts, scale: scaleFigures, loadBefore });
	exitCode = vitestReport || !runs('vitest') ? 0 : 1;
} catch (err) {
	if (!(err instanceof StepFailed)) console.error(err);
} finally {
	await tearDown();
}
process.exit(exitCode);
