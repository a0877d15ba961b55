// What a cutting package's drawing is made from: the design, its revision and the order's details.
// The build page checks them before it offers the preview, and the drawing's API route checks the
// query with the same function, so both give the same first reason per field.
import { z } from 'zod';
import { refusalsOf, type Checked } from './refusal';
import { singleLine } from './text';

/** The longest finish a drawing's title block and the message carry. */
export const finishLimit = 120;

/** Whole numbers come as numbers (JSON) or as typed text (a query, a form field). */
const whole = (field: string, min: number, max: number) => {
	const rule = `${field}: a whole number from ${min} to ${max}`;
	return z.preprocess(
		(v) => (typeof v === 'string' && /^\s*\d+\s*$/.test(v) ? Number(v) : v),
		z.number({ error: rule }).int({ error: rule }).min(min, { error: rule }).max(max, { error: rule })
	);
};

const unstorable = /[\u0000\p{Cs}]/u;

export const cuttingDetails = z.object({
	designId: z.uuid({ error: 'designId: a wheel design id of this build' }),
	/** Empty or left out: the design's newest revision. */
	revision: z.preprocess((v) => (v === '' || v === null ? undefined : v), whole('revision', 1, 1_000_000).optional()),
	quantity: whole('quantity', 1, 10_000),
	notes: z
		.string({ error: 'notes: text, at most 2000 characters' })
		.trim()
		.max(2000, { error: 'notes: at most 2000 characters' })
		.refine((s) => !unstorable.test(s), { error: 'notes: text without NUL or unpaired surrogate characters' })
		.optional()
		.default(''),
	finish: singleLine('finish', finishLimit).optional().default('')
});

export type CuttingDetails = z.infer<typeof cuttingDetails>;

/** The order's details, or the first reason per field (messages without the field's name). */
export function checkCuttingDetails(input: Record<string, unknown>): Checked<CuttingDetails> {
	const parsed = cuttingDetails.safeParse(input);
	return parsed.success ? { ok: true, value: parsed.data } : { ok: false, refusals: refusalsOf(parsed.error.issues) };
}

/** The drawing's address for these details (what the preview link opens). */
export function drawingQuery(d: { designId: string; revision?: number; quantity: number; notes?: string; finish?: string }): string {
	const q = new URLSearchParams({ designId: d.designId, quantity: String(d.quantity) });
	if (d.revision !== undefined) q.set('revision', String(d.revision));
	if (d.notes) q.set('notes', d.notes);
	if (d.finish) q.set('finish', d.finish);
	return q.toString();
}
