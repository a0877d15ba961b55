// Building and serving the SvelteKit app (adapter-node output in build/).
import { spawn, spawnSync, type ChildProcess } from 'node:child_process';
import { existsSync, readdirSync, statSync } from 'node:fs';
import { join } from 'node:path';
import { root } from './profile';
import { sleep, StepError } from './steps';

const bin = (name: string) => join(root, 'node_modules', '.bin', name);
const builtServer = join(root, 'build', 'index.js');
const sources = ['src', 'static', 'drizzle', 'svelte.config.js', 'vite.config.ts', 'tailwind.config.ts', 'package-lock.json'];

function newestChange(path: string): number {
	const stat = statSync(path);
	if (!stat.isDirectory()) return stat.mtimeMs;
	return Math.max(stat.mtimeMs, ...readdirSync(path).map((f) => newestChange(join(path, f))));
}

/** True when build/ is older than any source file. */
export function buildIsStale(): boolean {
	if (!existsSync(builtServer)) return true;
	const built = statSync(builtServer).mtimeMs;
	return sources.some((s) => existsSync(join(root, s)) && newestChange(join(root, s)) > built);
}

export function buildApp() {
	const res = spawnSync(bin('vite'), ['build', '--logLevel', 'warn'], { cwd: root, stdio: 'inherit' });
	if (res.status !== 0) throw new StepError('vite build failed (errors above).', 'Fix the reported error, then run this again.');
}

export function serveApp(env: Record<string, string>): ChildProcess {
	return spawn(process.execPath, [builtServer], {
		cwd: root,
		env: { ...process.env, NODE_ENV: 'production', ...env },
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
export async function waitForApp(baseUrl: string, child: ChildProcess, timeoutMs = 30_000) {
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
	throw new StepError(`the server did not answer on ${baseUrl} within ${timeoutMs / 1000} s.`, 'Is the port taken? Set PORT to another one.');
}
