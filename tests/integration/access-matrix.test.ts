// The access matrix: every page with a server load, every form action and every API route (each
// method), tried by five callers on one workshop holding one object of each kind. The expected
// answer of each is written in the table below; the loop reports every cell that differs.
//
// The rules the table follows (common practice, after OWASP's Authorization cheat sheet and
// RFC 9110 for the status codes):
// - signed out: the API answers 401, pages and form actions send to /signin (303);
// - a role too low for the action: 403 (the caller is in the workshop, so nothing is revealed);
// - another workshop's owner, a made-up id and another workshop's id: 404, never 403, and the
//   answer carries no name of the other workshop's objects;
// - a refused write changes nothing (every row of both workshops and the object store compared
//   before and after), and a GET never changes anything (RFC 9110 9.2.1, safe methods).
import { randomUUID } from 'node:crypto';
import { readdirSync, readFileSync, statSync } from 'node:fs';
import { join, relative, sep } from 'node:path';
import sharp from 'sharp';
import { sql } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { connect } from '../../src/lib/server/db';
import { syntheticWheelPhoto } from '$support/synthetic-photos';
import { listKeys } from '../../src/lib/server/storage';
import { Client, freshEmail, mailTo, signUp } from '../support/client';

const database = connect(process.env.DATABASE_URL!);
afterAll(() => database.$client.end());

const roles = ['anonymous', 'viewer', 'editor', 'owner', 'stranger'] as const;
type Role = (typeof roles)[number];

/** One row's expected statuses, in the table's column order. */
const e = (anonymous: number, viewer: number, editor: number, owner: number, stranger: number): Record<Role, number> => ({
	anonymous,
	viewer,
	editor,
	owner,
	stranger
});

/** One workshop's objects, one of each kind. */
interface Ids {
	workshop: string;
	build: string;
	design: string;
	tdc: string;
	tape: string;
	/** A signal check kept in the build. */
	signal: string;
	photo: string;
	/** A cutting package sent from the build. */
	package: string;
	invitation: string;
	token: string;
	/** A member who is neither the caller nor the workshop's only owner. */
	member: string;
}
type IdKind = 'workshop' | 'build' | 'design' | 'tdc' | 'tape' | 'signal' | 'photo' | 'package' | 'invitation' | 'member';

interface Answer {
	status: number;
	location: string | null;
	body: string;
}

interface Row {
	route: string;
	note?: string;
	/** What the row reaches. */
	object: string;
	expect: Record<Role, number>;
	call: (client: Client, ids: Ids, as: Role) => Promise<Answer>;
	/** Destructive rows act on a throwaway object made for each caller. */
	fresh?: (ids: Ids) => Promise<Partial<Ids>>;
	/** An allowed read shows this (so the leak check below is one that can fail). */
	shows?: (ids: Ids) => string;
	/** A GET that is logged in the build's activity when allowed (issue 16: the build sheet's download is its issue). */
	logsRead?: true;
	/** The ids a guess replaces, with the status a guessed id gets (404 unless said). */
	guess?: IdKind[];
	guessed?: number;
	/** The status of a malformed id ('not-a-uuid') where it is not 404 (in a path): 400 for a checked field. */
	malformed?: Partial<Record<IdKind, number>>;
	/** 303 answers to signed-in callers go here; signed-out ones to /signin unless `anonymousTo`. */
	to?: string;
	anonymousTo?: string;
	/** Why this row may show another workshop's names to a stranger. */
	openLink?: string;
	/** Allowed for these roles, but must still change nothing. */
	changesNothingFor?: Role[];
}

// ---- Calls ----

const textOf = async (res: Response): Promise<Answer> => ({
	status: res.status,
	location: res.headers.get('location'),
	body: await res.text()
});
const page = async (c: Client, path: string) => textOf(await c.get(path, { accept: 'text/html' }));
const getApi = async (c: Client, path: string) => textOf(await c.get(path, { accept: 'application/json' }));
async function send(c: Client, method: 'POST' | 'PUT' | 'PATCH' | 'DELETE', path: string, body?: unknown): Promise<Answer> {
	const res = await c.send(method, path, body);
	return { status: res.status, location: null, body: typeof res.body === 'string' ? res.body : JSON.stringify(res.body) };
}
async function act(c: Client, path: string, name: string, fields: Record<string, string>): Promise<Answer> {
	const res = await c.action(path, name, fields);
	return { status: res.status, location: res.location ?? null, body: JSON.stringify({ data: res.data, error: res.error }) };
}

let counter = 0;
const unique = (label: string) => `${label} ${Date.now().toString(36)}-${counter++}`;

const wheel = { units: 'mm', teeth: '36', missing: '1', od: '100', depth: '5', thickness: '3', bore: '20' };
const engine = { teeth: '36', missing: '1', toothAtTdc: '9', layout: 'twin-270', rpm: '9000' };
const signalParams = { teeth: '36', missing: '1', toothAtTdc: '9', layout: 'twin-270' };
const wheelQuery = new URLSearchParams(wheel).toString();

async function head(designId: string) {
	if (!/^[0-9a-f-]{36}$/.test(designId)) return 1;
	const { rows } = await database.execute<{ n: number | null }>(
		sql`select max(number)::int as n from wheel_revision where design_id = ${designId}`
	);
	return rows[0]!.n ?? 1;
}

async function userIdOf(email: string) {
	const { rows } = await database.execute<{ id: string }>(sql`select id from "user" where email = ${email}`);
	return rows[0]!.id;
}

async function smallPng(shade = 128) {
	return sharp({ create: { width: 16, height: 12, channels: 3, background: { r: shade, g: shade, b: shade } } })
		.png()
		.toBuffer();
}

function photoForm(bytes: Uint8Array, name: string) {
	const form = new FormData();
	form.append('file', new Blob([new Uint8Array(bytes)], { type: 'image/png' }), name);
	return form;
}

// ---- The two workshops ----

interface Shop {
	owner: Client;
	ownerEmail: string;
	ids: Ids;
	/** Names and addresses of this workshop's objects: none may reach the other workshop's callers. */
	secrets: string[];
	names: { workshop: string; build: string; design: string; photo: string; fabricator: string; invitee: string };
}

let a: Shop;
let b: Shop;
const clients = {} as Record<Role, Client>;
const emails = {} as Record<Role, string>;

/** Another browser of the same person (all the table's people have the default password). */
async function secondSession(as: Role): Promise<Client> {
	const client = new Client();
	if (as === 'anonymous') return client;
	const result = await client.action('/signin', 'password', { email: emails[as], password: 'long enough password' });
	if (result.type !== 'redirect') throw new Error(`second sign-in of ${as} failed: ${JSON.stringify(result)}`);
	return client;
}
let taps: { centre: { x: number; y: number }; tips: { x: number; y: number }[] };

/** Invites a new account into the owner's current workshop at a role and accepts as it. */
async function joinAs(owner: Client, role: 'viewer' | 'editor', name: string) {
	const email = freshEmail(name.toLowerCase().replace(/\W+/g, '-'));
	const sent = await owner.action('/workshop', 'invite', { email, role });
	if (sent.type !== 'success') throw new Error(`invitation of ${email} failed: ${JSON.stringify(sent)}`);
	const mail = await mailTo(email, 'Invitation');
	const client = await signUp(name, email);
	const accepted = await client.action(new URL(mail.link).pathname, '', {});
	if (accepted.type !== 'redirect') throw new Error(`acceptance by ${email} failed: ${JSON.stringify(accepted)}`);
	return { client, email };
}

/** A pending invitation of the owner's current workshop: its id and its token (from the e-mail). */
async function pendingInvitation(owner: Client, label: string) {
	const email = freshEmail(label);
	const sent = await owner.action('/workshop', 'invite', { email, role: 'viewer' });
	if (sent.type !== 'success') throw new Error(`invitation of ${email} failed: ${JSON.stringify(sent)}`);
	const mail = await mailTo(email, 'Invitation');
	const { rows } = await database.execute<{ id: string }>(sql`select id from invitation where email = ${email}`);
	return { id: rows[0]!.id, token: new URL(mail.link).pathname.split('/').pop()!, email };
}

async function created<T extends { id: string }>(
	answer: Promise<{ status: number; body: T | Record<string, unknown> }>,
	what: string
): Promise<string> {
	const res = await answer;
	if (res.status !== 201) throw new Error(`${what}: ${res.status} ${JSON.stringify(res.body)}`);
	return String((res.body as { id?: string; photos?: { id: string }[] }).id ?? (res.body as { photos: { id: string }[] }).photos[0]!.id);
}

async function shop(word: string, photo: { bytes: Uint8Array }): Promise<Shop> {
	const tag = Date.now().toString(36);
	const ownerName = `${word} owner ${tag}`;
	const ownerEmail = freshEmail(`${word.toLowerCase()}-owner`);
	const owner = await signUp(ownerName, ownerEmail);
	const workshop = (await owner.json<{ workshop: { id: string; name: string } }>('/api/v1/builds')).body.workshop;
	const names = {
		workshop: workshop.name,
		build: `${word} build ${tag}`,
		design: `${word} wheel ${tag}`,
		photo: `${word.toLowerCase()}-photo-${tag}.png`,
		fabricator: freshEmail(`${word.toLowerCase()}-fabricator`),
		invitee: ''
	};
	const build = await created(
		owner.send<{ id: string }>('POST', `/api/v1/builds?workshop=${workshop.id}`, { name: names.build, engine: `${word} engine ${tag}` }),
		'build'
	);
	expect((await owner.send('PUT', `/api/v1/builds/${build}/engine`, { params: engine })).status).toBe(200);
	const design = await created(
		owner.send<{ id: string }>('POST', `/api/v1/builds/${build}/designs`, { name: names.design, params: wheel }),
		'design'
	);
	const tdc = await created(
		owner.send<{ id: string }>('POST', `/api/v1/builds/${build}/tdc-records`, {
			label: `${word} tdc ${tag}`,
			params: { a: '-14', b: '15' }
		}),
		'TDC record'
	);
	const tape = await created(
		owner.send<{ id: string }>('POST', `/api/v1/builds/${build}/tapes`, {
			label: `${word} tape ${tag}`,
			params: { units: 'mm', diameter: '120' }
		}),
		'tape'
	);
	const signal = await created(
		owner.send<{ id: string }>('POST', `/api/v1/builds/${build}/signal-checks`, { label: `${word} signal ${tag}`, params: signalParams }),
		'signal check'
	);
	const photoId = await created(
		owner.send<{ id: string }>('POST', `/api/v1/builds/${build}/photos`, photoForm(photo.bytes, names.photo)),
		'photo'
	);
	const cutting = await created(
		owner.send<{ id: string }>('POST', `/api/v1/builds/${build}/cutting-packages`, { designId: design, to: names.fabricator, quantity: 1 }),
		'cutting package'
	);
	const invitation = await pendingInvitation(owner, `${word.toLowerCase()}-invitee`);
	names.invitee = invitation.email;
	return {
		owner,
		ownerEmail,
		ids: {
			workshop: workshop.id,
			build,
			design,
			tdc,
			tape,
			signal,
			photo: photoId,
			package: cutting,
			invitation: invitation.id,
			token: invitation.token,
			member: await userIdOf(ownerEmail)
		},
		names,
		secrets: [
			names.workshop,
			names.build,
			names.design,
			names.photo,
			names.fabricator,
			names.invitee,
			ownerName,
			ownerEmail,
			`${word} tdc ${tag}`,
			`${word} tape ${tag}`,
			`${word} signal ${tag}`,
			`${word} engine ${tag}`
		]
	};
}

beforeAll(async () => {
	const shot = await syntheticWheelPhoto({ teeth: 36, missing: 1, width: 800, height: 600, rotationDeg: 20, noise: 4, seed: 11 });
	taps = shot.taps;
	a = await shop('Apricot', { bytes: shot.image });
	b = await shop('Bramble', { bytes: await smallPng(90) });
	const viewer = await joinAs(a.owner, 'viewer', `Apricot viewer ${Date.now().toString(36)}`);
	const editor = await joinAs(a.owner, 'editor', `Apricot editor ${Date.now().toString(36)}`);
	// A member the role rows act on, so that no caller's own role changes under the table.
	const spare = await joinAs(a.owner, 'viewer', `Apricot spare ${Date.now().toString(36)}`);
	a.ids.member = await userIdOf(spare.email);
	a.secrets.push(viewer.email, editor.email, spare.email);
	Object.assign(clients, { anonymous: new Client(), viewer: viewer.client, editor: editor.client, owner: a.owner, stranger: b.owner });
	Object.assign(emails, { anonymous: '', viewer: viewer.email, editor: editor.email, owner: a.ownerEmail, stranger: b.ownerEmail });
}, 180_000);

// ---- Throwaway objects for destructive rows (made by A's owner) ----

const fresh = {
	build: async (ids: Ids) => ({
		build: await created(
			a.owner.send<{ id: string }>('POST', `/api/v1/builds?workshop=${ids.workshop}`, { name: unique('Throwaway build') }),
			'throwaway build'
		)
	}),
	tdc: async (ids: Ids) => ({
		tdc: await created(
			a.owner.send<{ id: string }>('POST', `/api/v1/builds/${ids.build}/tdc-records`, { params: { a: '-10', b: '10' } }),
			'throwaway TDC record'
		)
	}),
	tape: async (ids: Ids) => ({
		tape: await created(
			a.owner.send<{ id: string }>('POST', `/api/v1/builds/${ids.build}/tapes`, { params: { units: 'mm', diameter: '90' } }),
			'throwaway tape'
		)
	}),
	signal: async (ids: Ids) => ({
		signal: await created(
			a.owner.send<{ id: string }>('POST', `/api/v1/builds/${ids.build}/signal-checks`, { params: signalParams }),
			'throwaway signal check'
		)
	}),
	photo: async (ids: Ids) => ({
		photo: await created(
			a.owner.send<{ id: string }>('POST', `/api/v1/builds/${ids.build}/photos`, photoForm(await smallPng(200), 'throwaway.png')),
			'throwaway photo'
		)
	}),
	invitation: async () => ({ invitation: (await pendingInvitation(a.owner, 'throwaway-invitee')).id }),
	member: async () => ({ member: await userIdOf((await joinAs(a.owner, 'viewer', unique('Throwaway member'))).email) })
};

// ---- The table ----
// Columns of e(...): anonymous, viewer, editor, owner, stranger (the owner of another workshop).

const publicTool = (route: string, query: string): Row => ({
	route: `GET ${route}`,
	object: 'none (a public tool)',
	expect: e(200, 200, 200, 200, 200),
	call: (c) => getApi(c, `${route}?${query}`)
});

/** A 36-1 edge log of three turns at a steady speed, posted as the signal check page posts it (multipart, field log). */
const edgeLogForm = () => {
	const times = Array.from({ length: 3 * 36 }, (_, k) => k).filter((k) => k % 36 !== 35);
	const form = new FormData();
	form.append('log', new Blob([['time_us', ...times.map((k) => String(1000 + 1000 * k))].join('\n')], { type: 'text/csv' }), 'log.csv');
	return form;
};

const table: Row[] = [
	// Pages
	{ route: 'GET /', object: 'none', expect: e(200, 200, 200, 200, 200), call: (c) => page(c, '/') },
	{ route: 'GET /docs/api', object: 'none (the API page)', expect: e(200, 200, 200, 200, 200), call: (c) => page(c, '/docs/api') },
	{
		route: 'GET /builds',
		object: 'workshop: its builds',
		expect: e(303, 200, 200, 200, 200),
		call: (c) => page(c, '/builds'),
		shows: () => a.names.build
	},
	{
		route: 'GET /builds/[buildId]',
		object: 'build',
		expect: e(303, 200, 200, 200, 404),
		call: (c, i) => page(c, `/builds/${i.build}`),
		shows: () => a.names.design,
		guess: ['build']
	},
	{
		route: 'GET /builds/[buildId]/designs/[designId]',
		object: 'wheel design, revisions',
		expect: e(303, 200, 200, 200, 404),
		call: (c, i) => page(c, `/builds/${i.build}/designs/${i.design}`),
		shows: () => a.names.design,
		guess: ['build', 'design']
	},
	{
		route: 'GET /builds/[buildId]/photos/[photoId]',
		object: 'wheel photo',
		expect: e(303, 200, 200, 200, 404),
		call: (c, i) => page(c, `/builds/${i.build}/photos/${i.photo}`),
		shows: () => a.names.photo,
		guess: ['build', 'photo']
	},
	{
		route: 'GET /workshop',
		object: 'workshop: members, invitations',
		expect: e(303, 200, 200, 200, 200),
		call: (c) => page(c, '/workshop'),
		shows: () => a.names.workshop
	},
	{
		route: 'GET /invite/[token]',
		object: 'invitation',
		expect: e(200, 200, 200, 200, 200),
		call: (c, i) => page(c, `/invite/${i.token}`),
		shows: () => a.names.workshop,
		openLink: 'the invitation link is the capability: whoever holds it sees which workshop invites'
	},
	{
		route: 'GET /reset/[token]',
		object: 'none (a made-up reset token)',
		expect: e(200, 200, 200, 200, 200),
		call: (c) => page(c, `/reset/${randomUUID()}`)
	},
	{ route: 'GET /signin', object: 'none', expect: e(200, 303, 303, 303, 303), call: (c) => page(c, '/signin'), to: '/builds' },
	{ route: 'GET /signup', object: 'none', expect: e(200, 303, 303, 303, 303), call: (c) => page(c, '/signup'), to: '/builds' },
	{ route: 'GET /account', object: 'the caller’s own account', expect: e(303, 200, 200, 200, 200), call: (c) => page(c, '/account') },
	{
		route: 'GET /signout',
		object: 'none',
		expect: e(303, 303, 303, 303, 303),
		call: (c) => page(c, '/signout'),
		to: '/',
		anonymousTo: '/'
	},
	{
		route: 'GET /dev/mail',
		object: 'the local mailbox',
		expect: e(200, 200, 200, 200, 200),
		call: (c) => page(c, '/dev/mail'),
		openLink: 'the local SMTP fake’s mailbox: only while the scripts run the fake, only to loopback under the configured host'
	},
	{
		route: 'GET /dev/mail/[messageId]/[index]',
		note: 'a made-up message',
		object: 'an attachment in the local mailbox',
		expect: e(404, 404, 404, 404, 404),
		call: (c) => page(c, '/dev/mail/no-such-message/0')
	},
	// Pages without a server load that open an object through the API (SvelteKit's fetch, with the session).
	{
		route: 'GET /wheel?design=[designId]',
		object: 'wheel design (the designer)',
		expect: e(200, 200, 200, 200, 200),
		call: (c, i) => page(c, `/wheel?design=${i.design}`),
		shows: () => a.names.design,
		guess: ['design'],
		guessed: 200,
		malformed: { design: 200 }
	},
	{
		route: 'GET /wheel?build=[buildId]',
		object: 'build (the designer)',
		expect: e(200, 200, 200, 200, 200),
		call: (c, i) => page(c, `/wheel?build=${i.build}`),
		shows: () => a.names.build,
		guess: ['build'],
		guessed: 200,
		malformed: { build: 200 }
	},

	// Form actions
	{
		route: 'POST /builds?/create',
		object: 'build (in the caller’s current workshop)',
		expect: e(303, 403, 200, 200, 200),
		call: (c) => act(c, '/builds', 'create', { name: unique('Form build') })
	},
	{
		route: 'POST /builds?/rename',
		object: 'build',
		expect: e(303, 403, 200, 200, 404),
		fresh: fresh.build,
		call: (c, i) => act(c, '/builds', 'rename', { buildId: i.build, name: unique('Renamed') }),
		guess: ['build'],
		malformed: { build: 400 }
	},
	{
		route: 'POST /builds?/delete',
		object: 'build',
		expect: e(303, 403, 200, 200, 404),
		fresh: fresh.build,
		call: (c, i) => act(c, '/builds', 'delete', { buildId: i.build }),
		guess: ['build'],
		malformed: { build: 400 }
	},
	{
		route: 'POST /workshop?/invite',
		note: 'into a workshop named by id',
		object: 'workshop, invitation',
		expect: e(303, 403, 403, 200, 404),
		call: (c, i) => act(c, '/workshop', 'invite', { email: freshEmail('matrix-invitee'), role: 'viewer', workshopId: i.workshop }),
		guess: ['workshop'],
		malformed: { workshop: 400 }
	},
	{
		route: 'POST /workshop?/invite',
		note: 'from a build’s page',
		object: 'build, invitation',
		expect: e(303, 403, 403, 200, 404),
		call: (c, i) => act(c, '/workshop', 'invite', { email: freshEmail('matrix-invitee'), role: 'viewer', buildId: i.build }),
		guess: ['build'],
		malformed: { build: 400 }
	},
	{
		route: 'POST /workshop?/role',
		object: 'member',
		expect: e(303, 403, 403, 200, 404),
		call: (c, i) => act(c, '/workshop', 'role', { userId: i.member, role: 'viewer' }),
		guess: ['member'],
		malformed: { member: 400 }
	},
	{
		route: 'POST /workshop?/remove',
		object: 'member',
		expect: e(303, 403, 403, 200, 404),
		fresh: fresh.member,
		call: (c, i) => act(c, '/workshop', 'remove', { userId: i.member }),
		guess: ['member'],
		malformed: { member: 400 }
	},
	{
		route: 'POST /workshop?/revoke',
		object: 'invitation',
		expect: e(303, 403, 403, 200, 404),
		fresh: fresh.invitation,
		call: (c, i) => act(c, '/workshop', 'revoke', { invitationId: i.invitation }),
		guess: ['invitation'],
		malformed: { invitation: 400 }
	},
	{
		route: 'POST /workshop?/switch',
		object: 'workshop',
		expect: e(303, 303, 303, 303, 404),
		call: (c, i) => act(c, '/workshop', 'switch', { workshopId: i.workshop, redirectTo: '/builds' }),
		to: '/builds',
		guess: ['workshop'],
		malformed: { workshop: 400 }
	},
	// Addressed to nobody here: accepting it is refused to every account (403 wrong-account).
	{
		route: 'POST /invite/[token]',
		object: 'invitation',
		expect: e(303, 403, 403, 403, 403),
		call: (c, i) => act(c, `/invite/${i.token}`, '', {})
	},
	// Account forms: open to all; blank fields, so each answers its 400 and nothing happens.
	{
		route: 'POST /signin?/password',
		object: 'none',
		expect: e(400, 400, 400, 400, 400),
		call: (c) => act(c, '/signin', 'password', { email: '', password: '' })
	},
	{
		route: 'POST /signin?/link',
		object: 'none',
		expect: e(400, 400, 400, 400, 400),
		call: (c) => act(c, '/signin', 'link', { email: '' })
	},
	{
		route: 'POST /signup',
		object: 'none',
		expect: e(400, 400, 400, 400, 400),
		call: (c) => act(c, '/signup', '', { name: '', email: '', password: '' })
	},
	{ route: 'POST /reset', object: 'none', expect: e(400, 400, 400, 400, 400), call: (c) => act(c, '/reset', '', { email: '' }) },
	{
		route: 'POST /reset/[token]',
		object: 'none (a made-up reset token)',
		expect: e(400, 400, 400, 400, 400),
		call: (c) => act(c, `/reset/${randomUUID()}`, '', { password: '', confirm: '' })
	},
	// Sign-out ends the session the cookie names, copies of the cookie included: a second session of the same person signs out.
	{
		route: 'POST /signout',
		object: 'the caller’s session',
		expect: e(303, 303, 303, 303, 303),
		call: async (_c, _i, as) => act(await secondSession(as), '/signout', '', {}),
		to: '/',
		anonymousTo: '/'
	},
	{
		route: 'POST /account?/password',
		note: 'fields left empty',
		object: 'the caller’s own password',
		expect: e(303, 400, 400, 400, 400),
		call: (c) => act(c, '/account', 'password', { current: '', password: '', confirm: '' })
	},
	{
		route: 'POST /account?/confirm',
		note: 'every caller’s address is confirmed',
		object: 'the caller’s own address',
		expect: e(303, 409, 409, 409, 409),
		call: (c) => act(c, '/account', 'confirm', {})
	},

	// API: public tools, the same for everyone
	{
		route: 'GET /api/bench/static',
		object: 'none (the benchmarks’ floor: only in npm run bench’s own build, never in build/)',
		expect: e(404, 404, 404, 404, 404),
		call: (c) => getApi(c, '/api/bench/static?bytes=10')
	},
	{ route: 'GET /api/health', object: 'none', expect: e(200, 200, 200, 200, 200), call: (c) => getApi(c, '/api/health') },
	publicTool('/api/v1/wheel', wheelQuery),
	publicTool('/api/v1/wheel.dxf', wheelQuery),
	publicTool('/api/v1/wheel.svg', wheelQuery),
	publicTool('/api/v1/wheel.pdf', wheelQuery),
	publicTool('/api/v1/tape', 'units=mm&diameter=120'),
	publicTool('/api/v1/tape.pdf', 'units=mm&diameter=120'),
	publicTool('/api/v1/degree-wheel.pdf', 'units=mm&diameter=120&shaft=20'),
	publicTool('/api/v1/wheel.stl', wheelQuery),
	publicTool('/api/v1/signal', new URLSearchParams(engine).toString()),
	publicTool('/api/v1/signal/edges.csv', new URLSearchParams(engine).toString()),
	publicTool('/api/v1/tdc', 'a=-10&b=19'),
	publicTool('/api/v1/timing-card.pdf', new URLSearchParams({ diameter: '150', curve: '1200:10, 3000:20, 6000:32' }).toString()),
	publicTool('/api/v1/phasing', new URLSearchParams(engine).toString()),
	publicTool('/api/v1/build-sheet.pdf', new URLSearchParams({ ...wheel, ...engine, buildName: 'Matrix single' }).toString()),
	{
		route: 'POST /api/v1/signal/log',
		object: 'none (a public tool: reads the posted edge log, stores nothing)',
		expect: e(200, 200, 200, 200, 200),
		call: (c) => send(c, 'POST', '/api/v1/signal/log?teeth=36&missing=1', edgeLogForm())
	},
	publicTool('/api/v1/openapi.json', ''),

	// API: a workshop's builds
	{
		route: 'GET /api/v1/builds',
		object: 'workshop: its builds',
		expect: e(401, 200, 200, 200, 404),
		call: (c, i) => getApi(c, `/api/v1/builds?workshop=${i.workshop}`),
		shows: () => a.names.build,
		guess: ['workshop'],
		malformed: { workshop: 400 }
	},
	{
		route: 'POST /api/v1/builds',
		object: 'workshop: a new build',
		expect: e(401, 403, 201, 201, 404),
		call: (c, i) => send(c, 'POST', `/api/v1/builds?workshop=${i.workshop}`, { name: unique('API build') }),
		guess: ['workshop']
	},
	{
		route: 'GET /api/v1/builds/[buildId]',
		object: 'build and all it holds',
		expect: e(401, 200, 200, 200, 404),
		call: (c, i) => getApi(c, `/api/v1/builds/${i.build}`),
		shows: () => a.names.photo,
		guess: ['build']
	},
	{
		route: 'PATCH /api/v1/builds/[buildId]',
		object: 'build',
		expect: e(401, 403, 200, 200, 404),
		call: (c, i, as) => send(c, 'PATCH', `/api/v1/builds/${i.build}`, { notes: unique(`notes by ${as}`) }),
		guess: ['build']
	},
	{
		route: 'DELETE /api/v1/builds/[buildId]',
		object: 'build',
		expect: e(401, 403, 204, 204, 404),
		fresh: fresh.build,
		call: (c, i) => send(c, 'DELETE', `/api/v1/builds/${i.build}`),
		guess: ['build']
	},
	{
		route: 'GET /api/v1/builds/[buildId]/build-sheet.pdf',
		object: 'build, design, revision, TDC record, tape',
		expect: e(401, 200, 200, 200, 404),
		call: (c, i) => getApi(c, `/api/v1/builds/${i.build}/build-sheet.pdf`),
		logsRead: true,
		guess: ['build']
	},
	{
		route: 'GET /api/v1/builds/[buildId]/cutting-packages',
		object: 'cutting package',
		expect: e(401, 200, 200, 200, 404),
		call: (c, i) => getApi(c, `/api/v1/builds/${i.build}/cutting-packages`),
		shows: () => a.names.fabricator,
		guess: ['build']
	},
	{
		route: 'GET /api/v1/builds/[buildId]/tdc-records',
		object: 'TDC records (a page)',
		expect: e(401, 200, 200, 200, 404),
		call: (c, i) => getApi(c, `/api/v1/builds/${i.build}/tdc-records`),
		// The record's label is made like the build's name, with "tdc" for "build".
		shows: () => a.names.build.replace(' build ', ' tdc '),
		guess: ['build']
	},
	{
		route: 'GET /api/v1/builds/[buildId]/tapes',
		object: 'degree tapes (a page)',
		expect: e(401, 200, 200, 200, 404),
		call: (c, i) => getApi(c, `/api/v1/builds/${i.build}/tapes`),
		guess: ['build']
	},
	{
		route: 'GET /api/v1/builds/[buildId]/signal-checks',
		object: 'signal checks (a page)',
		expect: e(401, 200, 200, 200, 404),
		call: (c, i) => getApi(c, `/api/v1/builds/${i.build}/signal-checks`),
		guess: ['build']
	},
	{
		route: 'GET /api/v1/builds/[buildId]/activity',
		object: 'activity log (a page)',
		expect: e(401, 200, 200, 200, 404),
		call: (c, i) => getApi(c, `/api/v1/builds/${i.build}/activity`),
		shows: () => a.names.build,
		guess: ['build']
	},
	{
		route: 'POST /api/v1/builds/[buildId]/cutting-packages',
		object: 'cutting package of a revision',
		expect: e(401, 403, 201, 201, 404),
		call: (c, i) =>
			send(c, 'POST', `/api/v1/builds/${i.build}/cutting-packages`, {
				designId: i.design,
				to: freshEmail('matrix-fabricator'),
				quantity: 1
			}),
		guess: ['build', 'design'],
		malformed: { design: 400 }
	},
	{
		route: 'GET /api/v1/builds/[buildId]/cutting-packages/drawing.pdf',
		object: 'shop drawing of a revision, previewed before sending',
		expect: e(401, 200, 200, 200, 404),
		call: (c, i) => getApi(c, `/api/v1/builds/${i.build}/cutting-packages/drawing.pdf?designId=${i.design}&quantity=1`),
		guess: ['build', 'design'],
		malformed: { design: 400 }
	},
	{
		route: 'GET /api/v1/builds/[buildId]/cutting-packages/[packageId]/drawing.pdf',
		object: 'shop drawing of a sent cutting package',
		expect: e(401, 200, 200, 200, 404),
		call: (c, i) => getApi(c, `/api/v1/builds/${i.build}/cutting-packages/${i.package}/drawing.pdf`),
		guess: ['build', 'package']
	},
	{
		route: 'GET /api/v1/builds/[buildId]/designs',
		object: 'wheel designs',
		expect: e(401, 200, 200, 200, 404),
		call: (c, i) => getApi(c, `/api/v1/builds/${i.build}/designs`),
		shows: () => a.names.design,
		guess: ['build']
	},
	{
		route: 'POST /api/v1/builds/[buildId]/designs',
		object: 'a new wheel design',
		expect: e(401, 403, 201, 201, 404),
		call: (c, i) => send(c, 'POST', `/api/v1/builds/${i.build}/designs`, { name: unique('API wheel'), params: wheel }),
		guess: ['build']
	},
	{
		route: 'PUT /api/v1/builds/[buildId]/engine',
		object: 'build: engine profile',
		expect: e(401, 403, 200, 200, 404),
		call: (c, i) => send(c, 'PUT', `/api/v1/builds/${i.build}/engine`, { params: engine }),
		guess: ['build']
	},
	{
		route: 'GET /api/v1/builds/[buildId]/photos',
		object: 'wheel photos',
		expect: e(401, 200, 200, 200, 404),
		call: (c, i) => getApi(c, `/api/v1/builds/${i.build}/photos`),
		shows: () => a.names.photo,
		guess: ['build']
	},
	{
		route: 'POST /api/v1/builds/[buildId]/photos',
		object: 'a new wheel photo',
		expect: e(401, 403, 201, 201, 404),
		call: async (c, i) => send(c, 'POST', `/api/v1/builds/${i.build}/photos`, photoForm(await smallPng(60), 'matrix.png')),
		guess: ['build']
	},
	{
		route: 'POST /api/v1/builds/[buildId]/tapes',
		object: 'a new degree tape',
		expect: e(401, 403, 201, 201, 404),
		call: (c, i) => send(c, 'POST', `/api/v1/builds/${i.build}/tapes`, { params: { units: 'mm', diameter: '100' } }),
		guess: ['build']
	},
	{
		route: 'DELETE /api/v1/builds/[buildId]/tapes/[recordId]',
		object: 'degree tape',
		expect: e(401, 403, 204, 204, 404),
		fresh: fresh.tape,
		call: (c, i) => send(c, 'DELETE', `/api/v1/builds/${i.build}/tapes/${i.tape}`),
		guess: ['build', 'tape']
	},
	{
		route: 'POST /api/v1/builds/[buildId]/signal-checks',
		object: 'a new signal check',
		expect: e(401, 403, 201, 201, 404),
		call: (c, i) => send(c, 'POST', `/api/v1/builds/${i.build}/signal-checks`, { params: signalParams }),
		guess: ['build']
	},
	{
		route: 'DELETE /api/v1/builds/[buildId]/signal-checks/[recordId]',
		object: 'signal check',
		expect: e(401, 403, 204, 204, 404),
		fresh: fresh.signal,
		call: (c, i) => send(c, 'DELETE', `/api/v1/builds/${i.build}/signal-checks/${i.signal}`),
		guess: ['build', 'signal']
	},
	{
		route: 'POST /api/v1/builds/[buildId]/tdc-records',
		object: 'a new TDC record',
		expect: e(401, 403, 201, 201, 404),
		call: (c, i) => send(c, 'POST', `/api/v1/builds/${i.build}/tdc-records`, { params: { a: '-12', b: '12' } }),
		guess: ['build']
	},
	{
		route: 'DELETE /api/v1/builds/[buildId]/tdc-records/[recordId]',
		object: 'TDC record',
		expect: e(401, 403, 204, 204, 404),
		fresh: fresh.tdc,
		call: (c, i) => send(c, 'DELETE', `/api/v1/builds/${i.build}/tdc-records/${i.tdc}`),
		guess: ['build', 'tdc']
	},

	// API: wheel designs and revisions
	{
		route: 'GET /api/v1/designs/[designId]',
		object: 'wheel design, revisions',
		expect: e(401, 200, 200, 200, 404),
		call: (c, i) => getApi(c, `/api/v1/designs/${i.design}`),
		shows: () => a.names.design,
		guess: ['design']
	},
	{
		route: 'GET /api/v1/designs/[designId]/compare',
		object: 'two revisions',
		expect: e(401, 200, 200, 200, 404),
		call: (c, i) => getApi(c, `/api/v1/designs/${i.design}/compare?a=1&b=1`),
		guess: ['design']
	},
	{
		route: 'POST /api/v1/designs/[designId]/restore',
		object: 'a new revision from an old one',
		expect: e(401, 403, 201, 201, 404),
		call: async (c, i) => send(c, 'POST', `/api/v1/designs/${i.design}/restore`, { revision: 1, baseRevision: await head(i.design) }),
		guess: ['design']
	},
	{
		route: 'GET /api/v1/designs/[designId]/revisions',
		object: 'revisions',
		expect: e(401, 200, 200, 200, 404),
		call: (c, i) => getApi(c, `/api/v1/designs/${i.design}/revisions`),
		guess: ['design']
	},
	{
		route: 'POST /api/v1/designs/[designId]/revisions',
		object: 'a new revision',
		expect: e(401, 403, 201, 201, 404),
		call: async (c, i, as) =>
			send(c, 'POST', `/api/v1/designs/${i.design}/revisions`, {
				baseRevision: await head(i.design),
				params: wheel,
				message: `saved by ${as}`
			}),
		guess: ['design']
	},
	{
		route: 'GET /api/v1/designs/[designId]/revisions/[number]',
		object: 'revision',
		expect: e(401, 200, 200, 200, 404),
		call: (c, i) => getApi(c, `/api/v1/designs/${i.design}/revisions/1`),
		guess: ['design']
	},
	...(['wheel.dxf', 'wheel.svg', 'wheel.pdf'] as const).map((file): Row => ({
		route: 'GET /api/v1/designs/[designId]/revisions/[number]/[file]',
		note: file,
		object: 'revision as a file',
		expect: e(401, 200, 200, 200, 404),
		call: (c, i) => getApi(c, `/api/v1/designs/${i.design}/revisions/1/${file}`),
		guess: ['design']
	})),

	// API: wheel photos
	{
		route: 'GET /api/v1/photos/[photoId]',
		object: 'wheel photo',
		expect: e(401, 200, 200, 200, 404),
		call: (c, i) => getApi(c, `/api/v1/photos/${i.photo}`),
		guess: ['photo']
	},
	{
		route: 'DELETE /api/v1/photos/[photoId]',
		object: 'wheel photo',
		expect: e(401, 403, 204, 204, 404),
		fresh: fresh.photo,
		call: (c, i) => send(c, 'DELETE', `/api/v1/photos/${i.photo}`),
		guess: ['photo']
	},
	// Anyone who may read the build may try a reading; only editors and owners store it.
	{
		route: 'POST /api/v1/photos/[photoId]/reading',
		object: 'photo reading',
		expect: e(401, 200, 200, 200, 404),
		call: (c, i) => send(c, 'POST', `/api/v1/photos/${i.photo}/reading`, { ...taps, odMm: 100 }),
		guess: ['photo'],
		changesNothingFor: ['viewer']
	},
	{
		route: 'GET /api/v1/photos/[photoId]/thumbnail',
		object: 'wheel photo',
		expect: e(401, 200, 200, 200, 404),
		call: (c, i) => getApi(c, `/api/v1/photos/${i.photo}/thumbnail`),
		guess: ['photo']
	}
];

/** Routes left out of the table, each with its reason. */
const notInTable: Record<string, string> = {
	'POST /account?/everywhere': 'ends every session of the caller, the table’s own callers with it; account-takeover.test.ts tries it',
	'POST /dev/mail?/clear':
		'empties the local mailbox the other tests read; the page exists only where MAILBOX_URL is set, never in production'
};

// ---- What is compared before and after ----

/** Every row of a workshop and everything under it, and its files in the object store. */
async function snapshot(workshopId: string): Promise<string> {
	const { rows } = await database.execute<{ s: unknown }>(sql`
		select json_build_object(
			'workshop', (select json_agg(json_build_object('name', name)) from workshop where id = ${workshopId}),
			'members', (select json_agg(json_build_object('user', user_id, 'role', role) order by user_id) from member where workshop_id = ${workshopId}),
			'invitations', (select json_agg(json_build_object('id', id, 'accepted', accepted_at, 'role', role) order by id) from invitation where workshop_id = ${workshopId}),
			'builds', (select json_agg(json_build_object('id', id, 'name', name, 'engine', engine, 'notes', notes, 'profile', engine_profile, 'updated', updated_at) order by id) from build where workshop_id = ${workshopId}),
			'designs', (select json_agg(json_build_object('id', d.id, 'name', d.name, 'updated', d.updated_at) order by d.id) from wheel_design d join build b on b.id = d.build_id where b.workshop_id = ${workshopId}),
			'revisions', (select json_agg(r.id order by r.id) from wheel_revision r join wheel_design d on d.id = r.design_id join build b on b.id = d.build_id where b.workshop_id = ${workshopId}),
			'tdc', (select json_agg(t.id order by t.id) from tdc_record t join build b on b.id = t.build_id where b.workshop_id = ${workshopId}),
			'tapes', (select json_agg(t.id order by t.id) from degree_tape t join build b on b.id = t.build_id where b.workshop_id = ${workshopId}),
			'signal', (select json_agg(t.id order by t.id) from signal_check t join build b on b.id = t.build_id where b.workshop_id = ${workshopId}),
			'photos', (select json_agg(json_build_object('id', p.id, 'name', p.name, 'reading', p.photo_reading) order by p.id) from wheel_photo p join build b on b.id = p.build_id where b.workshop_id = ${workshopId}),
			'cutting', (select json_agg(c.id order by c.id) from cutting_package c join build b on b.id = c.build_id where b.workshop_id = ${workshopId}),
			'activity', (select count(*) from activity x join build b on b.id = x.build_id where b.workshop_id = ${workshopId})
		) as s`);
	return JSON.stringify({ rows: rows[0]!.s, objects: (await listKeys(`photos/${workshopId}/`)).sort() });
}

const both = async () => [await snapshot(a.ids.workshop), await snapshot(b.ids.workshop)] as const;
const refused = (status: number) => status >= 400;
const rowName = (row: Row) => `${row.route}${row.note ? ` (${row.note})` : ''}`;
const found = (body: string, secrets: string[]) => secrets.filter((s) => body.includes(s));

/** A second client on the same session cookie, so a refused request cannot disturb the caller's own. */
function cloneOf(client: Client) {
	const copy = new Client();
	for (const [k, v] of client.cookies) copy.cookies.set(k, v);
	return copy;
}

describe('the access matrix', () => {
	for (const row of table) {
		it(
			rowName(row),
			async () => {
				const problems: string[] = [];
				for (const role of roles) {
					const ids = row.fresh ? { ...a.ids, ...(await row.fresh(a.ids)) } : a.ids;
					const [beforeA, beforeB] = await both();
					const answer = await row.call(clients[role], ids, role);
					const [afterA, afterB] = await both();
					const want = row.expect[role];
					const say = (what: string) => problems.push(`${role}: ${what}`);
					if (answer.status !== want) say(`expected ${want}, got ${answer.status}: ${answer.body.slice(0, 160)}`);
					if (answer.status === 303) {
						const to = role === 'anonymous' ? (row.anonymousTo ?? '/signin?redirectTo=') : row.to;
						if (to && !answer.location?.startsWith(to)) say(`redirected to ${answer.location}, expected ${to}…`);
					}
					if (role === 'anonymous' && answer.status === 401 && !answer.body.includes('"unauthenticated"'))
						say('401 without code unauthenticated');
					// Nothing of the workshop reaches a caller outside it.
					if ((role === 'stranger' || role === 'anonymous') && !row.openLink) {
						const leaked = found(answer.body, a.secrets);
						if (leaked.length) say(`answer shows ${leaked.join(', ')}`);
					}
					if (role !== 'stranger' && role !== 'anonymous' && !row.openLink) {
						const leaked = found(answer.body, b.secrets);
						if (leaked.length) say(`answer shows the other workshop's ${leaked.join(', ')}`);
					}
					// Allowed reads show the object (so the leak check above could catch a leak).
					if (row.shows && ['viewer', 'editor', 'owner'].includes(role) && answer.status === 200 && !answer.body.includes(row.shows(ids)))
						say(`answer does not show ${row.shows(ids)}`);
					// What may change: the caller's own workshop, on an allowed write.
					const method = row.route.split(' ')[0];
					const mayChangeA =
						role !== 'stranger' &&
						role !== 'anonymous' &&
						!refused(answer.status) &&
						(method !== 'GET' || row.logsRead === true) &&
						!row.changesNothingFor?.includes(role);
					if (!mayChangeA && afterA !== beforeA) say(`workshop changed (status ${answer.status})`);
					const mayChangeB = role === 'stranger' && !refused(answer.status) && method !== 'GET';
					if (!mayChangeB && afterB !== beforeB) say(`the other workshop changed (status ${answer.status})`);
				}
				expect(problems).toEqual([]);
			},
			120_000
		);
	}
});

describe('guessed and foreign ids', () => {
	const guessable = table.filter((r) => r.guess?.length);

	for (const row of guessable) {
		it(
			rowName(row),
			async () => {
				const problems: string[] = [];
				for (const kind of row.guess!) {
					const variants: [string, string, number][] = [
						['a made-up id', randomUUID(), row.guessed ?? 404],
						['the other workshop’s id', b.ids[kind], row.guessed ?? 404],
						['a malformed id', 'not-a-uuid', row.malformed?.[kind] ?? row.guessed ?? 404]
					];
					for (const role of ['owner', 'viewer'] as const) {
						const statuses: Record<string, number> = {};
						for (const [label, value, want] of variants) {
							const base = row.fresh ? { ...a.ids, ...(await row.fresh(a.ids)) } : a.ids;
							const ids = { ...base, [kind]: value };
							const [beforeA, beforeB] = await both();
							const answer = await row.call(role === 'owner' ? a.owner : clients.viewer, ids, role);
							const [afterA, afterB] = await both();
							statuses[label] = answer.status;
							const say = (what: string) => problems.push(`${role}, ${kind} = ${label}: ${what}`);
							// The owner may do everything: what it gets is what a guess gets.
							if (role === 'owner' && answer.status !== want) say(`expected ${want}, got ${answer.status}: ${answer.body.slice(0, 160)}`);
							if (answer.status === 403 && label !== 'a malformed id' && row.expect.viewer !== 403)
								say('403 reveals that the object exists');
							const leaked = found(answer.body, b.secrets);
							if (leaked.length) say(`answer shows the other workshop's ${leaked.join(', ')}`);
							if (afterA !== beforeA) say(`workshop changed (status ${answer.status})`);
							if (afterB !== beforeB) say(`the other workshop changed (status ${answer.status})`);
						}
						// The other workshop's id and a made-up one cannot be told apart.
						if (statuses['a made-up id'] !== statuses['the other workshop’s id']) {
							problems.push(
								`${role}, ${kind}: a made-up id answers ${statuses['a made-up id']}, the other workshop's ${statuses['the other workshop’s id']}`
							);
						}
					}
				}
				expect(problems).toEqual([]);
			},
			120_000
		);
	}

	it('mixes no objects across workshops in one request: a build here with a design, photo or record there', async () => {
		const mixed: [string, () => Promise<Answer>][] = [
			['design page', () => page(a.owner, `/builds/${a.ids.build}/designs/${b.ids.design}`)],
			['photo page', () => page(a.owner, `/builds/${a.ids.build}/photos/${b.ids.photo}`)],
			['tape', () => send(a.owner, 'DELETE', `/api/v1/builds/${a.ids.build}/tapes/${b.ids.tape}`)],
			['signal check', () => send(a.owner, 'DELETE', `/api/v1/builds/${a.ids.build}/signal-checks/${b.ids.signal}`)],
			['TDC record', () => send(a.owner, 'DELETE', `/api/v1/builds/${a.ids.build}/tdc-records/${b.ids.tdc}`)],
			[
				'cutting package',
				() =>
					send(a.owner, 'POST', `/api/v1/builds/${a.ids.build}/cutting-packages`, {
						designId: b.ids.design,
						to: freshEmail('mixed'),
						quantity: 1
					})
			],
			['build sheet', () => getApi(a.owner, `/api/v1/builds/${a.ids.build}/build-sheet.pdf?design=${b.ids.design}`)],
			[
				'invite',
				() =>
					act(a.owner, '/workshop', 'invite', {
						email: freshEmail('mixed'),
						role: 'viewer',
						buildId: b.ids.build,
						workshopId: a.ids.workshop
					})
			]
		];
		const problems: string[] = [];
		for (const [what, call] of mixed) {
			const [beforeA, beforeB] = await both();
			const answer = await call();
			const [afterA, afterB] = await both();
			if (answer.status !== 404) problems.push(`${what}: expected 404, got ${answer.status}`);
			if (found(answer.body, b.secrets).length) problems.push(`${what}: answer shows ${found(answer.body, b.secrets).join(', ')}`);
			if (afterA !== beforeA || afterB !== beforeB) problems.push(`${what}: something changed`);
		}
		expect(problems).toEqual([]);
	});
});

describe('the table itself', () => {
	/** Pages with a server load, form actions and API methods, as the route files declare them. */
	function declaredRoutes(): string[] {
		const root = join(import.meta.dirname, '..', '..', 'src', 'routes');
		const out: string[] = [];
		const walk = (dir: string) => {
			for (const name of readdirSync(dir)) {
				const path = join(dir, name);
				if (statSync(path).isDirectory()) walk(path);
				else if (name === '+page.server.ts' || name === '+server.ts') {
					const route = `/${relative(root, dir)
						.split(sep)
						.filter((s) => s && !/^\(.*\)$/.test(s))
						.join('/')}`;
					const text = readFileSync(path, 'utf8');
					if (name === '+server.ts') {
						for (const m of text.matchAll(/export\s+(?:async\s+)?(?:function|const)\s+(GET|POST|PUT|PATCH|DELETE)\b/g))
							out.push(`${m[1]} ${route}`);
					} else {
						if (/export\s+const\s+load\b|export\s+(?:async\s+)?function\s+load\b/.test(text)) out.push(`GET ${route}`);
						const actions = /export\s+const\s+actions[^=]*=\s*\{([\s\S]*)\};?\s*$/.exec(text)?.[1] ?? '';
						for (const m of actions.matchAll(/^\t(\w+)\s*:\s*async/gm))
							out.push(m[1] === 'default' ? `POST ${route}` : `POST ${route}?/${m[1]}`);
					}
				}
			}
		};
		walk(root);
		return out.sort();
	}

	it('has a row for every page with a server load, every form action and every API method', () => {
		const declared = declaredRoutes();
		// The walk itself finds what it should (so this check cannot pass on an empty list).
		expect(declared).toEqual(
			expect.arrayContaining(['GET /builds/[buildId]', 'POST /workshop?/invite', 'POST /invite/[token]', 'DELETE /api/v1/photos/[photoId]'])
		);
		const inTable = new Set(table.map((r) => r.route));
		expect(declared.filter((r) => !inTable.has(r) && !(r in notInTable))).toEqual([]);
	});
});

describe('form actions a page does not define', () => {
	// SvelteKit looks an action up as actions[name]: names every object inherits reached Object's
	// own methods (500s, and ?/toString "succeeded"). Each page with actions, every caller: 404, nothing changed.
	const inherited = ['constructor', '__proto__', 'toString', 'valueOf', 'hasOwnProperty', 'default'];
	const pages = () => [...new Set(table.filter((r) => /^POST \/(?!api\/)/.test(r.route)).map((r) => r.route.slice(5).split('?')[0]!))];

	it('answers 404 for inherited and reserved names on every page with actions, for every caller, and changes nothing', async () => {
		const concrete = (route: string) => route.replace('[token]', route.startsWith('/invite') ? a.ids.token : randomUUID());
		expect(pages()).toEqual(expect.arrayContaining(['/builds', '/workshop', '/signin', '/signup', '/reset', '/invite/[token]']));
		const problems: string[] = [];
		for (const route of pages()) {
			for (const role of roles) {
				for (const name of inherited) {
					const [beforeA, beforeB] = await both();
					const answer = await act(role === 'anonymous' ? new Client() : cloneOf(clients[role]), concrete(route), name, {
						name: 'x',
						email: 'x@example.test'
					});
					const [afterA, afterB] = await both();
					if (answer.status !== 404) problems.push(`${role} ${route}?/${name}: ${answer.status} ${answer.body.slice(0, 120)}`);
					if (afterA !== beforeA || afterB !== beforeB) problems.push(`${role} ${route}?/${name}: something changed`);
				}
			}
		}
		expect(problems).toEqual([]);
	}, 180_000);
});
