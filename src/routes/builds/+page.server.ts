import { fail } from '@sveltejs/kit';
import { buildId, buildQuery, createBuild as createSchema, renameBuild as renameSchema } from '$lib/schemas/build';
import { parseForm } from '$lib/schemas/form';
import { workshopAccess } from '$lib/server/access';
import { deleteBuild } from '$lib/server/build-overview';
import { changeBuild, createBuild, listBuilds } from '$lib/server/builds';
import { db } from '$lib/server/db';
import type { Actions, PageServerLoad } from './$types';

const refusals = {
	'name-taken': 'name: another build in this workshop has that name',
	'not-found': 'No such build in this workshop.'
} as const;

/**
 * The page of the list the address names (the same query as `GET /api/v1/builds`). The page moves
 * between views with `goto`, so this load runs again for each search and sort, and after each
 * action; "More builds" is a plain link with the next page's cursor. An address the schema refuses
 * (a hand-edited cursor or sort) shows the default view rather than an error.
 */
export const load: PageServerLoad = async (event) => {
	const access = await workshopAccess(event, 'read');
	const query = buildQuery.safeParse(Object.fromEntries(event.url.searchParams));
	const view = query.success ? query.data : buildQuery.parse({});
	const list = await listBuilds(db(), access.workshop.id, view);
	return { workshop: access.workshop, can: access.can, q: view.q, after: view.cursor !== undefined, list };
};

// Each action calls the same service as the API route for the same change (builds.ts, build-overview.ts).
export const actions: Actions = {
	create: async (event) => {
		const access = await workshopAccess(event, 'edit');
		const form = await event.request.formData();
		const parsed = parseForm(createSchema, form);
		const echo = { name: String(form.get('name') ?? ''), engine: String(form.get('engine') ?? '') };
		if (!parsed.ok) return fail(400, { action: 'create', ...echo, errors: parsed.errors });
		const result = await createBuild(db(), access.workshop.id, parsed.data, access.user.id);
		if (!result.ok) return fail(409, { action: 'create', ...echo, errors: { name: refusals[result.reason] } });
		return { action: 'create', created: result.id };
	},

	rename: async (event) => {
		const access = await workshopAccess(event, 'edit');
		const form = await event.request.formData();
		const parsed = parseForm(renameSchema, form);
		if (!parsed.ok) return fail(400, { action: 'rename', buildId: String(form.get('buildId') ?? ''), errors: parsed.errors });
		const result = await changeBuild(db(), access.workshop.id, parsed.data.buildId, { name: parsed.data.name }, access.user.id);
		if (!result.ok)
			return fail(result.reason === 'not-found' ? 404 : 409, {
				action: 'rename',
				buildId: parsed.data.buildId,
				errors: { name: refusals[result.reason] }
			});
		return { action: 'rename' };
	},

	delete: async (event) => {
		const access = await workshopAccess(event, 'edit');
		const parsed = parseForm(buildId, await event.request.formData());
		if (!parsed.ok) return fail(400, { action: 'delete', errors: parsed.errors });
		const result = await deleteBuild(db(), access.workshop.id, parsed.data.buildId);
		if (!result.ok) return fail(404, { action: 'delete', message: refusals['not-found'] });
		return { action: 'delete' };
	}
};
