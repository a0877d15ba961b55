// The wheel design the phasing check's clocking can be applied to, when the page is opened for a
// build (`build=<id>`, and `design=<id>`; without a design, the build's first). Read through the
// API with the load's fetch (it carries the session), so the page and a script see the same thing.

export interface TargetRevision {
	number: number;
	params: Record<string, string>;
}

export type ClockingTarget =
	| {
			ok: true;
			design: { id: string; name: string; buildId: string };
			/** The design's newest revision when the page opened: a new revision is written on top of it. */
			head: TargetRevision;
			role: string | null;
	  }
	| { ok: false; message: string };

type Fetch = typeof fetch;

async function getJson(fetcher: Fetch, path: string): Promise<{ status: number; body: Record<string, unknown> | null }> {
	try {
		const res = await fetcher(path, { headers: { accept: 'application/json' } });
		return { status: res.status, body: (await res.json().catch(() => null)) as Record<string, unknown> | null };
	} catch {
		return { status: 0, body: null };
	}
}

/** Why the design could not be read, said to the person at the phasing check (which works without it). */
function unread(status: number, what: 'build' | 'wheel design', body: Record<string, unknown> | null): string {
	if (status === 401) return `Sign in to apply the clocking to the ${what}’s wheel design; the check works without it.`;
	if (status === 404) return `No such ${what} in your workshops: the link may be mistyped, or the ${what} removed.`;
	if (status === 403) return (body?.message as string | undefined) ?? `Your role does not allow opening this ${what}.`;
	if (status === 0) return `The ${what} could not be read: no answer from the server.`;
	return `The ${what} could not be read (the server answered ${status}).`;
}

/** The design named in the query (or the build's first), with its head revision; null when the page was not opened for a build. */
export async function clockingTarget(fetcher: Fetch, query: URLSearchParams): Promise<ClockingTarget | null> {
	let designId = query.get('design');
	const buildId = query.get('build');
	if (!designId && !buildId) return null;
	if (!designId) {
		const { status, body } = await getJson(fetcher, `/api/v1/builds/${encodeURIComponent(buildId!)}`);
		if (status !== 200 || !body) return { ok: false, message: unread(status, 'build', body) };
		const designs = (body.designs as { id: string }[] | undefined) ?? [];
		if (!designs[0])
			return { ok: false, message: 'This build has no wheel design yet: design the wheel, then the clocking can be applied to it.' };
		designId = designs[0].id;
	}
	const { status, body } = await getJson(fetcher, `/api/v1/designs/${encodeURIComponent(designId)}`);
	if (status !== 200 || !body) return { ok: false, message: unread(status, 'wheel design', body) };
	const design = body.design as { id: string; name: string; buildId: string };
	const head = ((body.revisions as TargetRevision[] | undefined) ?? [])[0];
	if (!head) return { ok: false, message: `“${design.name}” has no revision to clock.` };
	return {
		ok: true,
		design: { id: design.id, name: design.name, buildId: design.buildId },
		head: { number: head.number, params: { ...head.params } },
		role: (body.role as string | undefined) ?? null
	};
}
