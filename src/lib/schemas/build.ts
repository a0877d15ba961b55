import { z } from 'zod';
import { decodeCursor, encodeCursor } from './cursor';
import { singleLine } from './text';

// Builds, their wheel designs, revisions, records and cutting packages: what forms and the JSON API
// accept. The parameters of a wheel, a tape or a phasing check stay flat strings, checked by their
// own schemas (wheel.ts, tape.ts, phasing.ts) so that the tools and the saved records agree.

export const buildLimits = { name: 120, engine: 500, notes: 5000, message: 300, label: 80, params: 80 } as const;

/** Revision numbers stay far below PostgreSQL's integer (2^31 − 1): a larger one would fail the query, not find nothing. */
const maxRevision = 1_000_000;

/** What PostgreSQL text and jsonb cannot hold: NUL, and an unpaired UTF-16 surrogate (not UTF-8 at all). */
const unstorable = /[\u0000\p{Cs}]/u;

const text = (field: string, max: number, min = 0) => {
	const rule = min ? `${field}: ${min} to ${max} characters` : `${field}: at most ${max} characters`;
	return z
		.string({ error: `${field}: text, ${rule.split(': ')[1]}` })
		.trim()
		.min(min, { error: rule })
		.max(max, { error: rule })
		.refine((s) => !unstorable.test(s), { error: `${field}: text without NUL or unpaired surrogate characters` });
};

/** Names are one line (singleLine); engine and notes are free text of several lines. */
export const buildName = singleLine('name', buildLimits.name, 1);

export const createBuild = z.object({
	name: buildName,
	engine: text('engine', buildLimits.engine).optional().default('')
});

export const renameBuild = z.object({ buildId: z.uuid({ error: 'buildId: a build id' }), name: buildName });

export const buildId = z.object({ buildId: z.uuid({ error: 'buildId: a build id' }) });

/** A change to a build's own fields; at least one. */
export const updateBuild = z
	.object({
		name: buildName.optional(),
		engine: text('engine', buildLimits.engine).optional(),
		notes: text('notes', buildLimits.notes).optional()
	})
	.refine((v) => v.name !== undefined || v.engine !== undefined || v.notes !== undefined, {
		error: 'form: give name, engine or notes',
		path: ['form']
	});

export const buildSorts = ['name', 'updated', 'created'] as const;

const sortDirs = ['asc', 'desc'] as const;
type SortDir = (typeof sortDirs)[number];
export type BuildSort = (typeof buildSorts)[number];

/** The direction a sort takes when the address does not say: names A to Z, times newest first. */
export const defaultDir = (sort: BuildSort): SortDir => (sort === 'name' ? 'asc' : 'desc');

/** A timestamp as PostgreSQL's `to_char` writes it for a cursor (microseconds, UTC). */
const cursorTime = /^\d{4}-\d{2}-\d{2}T\d{2}:\d{2}:\d{2}\.\d{6}Z$/;
const uuidText = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;

/** Where the next page starts: the last row shown, under the sort and direction it was listed by. */
export interface BuildCursor {
	sort: BuildSort;
	dir: SortDir;
	key: string;
	id: string;
}

/** A builds cursor's parts, or null when it is not one this list wrote. */
export function readBuildCursor(text: string): BuildCursor | null {
	const parts = decodeCursor(text, 4);
	if (!parts) return null;
	const [sort, dir, key, id] = parts as [string, string, string, string];
	if (!(buildSorts as readonly string[]).includes(sort) || !(sortDirs as readonly string[]).includes(dir) || !uuidText.test(id))
		return null;
	if (sort === 'name' ? key.length > buildLimits.name : !cursorTime.test(key) || Number.isNaN(Date.parse(key))) return null;
	return { sort: sort as BuildSort, dir: dir as SortDir, key, id };
}

export const writeBuildCursor = (c: BuildCursor) => encodeCursor([c.sort, c.dir, c.key, c.id]);

const cursorRule = 'cursor: the `next` value of the previous page, unchanged';

/**
 * The builds list: search in name and engine, sort, and a keyset page (`cursor`, the previous
 * answer's `next`). The old `page` is ignored (the first page): paging by offset is gone.
 */
export const buildQuery = z
	.object({
		workshop: z.uuid({ error: 'workshop: a workshop id' }).optional(),
		q: singleLine('q', 100).optional().default(''),
		sort: z.enum(buildSorts, { error: `sort: one of ${buildSorts.join(', ')}` }).default('updated'),
		dir: z.enum(sortDirs, { error: 'dir: asc or desc' }).optional(),
		cursor: z
			.string({ error: cursorRule })
			.max(600, { error: cursorRule })
			.refine((c) => readBuildCursor(c) !== null, { error: cursorRule })
			.describe('The previous answer’s `next`: the page after its last build, under the same q, sort and dir.')
			.optional(),
		size: z.coerce
			.number({ error: 'size: a whole number from 1 to 100' })
			.int({ error: 'size: a whole number from 1 to 100' })
			.min(1, { error: 'size: a whole number from 1 to 100' })
			.max(100, { error: 'size: a whole number from 1 to 100' })
			.default(20)
	})
	.superRefine((v, ctx) => {
		const cursor = v.cursor === undefined ? null : readBuildCursor(v.cursor);
		if (cursor && (cursor.sort !== v.sort || cursor.dir !== (v.dir ?? defaultDir(v.sort))))
			ctx.addIssue({
				code: 'custom',
				path: ['cursor'],
				message: 'cursor: belongs to another sort or direction; start again without it'
			});
	});
export type BuildQuery = z.infer<typeof buildQuery>;

/** Flat string parameters of a tool (wheel, tape, phasing): names and values bounded, values as text. */
export const flatParams = (field: string) =>
	z
		.record(
			z.string(),
			z.union([z.string(), z.number(), z.boolean()], { error: `${field}: each value text, a number or true/false` }).transform(String),
			{
				error: `${field}: an object of parameter names to values`
			}
		)
		.refine((r) => Object.keys(r).length <= buildLimits.params, { error: `${field}: at most ${buildLimits.params} parameters` })
		// Checked on the whole record: a failing key inside z.record is reported with the record's message.
		.refine((r) => Object.keys(r).every((k) => k.length <= 40), { error: `${field}: parameter names of at most 40 characters` })
		.refine((r) => Object.values(r).every((v) => v.length <= 500), { error: `${field}: values of at most 500 characters` })
		.refine((r) => Object.entries(r).every(([k, v]) => !unstorable.test(k) && !unstorable.test(v)), {
			error: `${field}: names and values without NUL or unpaired surrogate characters`
		});

export const createDesign = z.object({
	name: singleLine('name', buildLimits.label, 1),
	params: flatParams('params'),
	message: singleLine('message', buildLimits.message).optional().default('')
});

/** A save names the revision it started from; a stale base is refused with 409. */
export const saveRevision = z.object({
	baseRevision: z
		.number({ error: 'baseRevision: the revision number this save started from' })
		.int({ error: 'baseRevision: a whole number from 1' })
		.min(1, { error: 'baseRevision: a whole number from 1' })
		.max(maxRevision, { error: `baseRevision: a whole number from 1 to ${maxRevision}` }),
	params: flatParams('params'),
	message: singleLine('message', buildLimits.message).optional().default('')
});

export const restoreRevision = z.object({
	revision: z
		.number({ error: 'revision: the number of the revision to restore' })
		.int({ error: 'revision: a whole number from 1' })
		.min(1, { error: 'revision: a whole number from 1' })
		.max(maxRevision, { error: `revision: a whole number from 1 to ${maxRevision}` }),
	baseRevision: saveRevision.shape.baseRevision,
	message: singleLine('message', buildLimits.message).optional()
});

/** A revision number from a path or query, named by its field (`revision`, or compare's `a` and `b`). */
const revisionNumberOf = (field: string) =>
	z.coerce
		.number({ error: `${field}: a whole number from 1` })
		.int({ error: `${field}: a whole number from 1` })
		.min(1, { error: `${field}: a whole number from 1` })
		.max(maxRevision, { error: `${field}: a whole number from 1 to ${maxRevision}` });

export const revisionNumber = revisionNumberOf('revision');

/** A page of revisions starts below the number its cursor carries (the last revision of the page before). */
export function readRevisionCursor(text: string): number | null {
	const parts = decodeCursor(text, 1);
	if (!parts || !/^[1-9]\d{0,6}$/.test(parts[0]!)) return null;
	const number = Number(parts[0]);
	return number <= maxRevision ? number : null;
}

export const writeRevisionCursor = (number: number) => encodeCursor([String(number)]);

/** A design's history, a page at a time: `cursor` is the previous answer's `next`; `q` finds revisions by number or message. */
export const revisionListQuery = z.object({
	cursor: z
		.string({ error: cursorRule })
		.max(100, { error: cursorRule })
		.refine((c) => readRevisionCursor(c) !== null, { error: cursorRule })
		.describe('The previous answer’s `next`: the revisions older than its last.')
		.optional(),
	q: singleLine('q', 100).optional().default('').describe('A revision number, or words of its message.')
});

export const compareQuery = z.object({ a: revisionNumberOf('a'), b: revisionNumberOf('b') });

export const saveRecord = z.object({ label: singleLine('label', buildLimits.label).optional().default(''), params: flatParams('params') });

export const engineProfile = z.object({ params: flatParams('params') });

export const cuttingPackageInput = z.object({
	designId: z.uuid({ error: 'designId: a wheel design id of this build' }),
	revision: z
		.number({ error: 'revision: a whole number from 1' })
		.int({ error: 'revision: a whole number from 1' })
		.min(1, { error: 'revision: a whole number from 1' })
		.max(maxRevision, { error: `revision: a whole number from 1 to ${maxRevision}` })
		.optional(),
	to: z.email({ error: 'to: the fabricator’s e-mail address' }).max(254, { error: 'to: at most 254 characters' }),
	quantity: z
		.number({ error: 'quantity: a whole number from 1 to 10000' })
		.int({ error: 'quantity: a whole number from 1 to 10000' })
		.min(1, { error: 'quantity: a whole number from 1 to 10000' })
		.max(10_000, { error: 'quantity: a whole number from 1 to 10000' }),
	notes: text('notes', 2000).optional().default(''),
	/** Surface finish or treatment for the drawing's title block (optional). */
	finish: singleLine('finish', 120).optional().default('')
});

/** A saved build's build sheet: which design and revision (its newest design and revision when left out). */
export const buildSheetQuery = z.object({
	design: z.uuid({ error: 'design: a wheel design id of this build' }).optional(),
	revision: revisionNumber.optional()
});
