// Integration tests talk to the real PostgreSQL, SMTP fake, S3 fake and built server that
// `npm test` starts. Without them they must fail, not pass quietly or skip.
const needed = ['DATABASE_URL', 'SMTP_URL', 'MAILBOX_URL', 'S3_ENDPOINT', 'S3_BUCKET', 'APP_URL'];
const missing = needed.filter((k) => !process.env[k]);
if (missing.length) {
	throw new Error(`Integration tests need the local stack (missing ${missing.join(', ')}). Run them with \`npm test\`.`);
}
