// npm run db:restore -- <file>: puts a db:backup file back into DATABASE_URL (or the local
// database), replacing what is there. Stop the app first.
import { existsSync } from 'node:fs';
import { restore, withDatabase } from './backup';

const file = process.argv.slice(2).find((a) => !a.startsWith('-'));
if (!file || !existsSync(file)) {
	console.error(file ? `No such backup file: ${file}` : 'Name the backup to restore: npm run db:restore -- .data/backups/<file>.dump');
	process.exit(2);
}
await withDatabase((url, bin) => restore(url, bin, file));
console.log(`restored ${file}`);
