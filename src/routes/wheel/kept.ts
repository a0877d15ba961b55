import type { Params } from '$lib/params';
import type { Opened } from './+page';

/**
 * The build and wheel design the designer saves into, when the page was opened from one
 * (?design= or ?build=) or has saved since. `base` is the revision the edit started from: a
 * save names it, so one that has not seen a newer revision is refused instead of landing on it.
 */
export interface Kept {
	buildId: string;
	buildName: string | null;
	role: string | null;
	design: { id: string; name: string; base: number; baseParams: Params; head: number } | null;
}

export const keptFrom = (o: Opened | null): Kept | null =>
	o === null
		? null
		: o.kind === 'build'
			? { buildId: o.build.id, buildName: o.build.name, role: o.role, design: null }
			: {
					buildId: o.build.id,
					buildName: o.build.name,
					role: o.role,
					design: { id: o.design.id, name: o.design.name, base: o.revision, baseParams: o.revisionParams, head: o.headRevision }
				};

/** The part of the address that says where the design is kept; it stays while the wheel's parameters change. */
export const keptQuery = (k: Kept | null, requested: string) =>
	k?.design
		? new URLSearchParams({ design: k.design.id, revision: String(k.design.base) }).toString()
		: k
			? new URLSearchParams({ build: k.buildId }).toString()
			: requested;

/** The address's keys that say where the design is kept. */
export const contextKeys = ['build', 'design', 'revision'];
