import { config } from './config';

/** A message as the local SMTP fake lists it (scripts/fakes/mailbox.ts). */
export interface MailboxMessage {
	id: string;
	receivedAt: string;
	from: string;
	to: string[];
	subject: string;
	text: string;
	html: string | null;
	attachments: { filename: string; contentType: string; size: number }[];
}

/** The local SMTP fake's address, or undefined where there is none (production). */
export function mailboxUrl(): string | undefined {
	return config().mailboxUrl;
}

export async function listMailbox(fetcher: typeof fetch = fetch): Promise<MailboxMessage[]> {
	const base = mailboxUrl();
	if (!base) return [];
	const res = await fetcher(`${base}/messages`);
	if (!res.ok) throw new Error(`mailbox answered ${res.status}`);
	return (await res.json()) as MailboxMessage[];
}
