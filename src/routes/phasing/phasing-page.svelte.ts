import { convertLengths, type SwitchMemory } from '$lib/params';
import { checkBuildSheet, checkPhasing, phasingParams, sensorDefaults, type ParsedPhasing } from '$lib/schemas/phasing';
import { byField, refusal, type Checked, type Refusal } from '$lib/schemas/refusal';
import type { Params } from '$lib/schemas/registry';
import { layouts, vAngleRange, vTwin } from '$lib/trade/engine';
import { patternName } from '$lib/trade/pattern';
import { clockingFor, phasing, type PhasingResult } from '$lib/trade/phasing';
import type { Units } from '$lib/trade/units';
import type { EngineForm } from '$lib/components/engine/tool-form';
import { defOf, formStart, labelOf, phasingSent, sheetFormKeys, sheetSent } from './form-query';

// The phasing page's state: the form's flat strings, what they send, and the one check the API
// also runs (checkPhasing, checkBuildSheet) with its refusals by field.

type Outcome = { ok: true; parsed: ParsedPhasing; result: PhasingResult } | { ok: false; refusals: Refusal[] };

/** A check that throws on numbers nobody foresaw says so on the form instead of breaking the page. */
function safely<T>(check: () => Checked<T>, message: string): Checked<T> {
	try {
		return check();
	} catch {
		return { ok: false, refusals: [refusal('form', message)] };
	}
}

export const fmt = (v: number, places = 2) => String(Number(v.toFixed(places)));

/** A refusal said away from its field: with the field's label, unless it is about the whole form. */
const loose = (r: Refusal) => (r.field === 'form' ? r.message : `${defOf(r.field)?.label ?? r.field}: ${r.message}`);

const sheetLengths = ['od', 'depth', 'thickness', 'bore', 'tapeDiameter'];

export class PhasingPage implements EngineForm {
	params: Params = $state({});
	readonly idPrefix = 'phasing';
	readonly defOf = defOf;
	readonly labelOf = labelOf;

	constructor(initial: Params) {
		this.params = { ...initial };
	}

	readonly custom = $derived(this.params.layout === 'custom');
	readonly vtwin = $derived(this.params.layout === 'v-twin');
	/** The sensor's place given by the angles measured on the engine, not by the tooth at TDC. */
	readonly byAngles = $derived(this.params.input === 'angles');

	readonly sent = $derived(phasingSent(this.params));
	readonly sheetSent = $derived(sheetSent(this.params));
	readonly query = $derived(new URLSearchParams({ ...this.sent, ...this.sheetSent }).toString());

	readonly outcome: Outcome = $derived.by(() => {
		const checked = safely(() => checkPhasing(this.sent), 'These numbers could not be checked. Undo the last change, or start over.');
		if (!checked.ok) return checked;
		try {
			return { ok: true, parsed: checked.value, result: phasing(checked.value.input) };
		} catch {
			return { ok: false, refusals: [refusal('form', 'These numbers could not be checked. Undo the last change, or start over.')] };
		}
	});
	readonly errors = $derived(byField(this.outcome.ok ? [] : this.outcome.refusals));
	// The measurement not taken yet is not an error to shout about.
	readonly measuredField = $derived(this.byAngles ? 'sensorAngle' : 'toothAtTdc');
	readonly waiting = $derived(!(this.params[this.measuredField] ?? '').trim());
	err = (field: string) => (field === this.measuredField && this.waiting ? undefined : this.errors[field]);
	/** Refusals with no field of their own on the form. */
	readonly looseErrors = $derived(
		(this.outcome.ok ? [] : this.outcome.refusals)
			.filter((r) => r.field === 'form' || r.field === 'cylinders' || (!this.custom && (r.field === 'intervals' || r.field === 'stroke')))
			.map(loose)
	);

	readonly good = $derived(this.outcome.ok ? this.outcome : null);
	readonly result = $derived(this.good?.result ?? null);
	readonly input = $derived(this.good?.parsed.input ?? null);

	readonly clocking = $derived.by(() => {
		if (!this.good?.parsed.clocking) return null;
		const { parsed } = this.good;
		const { targetDeg, keyFromSensorDeg } = parsed.clocking!;
		const keywayDeg = clockingFor(targetDeg, keyFromSensorDeg, parsed.input.mount);
		const p = parsed.input.pattern;
		// The wheel facts given for the build sheet go along to the designer too.
		const wheelFacts = Object.fromEntries(
			['units', 'od', 'depth', 'thickness', 'material', 'bore'].filter((k) => this.sheetSent[k]).map((k) => [k, this.sheetSent[k]!])
		);
		const wheelQuery =
			p.kind === 'missing' && p.missing >= 1
				? new URLSearchParams({
						teeth: String(p.teeth),
						missing: String(p.missing),
						duty: String(parsed.input.duty),
						...wheelFacts,
						keyway: 'custom',
						keywayAngle: fmt(keywayDeg, 3)
					}).toString()
				: null;
		return { targetDeg, keywayDeg, href: wheelQuery ? `/wheel?${wheelQuery}` : null };
	});

	readonly diagramLabel = $derived.by(() => {
		const { result, input, good } = this;
		if (!result || !input || !good) return 'No drawing: the phasing cannot be checked with these numbers';
		const n = result.gapClearanceDeg.length;
		return `Wheel with cylinder 1 at TDC, sensor at 12 o'clock, turning clockwise: ${patternName(input.pattern)} on the ${input.mount}, tooth ${fmt(input.toothAtTdc, 3)} at the sensor, first-tooth offset ${fmt(result.firstToothOffsetDeg)}° BTDC, ${n} cylinder${n === 1 ? '' : 's'} (${good.parsed.layoutLabel}) with their spark windows${good.parsed.measured ? ', the TDC mark and the key where they were measured' : ''}${result.gapClearanceDeg.some((c) => c.clearanceDeg === 0) ? '; the gap passes inside a spark window' : ''}`;
	});

	readonly sensorHint = $derived.by(() => {
		const vr = this.params.sensor === 'vr';
		return `Leave empty for a typical ${vr ? 'VR' : 'Hall-effect'} sensor, ${(vr ? sensorDefaults.vr : sensorDefaults.hall).toLocaleString('en')} Hz (from memory; the data sheet wins).`;
	});

	// ---- Build sheet ----
	readonly units: Units = $derived(this.params.units === 'in' ? 'in' : 'mm');

	/** What the unit switches wrote over, so switching back gives the lengths as typed (`1/8`). */
	#switchMemory: SwitchMemory = {};

	setUnits = (next: string) => {
		const from = this.units;
		const to: Units = next === 'in' ? 'in' : 'mm';
		if (to === from) return;
		Object.assign(this.params, convertLengths(this.params, sheetLengths, from, to, this.#switchMemory));
		this.params.units = to;
	};

	readonly sheetOutcome = $derived(
		safely(() => checkBuildSheet({ ...this.sent, ...this.sheetSent }), 'This build sheet could not be put together. Undo the last change.')
	);
	readonly sheetErrors = $derived(byField(this.sheetOutcome.ok ? [] : this.sheetOutcome.refusals));
	/** The sheet's fields are marked only once typed in: the two it cannot do without are said beside the link. */
	sheetErr = (field: string) => ((this.params[field] ?? '').trim() ? this.sheetErrors[field] : undefined);
	readonly sheetNeeds = $derived(
		[
			['od', 'the outside diameter'],
			['depth', 'the tooth depth']
		]
			.filter(([field]) => !(this.params[field!] ?? '').trim())
			.map(([, words]) => words!)
	);
	/** Refusals of the sheet with no field of their own here (the phasing check's are shown at theirs). */
	readonly sheetLooseErrors = $derived(
		(this.sheetOutcome.ok ? [] : this.sheetOutcome.refusals)
			.filter((r) => !sheetFormKeys.includes(r.field) && !phasingParams.get(r.field))
			.map(loose)
	);
	readonly sheetHref = $derived(`/api/v1/build-sheet.pdf?${this.query}`);

	// ---- Changes ----
	chooseLayout = (id: string) => {
		const params = this.params;
		if (id === 'custom' && !(params.intervals ?? '').trim()) {
			// Start the custom intervals from the preset that was chosen.
			const v = Number(params.vAngle);
			const preset =
				params.layout === 'v-twin'
					? (params.vAngle ?? '').trim() && v >= vAngleRange.min && v <= vAngleRange.max
						? vTwin(v)
						: undefined
					: layouts.find((l) => l.id === params.layout);
			if (preset) {
				params.intervals = preset.intervals.join(', ');
				params.stroke = String(preset.stroke);
			}
		}
		params.layout = id;
	};

	startOver = () => {
		for (const key of Object.keys(this.params)) delete this.params[key];
		Object.assign(this.params, formStart());
	};
}
