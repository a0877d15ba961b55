import { unprintable } from '$lib/schemas/text';
import type { Message } from './mail';

// The wording of every e-mail the app sends, in one place. Plain text first: workshop inboxes
// are often read on a phone, and a cutting shop's mail filter trusts plain text.

// Names come from users (a person, a workshop, a build, a design): in a message they are data, never
// our wording. Each is shown on one line, between quotation marks, cut to a length, with anything
// that could start a line or reorder the text replaced (rows written before names were checked,
// too); the schemas refuse those characters on the way in (src/lib/schemas/text.ts).
const nameLength = 80;
const unprintableAll = new RegExp(unprintable.source, 'gu');

/** A user-given name as quoted data: “name”, one line, at most 80 characters. */
export function quoted(name: string): string {
	const line = name.replace(unprintableAll, ' ').replace(/\s+/g, ' ').trim();
	const cut = [...line].length > nameLength ? `${[...line].slice(0, nameLength - 1).join('')}…` : line;
	return `“${cut}”`;
}

/** User-given free text (a package's notes) as a quoted block: every line starts with "> ", so none can pass for ours. */
export function quotedBlock(text: string): string {
	return text
		.replace(/\r\n?/g, '\n')
		.split('\n')
		.map((line) => `> ${line.replace(unprintableAll, ' ')}`.trimEnd())
		.join('\n');
}

const footer =
	'\n\n-- \nPhasewright: trigger wheels, degree tapes and timing for ECU conversions.\nIf you did not ask for this, ignore this message; nothing changes.';

export function signInLinkMessage(to: string, url: string): Message {
	return {
		to,
		subject: 'Your Phasewright sign-in link',
		text: `Open this link to sign in to Phasewright:\n\n${url}\n\nThe link works once, for 30 minutes.${footer}`
	};
}

export function passwordResetMessage(to: string, url: string): Message {
	return {
		to,
		subject: 'Reset your Phasewright password',
		text: `Someone (hopefully you) asked to reset the password of this Phasewright account.\n\nChoose a new password here:\n\n${url}\n\nThe link works once, for 1 hour.${footer}`
	};
}

export function accountExistsMessage(to: string, signInUrl: string): Message {
	return {
		to,
		subject: 'You already have a Phasewright account',
		text: `Someone tried to create a Phasewright account with this address, which already has one.\n\nSign in, or reset the password, here:\n\n${signInUrl}${footer}`
	};
}

export function invitationMessage(input: { to: string; workshop: string; inviter: string | null; role: string; url: string }): Message {
	const who = input.inviter ? `A Phasewright user named ${quoted(input.inviter)} invites you` : 'You are invited';
	return {
		to: input.to,
		subject: `Invitation to the workshop ${quoted(input.workshop)} on Phasewright`,
		text: `${who} to join the workshop ${quoted(input.workshop)} on Phasewright as ${input.role}.\n\nAccept here (sign in or create an account with this address, ${input.to}):\n\n${input.url}\n\nThe link works once, for 7 days.${footer}`
	};
}

export interface CuttingOrder {
	to: string;
	from: string | null;
	buildName: string;
	designName: string;
	revision: number;
	quantity: number;
	material: string;
	thickness: string;
	notes: string;
	finish?: string;
	attachments: { filename: string; content: Buffer; contentType: string }[];
}

const cuttingOrderSubject = (input: CuttingOrder) =>
	`Cutting order: ${quoted(input.designName)} revision ${input.revision} (${input.quantity} off, ${input.material} ${input.thickness})`;

const cuttingOrderText = (input: CuttingOrder) =>
	`Hello,\n\nplease quote for / cut the trigger wheel attached${input.from ? ` (sent by ${input.from})` : ''}:\n\n  Build: ${quoted(input.buildName)}\n  Part: ${quoted(input.designName)}, revision ${input.revision}\n  Quantity: ${input.quantity}\n  Material: ${input.material}, ${input.thickness}\n${input.finish ? `  Finish: ${quoted(input.finish)}\n` : ''}${input.notes ? `\nNotes from the sender:\n${quotedBlock(input.notes)}\n` : ''}\nAttached: the DXF (CUT and ETCH layers, units in the file) and the shop drawing (dimensions, fits, tolerances).\n\n-- \nSent from Phasewright (trigger wheels, degree tapes and timing for ECU conversions).`;

export function cuttingPackageMessage(input: CuttingOrder): Message {
	return {
		to: input.to,
		replyTo: input.from ?? undefined,
		subject: cuttingOrderSubject(input),
		text: cuttingOrderText(input),
		attachments: input.attachments
	};
}

export function confirmAddressMessage(to: string, url: string): Message {
	return {
		to,
		subject: 'Confirm your Phasewright address',
		text: `A Phasewright account was created with this address. Open this link to confirm that the address is yours and to sign in:\n\n${url}\n\nOpen it in the browser you signed up with and the password you chose stays. Opened anywhere else, the link still confirms the address and signs you in there, but removes the password set at sign-up and signs out every other browser: if you did not create this account, that is what keeps whoever did out. You can set a new password afterwards with "Forgot the password?" on the sign-in page.\n\nUntil the address is confirmed, the account cannot join workshops. The link works once, for 30 minutes.${footer}`
	};
}

/**
 * The sender's copy of a cutting order: what the fabricator received, word for word and with the
 * same files, under a line saying where it went and a link back to the build.
 */
export function cuttingPackageCopyMessage(order: CuttingOrder, copy: { to: string; buildUrl: string }): Message {
	return {
		to: copy.to,
		subject: `Copy: ${cuttingOrderSubject(order)}`,
		text: `Your cutting package went to ${order.to}. This is a copy of what they received; the build is at\n\n${copy.buildUrl}\n\n-- Copy --\n\n${cuttingOrderText(order)}`,
		attachments: order.attachments
	};
}
