// npm run stop: ends every `npm start` / `npm test` of this checkout and what they started,
// then stops the private PostgreSQL cluster.
import { existsSync } from 'node:fs';
import * as pgCluster from './postgres';
import { clearState, isAlive, liveStates } from './run-state';
import { sleep } from './steps';

let stopped = 0;
for (const state of liveStates()) {
	process.kill(state.pid, 'SIGTERM');
	for (let i = 0; i < 100 && isAlive(state.pid); i++) await sleep(150);
	for (const pid of [...state.children, state.pid]) {
		if (isAlive(pid)) process.kill(pid, 'SIGKILL');
	}
	clearState(state.profile);
	stopped++;
	console.log(`✓ stopped npm ${state.profile === 'local' ? 'start' : 'test'} (pid ${state.pid})`);
}

const dir = pgCluster.clusterDir();
if (existsSync(dir)) {
	const { bin } = pgCluster.serverBin();
	if (pgCluster.isRunning(bin, dir)) {
		pgCluster.stop(bin, dir);
		console.log('✓ stopped the private PostgreSQL cluster');
		stopped++;
	}
}
if (!stopped) console.log('Nothing of Phasewright was running.');
