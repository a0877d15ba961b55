// What each running `npm start` / `npm test` has started, kept in .data/run/<profile>.json so that
// `npm run stop` can stop it from another terminal, and so the shared PostgreSQL cluster is only
// stopped by the last one using it.
import { existsSync, mkdirSync, readdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { runDir, type ProfileName } from './profile';

export interface RunState {
	pid: number;
	profile: ProfileName;
	children: number[];
	startedPostgres: boolean;
}

const file = (profile: ProfileName) => join(runDir, `${profile}.json`);

export function isAlive(pid: number) {
	try {
		process.kill(pid, 0);
		return true;
	} catch {
		return false;
	}
}

export function saveState(state: RunState) {
	mkdirSync(runDir, { recursive: true });
	writeFileSync(file(state.profile), JSON.stringify(state));
}

export function clearState(profile: ProfileName) {
	rmSync(file(profile), { force: true });
}

export function liveStates(): RunState[] {
	if (!existsSync(runDir)) return [];
	return readdirSync(runDir)
		.filter((f) => f.endsWith('.json'))
		.map((f) => JSON.parse(readFileSync(join(runDir, f), 'utf8')) as RunState)
		.filter((s) => isAlive(s.pid));
}

export function runningProfile(profile: ProfileName): RunState | undefined {
	return liveStates().find((s) => s.profile === profile);
}
