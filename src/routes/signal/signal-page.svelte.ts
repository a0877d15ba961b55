import { byField, refusal, type Checked, type Refusal } from '$lib/schemas/refusal';
import type { Params } from '$lib/schemas/registry';
import type { ParsedSignal } from '$lib/schemas/signal';
import { caseFields, checkSignalCases } from '$lib/schemas/signal-cases';
import { layouts } from '$lib/trade/engine';
import { patternName } from '$lib/trade/pattern';
import { defaultCases, signalCheck, type SignalCheck } from '$lib/trade/signal';
import { sensorTrace } from '$lib/trade/signal-sensor';
import type { Units } from '$lib/trade/units';
import type { EngineForm } from '$lib/components/engine/tool-form';
import { defOf, formStart, labelOf, signalSent } from './form-query';
import type { TraceSample } from './spaces-chart';

// The signal page's state: the form's flat strings, what they send, and the one check the API also
// runs (checkSignal, then signalCheck) with its refusals by field. It runs on every change.

type Outcome = { ok: true; parsed: ParsedSignal; result: SignalCheck } | { ok: false; refusals: Refusal[] };

const unchecked = 'These numbers could not be checked. Undo the last change, or start over.';

/** A check that throws on numbers nobody foresaw says so on the form instead of breaking the page. */
function safely<T>(check: () => Checked<T>): Checked<T> {
	try {
		return check();
	} catch {
		return { ok: false, refusals: [refusal('form', unchecked)] };
	}
}

/** A refusal said away from its field: with the field's label, unless it is about the whole form. */
const loose = (r: Refusal) => (r.field === 'form' ? r.message : `${defOf(r.field)?.label ?? r.field}: ${r.message}`);

export class SignalPage implements EngineForm {
	params: Params = $state({});
	readonly idPrefix = 'signal';
	readonly defOf = defOf;
	readonly labelOf = labelOf;
	/** The speed case the pictures show. */
	chosenCase = $state('cranking');

	constructor(initial: Params) {
		this.params = { ...initial };
	}

	readonly units: Units = 'mm';
	readonly custom = $derived(this.params.layout === 'custom');
	readonly vtwin = $derived(this.params.layout === 'v-twin');

	readonly sent = $derived(signalSent(this.params));
	readonly query = $derived(new URLSearchParams(this.sent).toString());

	readonly outcome: Outcome = $derived.by(() => {
		const checked = safely(() => checkSignalCases(this.sent));
		if (!checked.ok) return checked;
		try {
			return { ok: true, parsed: checked.value, result: signalCheck(checked.value.input) };
		} catch {
			return { ok: false, refusals: [refusal('form', unchecked)] };
		}
	});
	readonly errors = $derived(byField(this.outcome.ok ? [] : this.outcome.refusals));
	err = (field: string) => this.errors[field];
	readonly good = $derived(this.outcome.ok ? this.outcome : null);
	readonly result = $derived(this.good?.result ?? null);
	readonly input = $derived(this.good?.parsed.input ?? null);
	readonly pattern = $derived(this.input ? patternName(this.input.pattern) : null);

	/** Refusals with no field of their own on the form. */
	readonly looseErrors = $derived(
		(this.outcome.ok ? [] : this.outcome.refusals)
			.filter((r) => r.field === 'form' || !defOf(r.field) || (!this.custom && (r.field === 'intervals' || r.field === 'stroke')))
			.map(loose)
	);

	/** The case the pictures show: the one chosen, else the tightest. */
	readonly shown = $derived.by(() => {
		const cases = this.result?.cases ?? [];
		return cases.find((c) => c.case.id === this.chosenCase) ?? [...cases].sort((a, b) => a.syncMargin - b.syncMargin)[0] ?? null;
	});

	/** The sensor's output over the shown case's first wheel turn and a little more, so the gap shows once whole. */
	readonly trace: TraceSample[] = $derived.by(() => {
		const { input, shown } = this;
		if (!input || !shown) return [];
		return sensorTrace(input, shown.case, 1).map((s) => ({ tMs: s.t * 1000, level: s.v }));
	});

	/** What an empty case field stands for: the default case's value (defaultCases, from memory), shown as the placeholder. */
	readonly caseDefaults = $derived.by(() => {
		const input = this.input;
		if (!input) return {} as Record<string, string>;
		const cranking = input.cases.find((c) => c.id === 'cranking')?.rpm ?? 200;
		const limit = input.cases.find((c) => c.id === 'rev-limit')?.rpm ?? 8000;
		const defaults = defaultCases(input, cranking, limit);
		return Object.fromEntries(
			caseFields.flatMap((f) => {
				const c = defaults.find((d) => d.id === f.id);
				return c
					? [
							[f.rpm, String(c.rpm)],
							[f.swing, String(c.swingPct)],
							[f.accel, String(c.accelRpmPerS)]
						]
					: [];
			})
		) as Record<string, string>;
	});

	/** The wheel's pattern as POST /api/v1/signal/log takes it, to read a recorded log against. */
	readonly logDesign = $derived.by(() => {
		if (!this.good) return null;
		return Object.fromEntries(
			['pattern', 'teeth', 'missing', 'gaps', 'extraAfter'].filter((k) => this.sent[k] !== undefined).map((k) => [k, this.sent[k]!])
		);
	});

	/** Puts a clocking from the sweep into the check's own field. */
	tryClocking = (toothAtTdc: number) => {
		this.params.input = 'tooth';
		this.params.toothAtTdc = String(toothAtTdc);
	};

	chooseLayout = (id: string) => {
		const params = this.params;
		if (id === 'custom' && !(params.intervals ?? '').trim()) {
			// Start the custom intervals from the preset that was chosen.
			const preset = layouts.find((l) => l.id === params.layout);
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
