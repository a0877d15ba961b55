import { databaseState, db, type Database } from './db';

/** What GET /api/health answers: 200 while the database answers, 503 while it does not. */
export async function healthReport(database: Database = db()) {
	const state = await databaseState(database);
	if (state.state === 'down') console.warn(`health: database down (${state.error})`);
	return {
		status: state.state === 'up' ? 200 : 503,
		body: {
			status: state.state === 'up' ? 'ok' : 'unavailable',
			database: state.state === 'up' ? { state: 'up', latencyMs: state.latencyMs } : { state: 'down' },
			checkedAt: new Date().toISOString()
		}
	};
}
