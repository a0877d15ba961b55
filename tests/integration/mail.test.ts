import { randomUUID } from 'node:crypto';
import { describe, expect, it } from 'vitest';
import { sendMail } from '../../src/lib/server/mail';
import type { MailboxMessage } from '../../src/lib/server/mailbox';

async function waitForMessage(to: string): Promise<MailboxMessage> {
	for (let i = 0; i < 50; i++) {
		const res = await fetch(`${process.env.MAILBOX_URL}/messages?to=${encodeURIComponent(to)}`);
		const list = (await res.json()) as MailboxMessage[];
		if (list[0]) return list[0];
		await new Promise((r) => setTimeout(r, 100));
	}
	throw new Error(`no message for ${to} reached the SMTP fake`);
}

describe('mail through Nodemailer to the SMTP fake', () => {
	it('delivers a message with its attachment, and the fake keeps it', async () => {
		const to = `fabricator-${randomUUID()}@example.test`;
		const id = await sendMail({
			to,
			subject: 'Cutting order: 36-1 wheel, rev 3',
			text: 'Please cut 2 off in 3 mm mild steel.',
			attachments: [{ filename: 'wheel-36-1.dxf', content: '0\nSECTION\n', contentType: 'application/dxf' }]
		});
		expect(id).toMatch(/@/);

		const message = await waitForMessage(to);
		expect(message.subject).toBe('Cutting order: 36-1 wheel, rev 3');
		expect(message.text.trim()).toBe('Please cut 2 off in 3 mm mild steel.');
		expect(message.from).toMatch(/@/);
		expect(message.attachments).toEqual([expect.objectContaining({ filename: 'wheel-36-1.dxf', size: 10 })]);

		const full = (await (await fetch(`${process.env.MAILBOX_URL}/messages/${message.id}`)).json()) as {
			attachments: { contentBase64: string }[];
		};
		expect(Buffer.from(full.attachments[0]!.contentBase64, 'base64').toString()).toBe('0\nSECTION\n');
	});
});
