// npm test: the same set-up as npm start against a fresh test database and the test ports, then
// type checks (svelte-check), lint (Prettier's check and ESLint), and one Vitest run of the unit,
// integration and end-to-end projects against a freshly built server. Exits non-zero on any failure
// and ends with "N passed, N failed".
import type { ChildProcess } from 'node:child_process';
import { spawn, spawnSync } from 'node:child_process';
import { once } from 'node:events';
import { existsSync, mkdirSync, readFileSync, rmSync } from 'node:fs';
import { join } from 'node:path';
import { buildApp, buildIsStale, serveApp, waitForApp } from './app';
import { aptInstall } from './postgres';
import { profile, root } from './profile';
import { runningProfile } from './run-state';
import { bringUp } from './stack';
import { step, StepError, StepFailed } from './steps';

export const chromiumPath = '/usr/bin/chromium';

/** What the tests check the product against, and the Debian package that brings each. */
const referenceTools = [
	{ pkg: 'chromium', present: () => existsSync(chromiumPath) },
	{ pkg: 'python3-ezdxf', present: () => spawnSync('/usr/bin/python3', ['-c', 'import ezdxf']).status === 0 },
	{ pkg: 'python3-fonttools', present: () => spawnSync('/usr/bin/python3', ['-c', 'import fontTools']).status === 0 },
	{ pkg: 'poppler-utils', present: () => existsSync('/usr/bin/pdfinfo') && existsSync('/usr/bin/pdftotext') },
	{ pkg: 'librecad', present: () => existsSync('/usr/bin/librecad') },
	{ pkg: 'openscad', present: () => existsSync('/usr/bin/openscad') },
	{ pkg: 'admesh', present: () => existsSync('/usr/bin/admesh') }
];
const bin = (name: string) => join(root, 'node_modules', '.bin', name);
const results = join(root, 'test-results');
const vitestJson = join(results, 'vitest.json');

interface VitestSummary {
	numPassedTests: number;
	numFailedTests: number;
	numPendingTests: number;
	testResults: { status: string; assertionResults: unknown[] }[];
}

const p = profile('test');
const already = runningProfile('test');
if (already) {
	console.error(`npm test is already running (pid ${already.pid}); wait for it or run \`npm run stop\`.`);
	process.exit(1);
}

let stack: Awaited<ReturnType<typeof bringUp>> | undefined;
let app: ChildProcess | undefined;

async function tearDown() {
	if (app && app.exitCode === null) {
		app.kill('SIGTERM');
		await once(app, 'exit');
	}
	await stack?.shutdown();
}
for (const signal of ['SIGINT', 'SIGTERM'] as const) {
	process.on(signal, () => void tearDown().then(() => process.exit(130)));
}

let exitCode = 1;
try {
	await step(
		'Reference tools from Debian (Chromium, ezdxf, poppler, LibreCAD, OpenSCAD)',
		() => {
			const missing = referenceTools.filter((t) => !t.present()).map((t) => t.pkg);
			if (!missing.length) return 'present';
			if (process.getuid?.() !== 0)
				throw new StepError(`Missing: ${missing.join(', ')}.`, `Install them with \`sudo apt-get install -y ${missing.join(' ')}\`.`);
			aptInstall(missing);
			return `installed ${missing.join(', ')}`;
		},
		(r) => r
	);

	stack = await bringUp(p, { freshDatabase: true });

	const typesOk = await step(
		'Type check (svelte-check)',
		() => {
			spawnSync(bin('svelte-kit'), ['sync'], { cwd: root, stdio: 'inherit' });
			const res = spawnSync(bin('svelte-check'), ['--tsconfig', './tsconfig.json', '--fail-on-warnings', '--output', 'human'], {
				cwd: root,
				stdio: 'inherit'
			});
			return res.status === 0;
		},
		(ok) => (ok ? 'no errors, no warnings' : 'FAILED (see above)')
	);

	// As `npm run lint`: Prettier's check (prints only the files it would change), then ESLint.
	const lintOk = await step(
		'Lint (Prettier check, ESLint)',
		() => {
			const format = spawnSync(bin('prettier'), ['--check', '.', '--log-level', 'warn'], { cwd: root, stdio: 'inherit' });
			const eslint = spawnSync(bin('eslint'), ['.'], { cwd: root, stdio: 'inherit' });
			return format.status === 0 && eslint.status === 0;
		},
		(ok) => (ok ? 'formatted, no findings' : 'FAILED (see above; `npm run format` fixes the layout)')
	);

	await step(
		'Build',
		() => (buildIsStale() ? (buildApp(), 'built into build/') : 'up to date'),
		(r) => r
	);
	const server = serveApp(stack.env);
	app = server;
	stack.track(server);
	await step(
		`Test server on ${stack.env.APP_URL}`,
		() => waitForApp(stack!.env.APP_URL!, server),
		(s) => `health check answered ${s}`
	);

	console.log('▸ Tests (Vitest: unit, integration, e2e)');
	mkdirSync(results, { recursive: true });
	rmSync(vitestJson, { force: true });
	// Not spawnSync: the fakes run in this process and must keep answering while the tests run.
	// `npm test -- <file filters>` narrows the run while working on something; CI runs it all.
	const only = process.argv.slice(2).filter((a) => !a.startsWith('-'));
	const vitest = spawn(bin('vitest'), ['run', '--reporter=default', '--reporter=json', `--outputFile.json=${vitestJson}`, ...only], {
		cwd: root,
		stdio: 'inherit',
		env: { ...process.env, ...stack.env, CHROMIUM_PATH: chromiumPath }
	});
	await once(vitest, 'exit');
	const counts = existsSync(vitestJson) ? (JSON.parse(readFileSync(vitestJson, 'utf8')) as VitestSummary) : undefined;
	// A test file that fails to load has no tests of its own; count it as one failure.
	const failed = counts
		? counts.numFailedTests + counts.testResults.filter((f) => f.status === 'failed' && f.assertionResults.length === 0).length
		: 0;

	console.log('');
	console.log(`type check: ${typesOk ? 'passed' : 'FAILED'}`);
	console.log(`lint: ${lintOk ? 'passed' : 'FAILED'}`);
	if (!counts) {
		console.log('tests: Vitest wrote no results (it crashed; see above)');
	} else {
		const skipped = counts.numPendingTests ? `, ${counts.numPendingTests} skipped` : '';
		console.log(`tests: ${counts.numPassedTests} passed, ${failed} failed${skipped}`);
	}
	exitCode = typesOk && lintOk && counts && failed === 0 && counts.numPassedTests > 0 ? 0 : 1;
} catch (err) {
	if (!(err instanceof StepFailed)) console.error(err);
} finally {
	await tearDown();
}
process.exit(exitCode);
