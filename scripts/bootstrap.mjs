// `npm start`, `npm test` and `npm run stop` land here. Plain Node, no dependencies: it installs
// the npm dependencies when they are missing or older than package-lock.json, then hands over to
// the TypeScript script of the same name (scripts/<command>.ts) through tsx.
import { spawn, spawnSync } from 'node:child_process';
import { existsSync, statSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';

const root = join(dirname(fileURLToPath(import.meta.url)), '..');
const [command, ...args] = process.argv.slice(2);
const installed = join(root, 'node_modules', '.package-lock.json');
const lock = join(root, 'package-lock.json');

const stale = !existsSync(installed) || statSync(installed).mtimeMs < statSync(lock).mtimeMs;
if (stale) {
	console.log('▸ npm dependencies: installing with npm ci (first run, or package-lock.json changed)');
	const ci = spawnSync('npm', ['ci', '--no-audit', '--no-fund'], { cwd: root, stdio: 'inherit' });
	if (ci.status !== 0) {
		console.error('  ✗ npm ci failed.');
		console.error('  → Check the network to the npm registry and that Node is 20.19 or newer (node -v), then run this again.');
		process.exit(1);
	}
	console.log('  ✓ npm dependencies installed');
}

const child = spawn(process.execPath, ['--import', 'tsx', join(root, 'scripts', `${command}.ts`), ...args], {
	cwd: root,
	stdio: 'inherit'
});
// Ctrl-C reaches the whole process group; the script below does the orderly shutdown, so this
// wrapper only waits for it. A TERM from elsewhere is passed on.
process.on('SIGINT', () => {});
process.on('SIGTERM', () => child.kill('SIGTERM'));
child.on('exit', (code, signal) => process.exit(code ?? (signal ? 1 : 0)));
