import { common } from '$lib/schemas/common-params';
import { allows, defineRegistry, givenParams } from '$lib/schemas/registry';
import { firstPerField, refusal, type Checked, type Refusal } from '$lib/schemas/refusal';
import { gapsField, patternOf } from '$lib/schemas/wheel';
import type { EdgeLogDesign } from '$lib/trade/edge-log';
import { patternRefusals } from '$lib/trade/pattern';

// The design an edge log is compared with, from the wheel's own pattern parameters (same names,
// labels and ranges as the designer and the phasing check); none given: no comparison.
export const edgeLogDesignParams = defineRegistry([
	common.pattern,
	{ ...common.teeth, required: false },
	{ ...common.missing, default: '1' },
	common.gaps,
	common.extraAfter
]);

interface DesignValues {
	pattern: 'missing' | 'custom' | 'single' | 'extra';
	teeth?: number;
	missing: number;
	extraAfter: number;
}

/** The design from the query, `undefined` when the query names none, or the first refusal per field. */
export function designFromQuery(query: URLSearchParams): Checked<EdgeLogDesign | undefined> {
	const given = givenParams(Object.fromEntries([...query].filter(([name]) => edgeLogDesignParams.get(name))));
	if (!Object.keys(given).length) return { ok: true, value: undefined };
	const found: Refusal[] = [];
	if (!('teeth' in given))
		found.push(refusal('teeth', `required to compare the log with a design, ${allows(edgeLogDesignParams.get('teeth')!, 'mm')}`));
	const read = edgeLogDesignParams.read(given, 'mm');
	if (!read.ok) found.push(...read.refusals);
	const gaps = gapsField.safeParse(given.gaps ?? '');
	if (!gaps.success) found.push(...gaps.error.issues.map((i) => refusal('gaps', i.message)));
	if (found.length || !read.ok || !gaps.success) return { ok: false, refusals: firstPerField(found) };
	const v = read.value as unknown as DesignValues;
	const pattern = patternOf({ ...v, teeth: v.teeth!, gaps: gaps.data });
	const wrong = patternRefusals(pattern).map((r) => refusal(r.field, r.message));
	return wrong.length ? { ok: false, refusals: firstPerField(wrong) } : { ok: true, value: pattern };
}
