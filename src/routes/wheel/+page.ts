import { newWheel, wheelParams } from '$lib/schemas/wheel-params';
import type { PageLoad } from './$types';

/** The wheel's public parameters (the same names as /api/v1/wheel), the only ones read from the query. */
const known = wheelParams.names;

/** Where the page was opened from: a saved wheel design at one revision, or a build to start one in. */
export type Opened =
	| {
			kind: 'design';
			design: { id: string; name: string; buildId: string };
			build: { id: string; name: string | null };
			/** The revision the form starts from: what a save names as its base. */
			revision: number;
			revisionParams: Record<string, string>;
			headRevision: number;
			role: string | null;
	  }
	| { kind: 'build'; build: { id: string; name: string | null }; role: string | null };

interface ApiRevision {
	number: number;
	params: Record<string, string>;
}

const defaultsFor = (units: string | null | undefined) => newWheel(units === 'in' ? 'in' : 'mm');

/** What a refused look-up says to the person at the designer, who can carry on without it. */
function refusal(status: number, what: 'wheel design' | 'build', body: { message?: string } | null): string {
	if (status === 401) return `Sign in to open this ${what}: saved designs belong to a workshop. The designer works without it.`;
	if (status === 404)
		return `No such ${what} in your workshops. The link may be mistyped, or the ${what} removed; the designer works without it.`;
	if (status === 403) return body?.message ?? `Your role does not allow opening this ${what}.`;
	return `The ${what} could not be opened (the server answered ${status}); the designer works without it.`;
}

async function getJson(fetcher: typeof fetch, path: string): Promise<{ status: number; body: Record<string, unknown> | null }> {
	try {
		const res = await fetcher(path, { headers: { accept: 'application/json' } });
		const body = (await res.json().catch(() => null)) as Record<string, unknown> | null;
		return { status: res.status, body };
	} catch {
		return { status: 0, body: null };
	}
}

async function buildName(
	fetcher: typeof fetch,
	buildId: string
): Promise<{ status: number; name: string | null; role: string | null; message?: string }> {
	const { status, body } = await getJson(fetcher, `/api/v1/builds/${encodeURIComponent(buildId)}`);
	const build = body?.build as { name?: string } | undefined;
	return {
		status,
		name: build?.name ?? null,
		role: (body?.role as string | undefined) ?? null,
		message: body?.message as string | undefined
	};
}

/**
 * A shared link carries the design in its query. Anything it leaves out starts from the defaults
 * of its unit system, so `?units=in&od=3 1/2` is a whole design.
 *
 * `?design=<id>[&revision=<n>]` opens a saved wheel design at that revision (the newest when not
 * given); wheel parameters in the same query are edits made on top of it and win. `?build=<id>`
 * starts a new design for that build. The look-ups go through the API with SvelteKit's fetch,
 * which carries the session cookie; a refusal leaves the designer working, with a message.
 */
export const load: PageLoad = async ({ url, fetch }) => {
	const query = url.searchParams;
	const edited = known.some((key) => query.has(key));
	let params: Record<string, string> = defaultsFor(query.get('units'));
	for (const key of known) {
		const value = query.get(key);
		if (value !== null) params[key] = value;
	}

	let opened: Opened | null = null;
	const notices: string[] = [];
	let openError: string | null = null;
	const designId = query.get('design');
	const buildId = query.get('build');

	if (designId) {
		const { status, body } = await getJson(fetch, `/api/v1/designs/${encodeURIComponent(designId)}`);
		if (status !== 200 || !body) {
			openError =
				status === 0
					? 'The wheel design could not be fetched: no answer from the server. The designer works without it.'
					: refusal(status, 'wheel design', body);
		} else {
			const design = body.design as { id: string; name: string; buildId: string };
			const revisions = (body.revisions as ApiRevision[]) ?? [];
			const wanted = query.get('revision');
			let revision = wanted === null ? revisions[0] : revisions.find((r) => String(r.number) === wanted.trim());
			if (!revision && wanted !== null) {
				revision = revisions[0];
				if (revision) notices.push(`This wheel design has no revision ${wanted}; showing revision ${revision.number}, the newest.`);
			}
			if (!revision) {
				openError = 'This wheel design has no revisions to open.';
			} else {
				const build = await buildName(fetch, design.buildId);
				opened = {
					kind: 'design',
					design: { id: design.id, name: design.name, buildId: design.buildId },
					build: { id: design.buildId, name: build.name },
					revision: revision.number,
					revisionParams: { ...revision.params },
					headRevision: Number(body.headRevision) || revision.number,
					role: (body.role as string | undefined) ?? build.role
				};
				if (!edited) params = { ...defaultsFor(revision.params.units), ...revision.params };
			}
		}
	} else if (buildId) {
		const build = await buildName(fetch, buildId);
		if (build.status !== 200)
			openError =
				build.status === 0
					? 'The build could not be fetched: no answer from the server. The designer works without it.'
					: refusal(build.status, 'build', { message: build.message });
		else opened = { kind: 'build', build: { id: buildId, name: build.name }, role: build.role };
	}

	/** The context part of the address as it came, kept as is when it could not be opened (to work once signed in). */
	const requested = new URLSearchParams();
	for (const key of ['design', 'revision', 'build']) {
		const value = query.get(key);
		if (value !== null) requested.set(key, value);
	}

	return { params, opened, openError, notices, requested: requested.toString() };
};
