// npm start: set everything up, build, and serve Phasewright on http://127.0.0.1:3000 until Ctrl-C.
// npm run dev (--dev): the same set-up, then Vite's dev server with hot reload instead of a build.
import type { ChildProcess } from 'node:child_process';
import { once } from 'node:events';
import { buildApp, buildIsStale, devServer, serveApp, waitForApp } from './app';
import { profile, realEndpoints } from './profile';
import { runningProfile } from './run-state';
import { bringUp } from './stack';
import { step, StepFailed } from './steps';

const dev = process.argv.includes('--dev');
const p = profile('local');
const already = runningProfile('local');
if (already) {
	console.log(`Phasewright is already running (pid ${already.pid}) at http://127.0.0.1:${p.appPort}. Stop it with \`npm run stop\`.`);
	process.exit(0);
}

let stack: Awaited<ReturnType<typeof bringUp>> | undefined;
let app: ChildProcess | undefined;
let stopping = false;

async function stopAll(code: number) {
	if (stopping) return;
	stopping = true;
	console.log('\n▸ Stopping');
	if (app && app.exitCode === null) {
		app.kill('SIGTERM');
		await once(app, 'exit');
	}
	await stack?.shutdown();
	console.log('  ✓ stopped everything this run started');
	process.exit(code);
}
process.on('SIGINT', () => void stopAll(0));
process.on('SIGTERM', () => void stopAll(0));

try {
	stack = await bringUp(p, { freshDatabase: false, real: realEndpoints() });
	if (!dev)
		await step(
			'Build',
			() => (buildIsStale() ? (buildApp(), 'built into build/') : 'up to date'),
			(r) => r
		);
	const server = dev ? devServer(stack.env) : serveApp(stack.env);
	app = server;
	stack.track(server);
	server.on('exit', (code) => {
		if (!stopping) {
			console.error(`The server exited (code ${code}).`);
			void stopAll(1);
		}
	});
	const url = stack.env.APP_URL!;
	await step(
		`Serving on ${url}${dev ? ' (dev server)' : ''}`,
		() => waitForApp(url, server, dev ? 90_000 : 30_000),
		(s) => `health check answered ${s}`
	);

	console.log(`\nPhasewright is running at ${url}`);
	if (stack.env.MAILBOX_URL) console.log(`Mail the app sends lands in the local mailbox: ${url}/dev/mail`);
	console.log('Press Ctrl-C to stop (or run `npm run stop` in another terminal).');
} catch (err) {
	if (!(err instanceof StepFailed)) console.error(err);
	await stopAll(1);
}
