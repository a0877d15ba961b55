// Applies the committed migrations in drizzle/. Also `npm run db:migrate` (DATABASE_URL from the environment).
import { join } from 'node:path';
import { migrate } from 'drizzle-orm/node-postgres/migrator';
import { connect } from '../src/lib/server/db';
import { root } from './profile';

export const migrationsFolder = join(root, 'drizzle');

export async function migrateDatabase(url: string) {
	const database = connect(url);
	try {
		await migrate(database, { migrationsFolder });
	} finally {
		await database.$client.end();
	}
}

if (import.meta.filename === process.argv[1]) {
	const url = process.env.DATABASE_URL;
	if (!url) {
		console.error('DATABASE_URL is not set: give the address of the database to migrate.');
		process.exit(2);
	}
	await migrateDatabase(url);
	console.log('migrations applied');
}
