// Building and serving the SvelteKit app (adapter-node output in build/, or build-bench/ for the
// bench's own build).
import { spawn, spawnSync, type ChildProcess } from 'node:child_process';
import { existsSync, readdirSync, statSync } from 'node:fs';
import { join } from 'node:path';
import { root } from './profile';
import { sleep, StepError } from './steps';

const bin = (name: string) => join(root, 'node_modules', '.bin', name);
const sources = ['src', 'static', 'drizzle', 'svelte.config.js', 'vite.config.ts', 'tailwind.config.ts', 'package-lock.json'];

function newestChange(path: string): number {
	const stat = statSync(path);
	if (!stat.isDirectory()) return stat.mtimeMs;
	return Math.max(stat.mtimeMs, ...readdirSync(path).map((f) => newestChange(join(path, f))));
}

/** A server build: where adapter-node writes it, and what the build reads from the environment. */
export interface AppBuild {
	dir: string;
	env: Record<string, string>;
}
/** What npm start and npm test serve. */
export const productBuild: AppBuild = { dir: 'build', env: {} };
/** npm run bench's: the product plus the bench's floor endpoint (src/lib/server/bench-floor.ts). */
export const benchBuild: AppBuild = { dir: 'build-bench', env: { VITE_PW_BENCH: '1' } };

export const builtServer = (build: AppBuild = productBuild) => join(root, build.dir, 'index.js');

/** True when the build is older than any source file. */
export function buildIsStale(build: AppBuild = productBuild): boolean {
	const server = builtServer(build);
	if (!existsSync(server)) return true;
	const built = statSync(server).mtimeMs;
	return sources.some((s) => existsSync(join(root, s)) && newestChange(join(root, s)) > built);
}

export function buildApp(build: AppBuild = productBuild) {
	// VITE_PW_BENCH is set for every build, so one left in the shell cannot put the floor in build/.
	const env = { ...process.env, VITE_PW_BENCH: '', ...build.env, PW_BUILD_DIR: build.dir };
	const res = spawnSync(bin('vite'), ['build', '--logLevel', 'warn'], { cwd: root, stdio: 'inherit', env });
	if (res.status !== 0) throw new StepError('vite build failed (errors above).', 'Fix the reported error, then run this again.');
}

/**
 * adapter-node's limit on a stop (SIGTERM/SIGINT): requests still open after it are cut, and the
 * pool and mail transport close (src/lib/server/shutdown.ts). Its own default is 30 s; ours 10.
 */
export const shutdownEnv = () => ({ SHUTDOWN_TIMEOUT: process.env.SHUTDOWN_TIMEOUT || '10' });

/** PW_TWO_APPS=1: two app processes behind a round-robin balancer on the app's port (scripts/two-apps.ts). */
export const twoApps = () => process.env.PW_TWO_APPS === '1';

export function serveApp(env: Record<string, string>, build: AppBuild = productBuild): ChildProcess {
	if (twoApps())
		return spawn(process.execPath, ['--import', 'tsx', join(root, 'scripts', 'two-apps.ts'), build.dir], {
			cwd: root,
			env: { ...process.env, NODE_ENV: 'production', ...shutdownEnv(), ...env },
			stdio: ['ignore', 'inherit', 'inherit']
		});
	return spawn(process.execPath, [builtServer(build)], {
		cwd: root,
		env: { ...process.env, NODE_ENV: 'production', ...shutdownEnv(), ...env },
		stdio: ['ignore', 'inherit', 'inherit']
	});
}

/** Vite's dev server with hot reload, on the profile's port. */
export function devServer(env: Record<string, string>): ChildProcess {
	return spawn(bin('vite'), ['dev', '--host', env.HOST ?? '127.0.0.1', '--port', env.PORT ?? '3000', '--strictPort'], {
		cwd: root,
		env: { ...process.env, ...env },
		stdio: ['ignore', 'inherit', 'inherit']
	});
}

/** Waits until the server answers its health check (any status: a 503 still means it is serving). */
// Two processes (and tsx for the balancer) take longer to come up on a busy machine.
export async function waitForApp(baseUrl: string, child: ChildProcess, timeoutMs = twoApps() ? 60_000 : 30_000) {
	const deadline = Date.now() + timeoutMs;
	while (Date.now() < deadline) {
		if (child.exitCode !== null) throw new StepError(`the server exited with code ${child.exitCode}.`, 'Read its output above.');
		try {
			const res = await fetch(`${baseUrl}/api/health`);
			return res.status;
		} catch {
			await sleep(200);
		}
	}
	throw new StepError(
		`the server did not answer on ${baseUrl} within ${timeoutMs / 1000} s.`,
		'Is the port taken? Set PORT to another one.'
	);
}
