// Backups of the database with PostgreSQL's own tools: pg_dump's custom format (compressed, one
// file, restorable table by table) and pg_restore. Photos live in the object store; back up the
// bucket with the store's own means (versioning, replication).
import { spawn } from 'node:child_process';
import { mkdirSync } from 'node:fs';
import { dirname, join } from 'node:path';
import * as pgCluster from './postgres';
import { databaseUrl, dataDir, profile } from './profile';
import { liveStates } from './run-state';

export const backupDir = join(dataDir, 'backups');

function run(bin: string, args: string[]): Promise<void> {
	return new Promise((resolve, reject) => {
		const child = spawn(bin, args, { stdio: ['ignore', 'inherit', 'inherit'] });
		child.once('error', reject);
		child.once('exit', (code) => (code === 0 ? resolve() : reject(new Error(`${bin.split('/').at(-1)} exited with ${code}`))));
	});
}

/**
 * The database to work on: DATABASE_URL when set (production, or the test stack), else the local
 * `npm start` database, with the private cluster started for the while if it is not running.
 */
export async function withDatabase<T>(task: (url: string, bin: string) => Promise<T>): Promise<T> {
	const { bin } = pgCluster.serverBin();
	if (process.env.DATABASE_URL) return task(process.env.DATABASE_URL, bin);
	const dir = pgCluster.clusterDir();
	const started = !pgCluster.isRunning(bin, dir);
	if (started) await pgCluster.start(bin, dir);
	try {
		return await task(databaseUrl(profile('local')), bin);
	} finally {
		if (started && liveStates().length === 0) pgCluster.stop(bin, dir);
	}
}

export async function backup(url: string, bin: string, file?: string): Promise<string> {
	const out = file ?? join(backupDir, `phasewright-${new Date().toISOString().replace(/[:.]/g, '-')}.dump`);
	mkdirSync(dirname(out), { recursive: true });
	await run(join(bin, 'pg_dump'), ['--format=custom', '--no-owner', '--no-privileges', `--file=${out}`, `--dbname=${url}`]);
	return out;
}

/** Replaces the database's tables with the backup's, in one transaction: all or nothing. */
export async function restore(url: string, bin: string, file: string): Promise<void> {
	await run(join(bin, 'pg_restore'), [
		'--clean',
		'--if-exists',
		'--no-owner',
		'--no-privileges',
		'--single-transaction',
		'--exit-on-error',
		`--dbname=${url}`,
		file
	]);
}
