import { join } from 'node:path';
import { dataDir, type Profile } from '../profile';
import { startMailbox } from './mailbox';
import { startObjectStore } from './objectstore';

/** Starts the SMTP fake and the S3-compatible fake of a profile; resolves to one closer for both. */
export async function startFakes(p: Profile, which: { mail: boolean; storage: boolean }) {
	const closers: (() => Promise<void>)[] = [];
	if (which.mail) {
		const mailbox = await startMailbox({ smtpPort: p.smtpPort, httpPort: p.mailboxPort, dir: join(dataDir, `mail-${p.name}`) });
		closers.push(mailbox.close);
	}
	if (which.storage) {
		const store = await startObjectStore({ port: p.s3Port, dir: join(dataDir, `s3-${p.name}`), bucket: p.bucket });
		closers.push(store.close);
	}
	return async () => {
		await Promise.allSettled(closers.map((c) => c()));
	};
}
