import nodemailer, { type Transporter } from 'nodemailer';
import type Mail from 'nodemailer/lib/mailer';
import { config } from './config';
import { onShutdown } from './shutdown';

let transport: Transporter | undefined;

function mailer(): Transporter {
	if (!transport) {
		const made = nodemailer.createTransport(config().smtpUrl);
		// After the mail queue has drained (shutdown.ts counts its jobs as work in flight).
		onShutdown('mail transport', () => made.close());
		transport = made;
	}
	return transport;
}

export type Message = Pick<Mail.Options, 'to' | 'cc' | 'subject' | 'text' | 'html' | 'attachments' | 'replyTo'>;

/** Sends one message from the configured sender; resolves with the SMTP message id. */
export async function sendMail(message: Message): Promise<string> {
	const info = await mailer().sendMail({ from: config().mailFrom, ...message });
	return info.messageId;
}
