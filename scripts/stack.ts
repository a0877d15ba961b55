// The set-up both `npm start` and `npm test` go through, step by step: PostgreSQL, the database,
// migrations, the demo seed and the local fakes. Returns the environment the app and the tests
// need, and a shutdown that stops what this run started (and nothing it found running).
import type { ChildProcess } from 'node:child_process';
import { randomBytes } from 'node:crypto';
import { existsSync, mkdirSync, readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { seedDemo } from './seed';
import { migrateDatabase } from './db';
import { startFakes } from './fakes';
import * as pgCluster from './postgres';
import { appEnv, dataDir, type Profile } from './profile';
import { clearState, liveStates, saveState, type RunState } from './run-state';
import { step } from './steps';
import { connect } from '../src/lib/server/db';

export interface Real {
	database: boolean;
	mail: boolean;
	storage: boolean;
}

const none: Real = { database: false, mail: false, storage: false };

/** The local session-signing secret: made once, kept in .data (mode 600), never committed. */
function localAuthSecret(): string {
	const file = join(dataDir, 'auth-secret');
	if (!existsSync(file)) {
		mkdirSync(dataDir, { recursive: true });
		writeFileSync(file, randomBytes(33).toString('base64'), { mode: 0o600 });
	}
	return readFileSync(file, 'utf8').trim();
}

export async function bringUp(p: Profile, opts: { freshDatabase: boolean; real?: Real }) {
	const real = opts.real ?? none;
	const state: RunState = { pid: process.pid, profile: p.name, children: [], startedPostgres: false };
	const env: Record<string, string> = { ...appEnv(p), AUTH_SECRET: process.env.AUTH_SECRET ?? localAuthSecret() };
	let closeFakes: () => Promise<void> = async () => {};
	let cluster: { bin: string; dir: string } | undefined;

	const shutdown = async () => {
		await closeFakes();
		if (cluster && state.startedPostgres) {
			const others = liveStates().filter((s) => s.pid !== process.pid);
			if (others.length === 0) pgCluster.stop(cluster.bin, cluster.dir);
		}
		clearState(p.name);
	};

	try {
		if (real.database) {
			console.log('▸ PostgreSQL: using DATABASE_URL from the environment (no local cluster)');
			env.DATABASE_URL = process.env.DATABASE_URL!;
		} else {
			const { bin } = await step(
				'PostgreSQL server',
				() => pgCluster.serverBin(),
				(r) => `${r.bin}${r.installed ? ' (installed from Debian)' : ''}`
			);
			const dir = pgCluster.clusterDir();
			cluster = { bin, dir };
			await step(
				'Private cluster',
				() => pgCluster.initCluster(bin, dir),
				(created) => `${dir} ${created ? '(created)' : '(exists)'}`
			);
			await step(
				'Cluster running on 127.0.0.1',
				async () => {
					if (pgCluster.isRunning(bin, dir)) return 'already running';
					await pgCluster.start(bin, dir);
					state.startedPostgres = true;
					saveState(state);
					return 'started';
				},
				(how) => `port ${new URL(env.DATABASE_URL!).port}, ${how}`
			);
			await step(
				`Database ${p.database}`,
				() => pgCluster.ensureDatabase(p.database, { fresh: opts.freshDatabase }),
				(r) => (opts.freshDatabase ? 'created fresh' : r)
			);
		}
		await step(
			'Migrations from drizzle/',
			() => migrateDatabase(env.DATABASE_URL!),
			() => 'applied'
		);
		if (process.env.NODE_ENV !== 'production') {
			await step(
				'Demo workshop',
				async () => {
					const database = connect(env.DATABASE_URL!);
					try {
						return await seedDemo(database);
					} finally {
						await database.$client.end();
					}
				},
				(r) =>
					r.workshopCreated || r.buildsCreated || r.usersCreated
						? `seeded (${r.buildsCreated} builds, ${r.usersCreated} users)`
						: 'already there'
			);
		}
		if (real.mail) {
			delete env.MAILBOX_URL;
			delete env.PW_MAIL_FAKE;
			env.SMTP_URL = process.env.SMTP_URL!;
		}
		if (real.storage) {
			for (const k of ['S3_ENDPOINT', 'S3_BUCKET', 'S3_ACCESS_KEY_ID', 'S3_SECRET_ACCESS_KEY']) {
				if (process.env[k]) env[k] = process.env[k]!;
				else delete env[k];
			}
		}
		const fakes = { mail: !real.mail, storage: !real.storage };
		if (fakes.mail || fakes.storage) {
			closeFakes = await step(
				'Local fakes',
				() => startFakes(p, fakes),
				() =>
					[fakes.mail && `SMTP 127.0.0.1:${p.smtpPort} (messages at ${env.MAILBOX_URL})`, fakes.storage && `S3 ${env.S3_ENDPOINT}`]
						.filter(Boolean)
						.join(', ')
			);
		}
	} catch (err) {
		await shutdown();
		throw err;
	}
	saveState(state);

	return {
		env,
		shutdown,
		/** Records a child process so that `npm run stop` can end it even if this process is killed. */
		track(child: ChildProcess) {
			if (child.pid) state.children.push(child.pid);
			saveState(state);
		}
	};
}
