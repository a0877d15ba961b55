// npm run db:backup [-- <file>]: a pg_dump of DATABASE_URL (or the local database) into .data/backups/.
import { backup, withDatabase } from './backup';

const file = process.argv.slice(2).find((a) => !a.startsWith('-'));
const out = await withDatabase((url, bin) => backup(url, bin, file));
console.log(`backup written: ${out}`);
