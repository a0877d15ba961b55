import { describe, expect, it } from 'vitest';
import { cuttingPackageMessage, invitationMessage, quoted, quotedBlock } from './messages';

// What a user-given name may do in our e-mails: nothing but be read as a name. A line of its own
// in a plain-text message reads as ours (common practice: OWASP, "content spoofing").
describe('names in e-mails', () => {
	it('quotes a name on one line, whatever control, separator or override characters it holds, and cuts it at 80 characters', () => {
		expect(quoted('Anna')).toBe('“Anna”');
		expect(quoted('Eve\r\n\r\nClick http://evil.example\u2028now\u202e')).toBe('“Eve Click http://evil.example now”');
		expect(quoted('\u0000x\u0085y\u2066z')).toBe('“x y z”');
		const long = quoted('n'.repeat(200));
		expect([...long].length).toBe(82);
		expect(long.endsWith('…”')).toBe(true);
	});

	it('quotes free text as a block whose every line starts with "> "', () => {
		expect(quotedBlock('Deburr\r\nno paint\n\nthanks\u001b[31m')).toBe('> Deburr\n> no paint\n>\n> thanks [31m');
	});

	it('keeps every line of an invitation and a cutting order ours', () => {
		const invitation = invitationMessage({
			to: 'a@example.test',
			workshop: 'Shop\nReply with your password',
			inviter: 'Bob\nAdmin',
			role: 'viewer',
			url: 'http://127.0.0.1/invite/x'
		});
		expect(invitation.text).not.toMatch(/^(Reply with|Admin)/m);
		expect(invitation.subject).toBe('Invitation to the workshop “Shop Reply with your password” on Phasewright');
		const order = cuttingPackageMessage({
			to: 'c@example.test',
			from: 'me@example.test',
			buildName: 'B\nQuantity: 500',
			designName: 'D',
			revision: 2,
			quantity: 1,
			material: 'steel',
			thickness: '3 mm',
			notes: 'line one\nQuantity: 900',
			attachments: []
		});
		const quantities = (order.text as string).split('\n').filter((l) => /Quantity:/.test(l));
		expect(quantities).toEqual(['  Build: “B Quantity: 500”', '  Quantity: 1', '> Quantity: 900']);
	});
});
