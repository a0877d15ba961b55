import type { RequestEvent } from '@sveltejs/kit';
import { config } from './config';
import { clientAddress, isLoopback } from './origin';

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

/**
 * Whether the local mailbox may be shown: it holds every sign-in and reset link the app sent.
 * Only where the scripts run the SMTP fake (PW_MAIL_FAKE and MAILBOX_URL, which they drop when
 * SMTP_URL is a real server, and an SMTP_URL on loopback), only to a browser on this machine, and
 * only under the configured host name (a rebound DNS name is another site).
 */
export function mailboxOpen(
	c: { mailboxUrl?: string; mailFake: boolean; smtpUrl: string; origin: string },
	request: { client: string; host: string | null }
): boolean {
	if (!c.mailboxUrl || !c.mailFake) return false;
	const smtpHost = new URL(c.smtpUrl).hostname.replace(/^\[|\]$/g, '');
	if (!isLoopback(smtpHost) && smtpHost !== 'localhost') return false;
	return isLoopback(request.client) && request.host?.toLowerCase() === new URL(c.origin).host;
}

/** The local SMTP fake's address when this request may see the mailbox, else undefined. */
export function mailboxUrl(event: RequestEvent): string | undefined {
	const c = config();
	return mailboxOpen(c, { client: clientAddress(event), host: event.request.headers.get('host') }) ? c.mailboxUrl : undefined;
}

export async function listMailbox(base: string, fetcher: typeof fetch = fetch): Promise<MailboxMessage[]> {
	const res = await fetcher(`${base}/messages`);
	if (!res.ok) throw new Error(`mailbox answered ${res.status}`);
	return (await res.json()) as MailboxMessage[];
}

/** One attachment of one message, or null when there is no such message or attachment. */
export async function mailboxAttachment(base: string, id: string, index: number, fetcher: typeof fetch = fetch) {
	if (!/^[\w-]{1,64}$/.test(id)) return null;
	const res = await fetcher(`${base}/messages/${id}`);
	if (res.status === 404) return null;
	if (!res.ok) throw new Error(`mailbox answered ${res.status}`);
	const message = (await res.json()) as { attachments: { filename: string; contentType: string; contentBase64: string }[] };
	const found = message.attachments[index];
	return found ? { filename: found.filename, contentType: found.contentType, bytes: Buffer.from(found.contentBase64, 'base64') } : null;
}
