import { eq, sql } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { connect } from '../../src/lib/server/db';
import { invitation } from '../../src/lib/server/db/schema';
import { createInvitation } from '../../src/lib/server/workshops';
import { Client, freshEmail, mailTo, signUp } from '../support/client';

const database = connect(process.env.DATABASE_URL!);
afterAll(() => database.$client.end());

async function userId(email: string) {
	const { rows } = await database.execute<{ id: string }>(sql`select id from "user" where email = ${email}`);
	return rows[0]!.id;
}

type BuildsAnswer = { workshop: { id: string; name: string }; role: string; builds: { id: string; name: string }[] };

/** An owner with a workshop and one build, and helpers to bring others in at a role. */
async function shop(label: string) {
	const email = freshEmail(`${label}-owner`);
	const owner = await signUp(`${label} owner`, email);
	const { body } = await owner.json<BuildsAnswer>('/api/v1/builds');
	const created = await owner.action('/builds', 'create', { name: `${label} bench single`, engine: '350 cc single' });
	expect(created.type).toBe('success');
	const buildId = String(created.data!.created);
	return { owner, ownerEmail: email, workshopId: body.workshop.id, buildId };
}

async function join(s: Awaited<ReturnType<typeof shop>>, role: 'editor' | 'viewer', label: string) {
	const email = freshEmail(label);
	const sent = await s.owner.action('/workshop', 'invite', { email, role });
	expect(sent).toMatchObject({ type: 'success', data: { invited: email } });
	const mail = await mailTo(email, 'Invitation');
	const client = await signUp(label, email);
	const accepted = await client.action(new URL(mail.link).pathname, '', {});
	expect(accepted).toMatchObject({ type: 'redirect', location: '/builds' });
	return { client, email, link: mail.link };
}

describe('invitations', () => {
	let s: Awaited<ReturnType<typeof shop>>;
	beforeAll(async () => {
		s = await shop('inv');
	});

	it('brings the invited person in at the invited role, and switches them to that workshop', async () => {
		const { client } = await join(s, 'viewer', 'newviewer');
		const { body } = await client.json<BuildsAnswer>('/api/v1/builds');
		expect(body.workshop.id).toBe(s.workshopId);
		expect(body.role).toBe('viewer');
		expect(body.builds.map((b) => b.id)).toEqual([s.buildId]);
	});

	it('works once: a second use is refused', async () => {
		const { client, link } = await join(s, 'editor', 'once');
		const again = await client.action(new URL(link).pathname, '', {});
		expect(again.status).toBe(410);
		expect(String(again.data!.message)).toMatch(/accepted already/);
	});

	it('expires', async () => {
		const email = freshEmail('late');
		const { token, invitation: row } = await createInvitation(database, {
			workshopId: s.workshopId,
			email,
			role: 'viewer',
			invitedBy: null
		});
		await database
			.update(invitation)
			.set({ expiresAt: new Date(Date.now() - 1000) })
			.where(eq(invitation.id, row.id));
		const late = await signUp('Late', email);
		const result = await late.action(`/invite/${token}`, '', {});
		expect(result.status).toBe(410);
		expect(String(result.data!.message)).toMatch(/expired/);
		expect((await late.json<BuildsAnswer>(`/api/v1/builds?workshop=${s.workshopId}`)).status).toBe(404);
	});

	it('can only be accepted by the invited address', async () => {
		const email = freshEmail('intended');
		await s.owner.action('/workshop', 'invite', { email, role: 'editor' });
		const mail = await mailTo(email, 'Invitation');
		const someoneElse = await signUp('Someone else', freshEmail('else'));
		const result = await someoneElse.action(new URL(mail.link).pathname, '', {});
		expect(result.status).toBe(403);
		expect((await someoneElse.json(`/api/v1/builds?workshop=${s.workshopId}`)).status).toBe(404);
	});

	it('refuses a malformed invitation, naming the field and what it allows', async () => {
		const result = await s.owner.action('/workshop', 'invite', { email: 'fabricator@', role: 'owner' });
		expect(result.status).toBe(400);
		expect(result.data!.errors).toEqual({ email: 'email: an address like name@example.com', role: 'role: one of editor, viewer' });
	});
});

describe('roles', () => {
	let s: Awaited<ReturnType<typeof shop>>;
	let viewer: Awaited<ReturnType<typeof join>>;
	let editor: Awaited<ReturnType<typeof join>>;
	let stranger: Client;
	beforeAll(async () => {
		s = await shop('roles');
		viewer = await join(s, 'viewer', 'roviewer');
		editor = await join(s, 'editor', 'roeditor');
		stranger = (await shop('other')).owner;
	});

	it('viewer: reads builds, is refused every change', async () => {
		expect((await viewer.client.json<BuildsAnswer>('/api/v1/builds')).body.builds).toHaveLength(1);
		for (const [action, fields] of [
			['create', { name: 'Viewer build' }],
			['rename', { buildId: s.buildId, name: 'Renamed by viewer' }],
			['delete', { buildId: s.buildId }]
		] as const) {
			const result = await viewer.client.action('/builds', action, fields);
			expect(result.status, action).toBe(403);
			expect(result.error?.message).toMatch(/role .* is viewer; this needs editor/);
		}
		expect((await viewer.client.action('/workshop', 'invite', { email: freshEmail('x'), role: 'viewer' })).status).toBe(403);
	});

	it('editor: changes builds, is refused member management', async () => {
		const created = await editor.client.action('/builds', 'create', { name: 'Editor build', engine: '' });
		expect(created.type).toBe('success');
		const renamed = await editor.client.action('/builds', 'rename', {
			buildId: String(created.data!.created),
			name: 'Editor build, renamed'
		});
		expect(renamed.type).toBe('success');
		const taken = await editor.client.action('/builds', 'rename', { buildId: String(created.data!.created), name: 'roles bench single' });
		expect(taken.status).toBe(409);
		expect(taken.data!.errors).toEqual({ name: 'name: another build in this workshop has that name' });
		expect((await editor.client.action('/builds', 'delete', { buildId: String(created.data!.created) })).type).toBe('success');
		expect((await editor.client.action('/workshop', 'invite', { email: freshEmail('y'), role: 'viewer' })).status).toBe(403);
	});

	it('owner: changes a role, and the change takes effect at once', async () => {
		const viewerId = await userId(viewer.email);
		const promoted = await s.owner.action('/workshop', 'role', { userId: viewerId, role: 'editor' });
		expect(promoted.type).toBe('success');
		expect((await viewer.client.action('/builds', 'create', { name: 'Now allowed' })).type).toBe('success');
		const demoted = await s.owner.action('/workshop', 'role', { userId: viewerId, role: 'viewer' });
		expect(demoted.type).toBe('success');
		expect((await viewer.client.action('/builds', 'create', { name: 'Not any more' })).status).toBe(403);
	});

	it('owner: cannot leave the workshop without an owner', async () => {
		const ownerId = await userId(s.ownerEmail);
		const result = await s.owner.action('/workshop', 'role', { userId: ownerId, role: 'viewer' });
		expect(result.status).toBe(409);
		expect(String(result.data!.message)).toMatch(/at least one owner/);
		expect((await s.owner.action('/workshop', 'remove', { userId: ownerId })).status).toBe(409);
	});

	it("another workshop's owner sees nothing and changes nothing, even with the right ids", async () => {
		expect((await stranger.json(`/api/v1/builds?workshop=${s.workshopId}`)).status).toBe(404);
		const rename = await stranger.action('/builds', 'rename', { buildId: s.buildId, name: 'Taken over' });
		expect(rename.status).toBe(404);
		const del = await stranger.action('/builds', 'delete', { buildId: s.buildId });
		expect(del.status).toBe(404);
		const switched = await stranger.action('/workshop', 'switch', { workshopId: s.workshopId });
		expect(switched.status).toBe(404);
		// The build is untouched.
		const { body } = await s.owner.json<BuildsAnswer>('/api/v1/builds');
		expect(body.builds.find((b) => b.id === s.buildId)?.name).toBe('roles bench single');
	});

	it('anonymous callers get 401 from the API and are sent to sign in from pages', async () => {
		const anon = new Client();
		const api = await anon.json<{ message: string }>('/api/v1/builds');
		expect(api.status).toBe(401);
		expect(api.body.message).toMatch(/Sign in/);
		const page = await anon.get('/builds');
		expect(page.status).toBe(303);
		expect(page.headers.get('location')).toBe('/signin?redirectTo=%2Fbuilds');
		expect((await anon.action('/builds', 'create', { name: 'Anonymous' })).type).toBe('redirect');
	});

	it('the API refuses a malformed workshop id, naming the parameter', async () => {
		const { status, body } = await s.owner.json<{ errors: Record<string, string> }>('/api/v1/builds?workshop=12');
		expect(status).toBe(400);
		expect(body.errors.workshop).toBe('workshop: a workshop id');
	});
});
