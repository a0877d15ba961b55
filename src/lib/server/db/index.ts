import { sql } from 'drizzle-orm';
import { drizzle, type NodePgDatabase } from 'drizzle-orm/node-postgres';
import pg from 'pg';
import { config } from '../config';
import { onShutdown } from '../shutdown';
import * as schema from './schema';

export type Database = NodePgDatabase<typeof schema> & { $client: pg.Pool };
export type Transaction = Parameters<Parameters<Database['transaction']>[0]>[0];
/** Either the pool or an open transaction: what query helpers take, so callers can compose them. */
export type Queryable = Database | Transaction;

/** A pool and its Drizzle handle. Scripts and tests call this with their own address. */
export function connect(url: string, max = 10): Database {
	const pool = new pg.Pool({
		connectionString: url,
		max,
		// Fail fast while the database is down, so pages can answer 503 instead of hanging.
		connectionTimeoutMillis: 3_000,
		idleTimeoutMillis: 30_000,
		// Idle connections must not hold the process open when the server is asked to stop.
		allowExitOnIdle: true
	});
	// An idle client losing its server (a restart, a failover) must not take the process down;
	// the pool drops that client and the next query opens a fresh one.
	pool.on('error', (err) => console.warn(`database: idle connection lost (${err.message})`));
	// A client checked out between two statements (inside a transaction) has no listener from the
	// pool: its server going away then raised an unhandled 'error' and ended the process (seen when
	// faults.test.ts stops PostgreSQL mid-run). Its next statement fails instead, and answers 503.
	pool.on('connect', (client) => client.on('error', (err) => console.warn(`database: connection lost while in use (${err.message})`)));
	return drizzle(pool, { schema });
}

let shared: Database | undefined;

/** The app's own database handle, opened on first use. */
export function db(): Database {
	if (!shared) {
		const database = connect(config().databaseUrl, config().databasePoolMax);
		// Ended once the server has stopped taking requests and the work in flight is done (shutdown.ts).
		onShutdown('database pool', () => database.$client.end());
		shared = database;
	}
	return shared;
}

export type DatabaseState = { state: 'up'; latencyMs: number } | { state: 'down'; error: string };

export async function databaseState(database: Database = db()): Promise<DatabaseState> {
	const started = performance.now();
	try {
		await database.execute(sql`select 1`);
		return { state: 'up', latencyMs: Math.round((performance.now() - started) * 10) / 10 };
	} catch (err) {
		// Drizzle wraps the driver's error; the cause says what actually went wrong.
		const cause = err instanceof Error && err.cause instanceof Error ? err.cause : err;
		return { state: 'down', error: cause instanceof Error ? cause.message : String(cause) };
	}
}
