// The local SMTP fake: accepts every message on loopback, keeps it (in memory and as JSON under
// .data/), and lists them over HTTP for the app's dev-only mailbox page and for the tests.
//   GET    /messages            newest first; ?to=<address> filters by recipient
//   GET    /messages/<id>       one message, attachments base64-encoded
//   DELETE /messages            forgets them all
import { createServer, type Server } from 'node:http';
import { mkdirSync, readdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { simpleParser, type AddressObject } from 'mailparser';
import { SMTPServer } from 'smtp-server';

export interface StoredMessage {
	id: string;
	receivedAt: string;
	from: string;
	to: string[];
	subject: string;
	text: string;
	html: string | null;
	attachments: { filename: string; contentType: string; size: number; contentBase64: string }[];
}

const addresses = (a: AddressObject | AddressObject[] | undefined) =>
	(Array.isArray(a) ? a : a ? [a] : []).flatMap((o) => o.value.map((v) => v.address ?? '')).filter(Boolean);

export async function startMailbox(opts: { smtpPort: number; httpPort: number; dir: string }) {
	mkdirSync(opts.dir, { recursive: true });
	const messages: StoredMessage[] = readdirSync(opts.dir)
		.filter((f) => f.endsWith('.json'))
		.map((f) => JSON.parse(readFileSync(join(opts.dir, f), 'utf8')) as StoredMessage);
	let counter = messages.length;

	const smtp = new SMTPServer({
		authOptional: true,
		disabledCommands: ['STARTTLS'],
		logger: false,
		size: 25 * 1024 * 1024,
		onData(stream, session, callback) {
			simpleParser(stream)
				.then((mail) => {
					const id = `${Date.now().toString(36)}-${(++counter).toString(36)}`;
					const message: StoredMessage = {
						id,
						receivedAt: new Date().toISOString(),
						from: addresses(mail.from)[0] ?? session.envelope.mailFrom?.toString() ?? '',
						to: session.envelope.rcptTo.map((r) => r.address),
						subject: mail.subject ?? '',
						text: mail.text ?? '',
						html: typeof mail.html === 'string' ? mail.html : null,
						attachments: mail.attachments.map((a) => ({
							filename: a.filename ?? 'attachment',
							contentType: a.contentType,
							size: a.size,
							contentBase64: a.content.toString('base64')
						}))
					};
					messages.push(message);
					writeFileSync(join(opts.dir, `${id}.json`), JSON.stringify(message));
					callback();
				})
				.catch((err: Error) => callback(err));
		}
	});

	const http: Server = createServer((req, res) => {
		const url = new URL(req.url ?? '/', 'http://mailbox');
		const send = (status: number, body: unknown) => {
			res.writeHead(status, { 'content-type': 'application/json' });
			res.end(JSON.stringify(body));
		};
		if (url.pathname === '/messages' && req.method === 'GET') {
			const to = url.searchParams.get('to')?.toLowerCase();
			const list = messages
				.filter((m) => !to || m.to.some((t) => t.toLowerCase() === to))
				.toReversed()
				.map(({ attachments, ...m }) => ({ ...m, attachments: attachments.map(({ contentBase64, ...a }) => a) }));
			return send(200, list);
		}
		if (url.pathname === '/messages' && req.method === 'DELETE') {
			messages.length = 0;
			rmSync(opts.dir, { recursive: true, force: true });
			mkdirSync(opts.dir, { recursive: true });
			return send(200, { deleted: true });
		}
		const one = /^\/messages\/([\w-]+)$/.exec(url.pathname);
		if (one && req.method === 'GET') {
			const m = messages.find((x) => x.id === one[1]);
			return m ? send(200, m) : send(404, { error: 'no such message' });
		}
		send(404, { error: 'not found' });
	});

	await new Promise<void>((resolve, reject) => {
		smtp.once('error', reject);
		smtp.listen(opts.smtpPort, '127.0.0.1', () => resolve());
	});
	await new Promise<void>((resolve, reject) => {
		http.once('error', reject);
		http.listen(opts.httpPort, '127.0.0.1', () => resolve());
	});

	return {
		async close() {
			await new Promise<void>((r) => smtp.close(() => r()));
			await new Promise<void>((r) => http.close(() => r()));
		}
	};
}
