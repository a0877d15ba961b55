import type { UndoOffer } from '$lib/components/ui/UndoNotice.svelte';
import { convertLengths, type SwitchMemory } from '$lib/params';
import { byField } from '$lib/schemas/refusal';
import { checkTape, tapeRegistry, type CheckedTape } from '$lib/schemas/tape';
import { checkCurvePoint, checkTimingCard } from '$lib/schemas/timing-card';
import { mmPerDegree, tapeLengthMm, tapeStrips, tapeWarnings } from '$lib/trade/tape';
import { exampleCurve, timingRows } from '$lib/trade/timing';
import type { Units } from '$lib/trade/units';
import { cardSent, curveRows, curveText, tapeSent, type CurveRow, type HubBy, type Params } from './sent';

// The tape page's state: the form's strings as typed (the public names of /api/v1/tape), the
// table of the timing-light card, and what follows from them through the tools' own checks.

const lengthFields = tapeRegistry.params.filter((p) => p.kind === 'length').map((p) => p.name);
const exampleRows = (): CurveRow[] => exampleCurve.map((p) => ({ rpm: String(p.rpm), advance: String(p.advanceDeg) }));
export const exampleCurveText = curveText(exampleRows());
const hubOf = (p: Params): HubBy => (p.diameter === undefined && p.circumference !== undefined ? 'circumference' : 'diameter');

export class TapePage {
	params = $state<Params>({});
	/** Which of the two hub sizes is given; the other is kept for switching back, not sent. */
	hubBy = $state<HubBy>('diameter');
	/** The timing-light card's rpm → advance table, as typed. */
	rows = $state<CurveRow[]>([]);

	constructor(start: Params) {
		this.reset(start);
	}

	/** Starts again from a page's parameters (a link to the page from the page starts afresh). */
	reset(next: Params) {
		for (const key of Object.keys(this.params)) delete this.params[key];
		Object.assign(this.params, next);
		this.hubBy = hubOf(next);
		this.rows = next.curve ? curveRows(next.curve) : exampleRows();
	}

	units: Units = $derived(this.params.units === 'in' ? 'in' : 'mm');

	/** What the unit switches wrote over, so switching back gives the lengths as typed (`1/8`). */
	#switchMemory: SwitchMemory = {};

	setUnits(next: string) {
		const to: Units = next === 'in' ? 'in' : 'mm';
		if (to === this.units) return;
		Object.assign(this.params, convertLengths(this.params, lengthFields, this.units, to, this.#switchMemory));
		this.params.units = to;
	}

	#windowBefore = '60';
	setWindowMode(mode: string) {
		if (mode === 'full') {
			if (this.params.window && this.params.window !== 'full') this.#windowBefore = this.params.window;
			this.params.window = 'full';
		} else this.params.window = this.#windowBefore;
	}

	tapeParams = $derived(tapeSent(this.params, this.hubBy));
	curve = $derived(curveText(this.rows));
	cardParams = $derived(cardSent(this.params, this.hubBy, this.curve));
	/** The address: the tape, and the curve when it is not the example's. */
	pageQuery = $derived(
		new URLSearchParams({ ...this.tapeParams, ...(this.curve !== exampleCurveText ? { curve: this.curve } : {}) }).toString()
	);

	outcome = $derived(checkTape(this.tapeParams));
	errors: Record<string, string> = $derived(this.outcome.ok ? {} : byField(this.outcome.refusals));
	/** Each refusal with its field's label, for the list under the drawing. */
	refusalLines = $derived(
		Object.entries(this.errors).map(([field, message]) => `${field === 'form' ? 'Tape' : tapeRegistry.label(field)}: ${message}`)
	);

	#lastGood: CheckedTape | null = null;
	/** The last tape that could be made: shown greyed while the current one cannot. */
	shown = $derived.by(() => {
		if (this.outcome.ok) this.#lastGood = this.outcome.value;
		return this.#lastGood;
	});

	numbers = $derived.by(() => {
		if (!this.outcome.ok) return null;
		const { spec, paper } = this.outcome.value;
		const strips = tapeStrips(spec, paper);
		return {
			perDegreeMm: mmPerDegree(spec),
			lengthMm: tapeLengthMm(spec),
			hubDiameterMm: spec.hubDiameterMm,
			strips: strips.length,
			pages: strips.at(-1)!.page,
			warnings: tapeWarnings(spec)
		};
	});

	// The timing-light card.
	rowProblems = $derived(this.rows.map((r) => (r.rpm.trim() === '' && r.advance.trim() === '' ? {} : byField(checkPoint(r)))));
	card = $derived(checkTimingCard(this.cardParams));
	/** Each good row worked out on this tape, even while another row still needs fixing. */
	cardRows = $derived.by(() => {
		if (this.card.ok) return timingRows(this.card.value.points, { ...this.card.value.hub, rotation: this.card.value.rotation });
		if (!this.outcome.ok) return [];
		const points = this.rows.flatMap((r) => {
			const p = checkCurvePoint(r.rpm, r.advance);
			return p.ok ? [p.value] : [];
		});
		return timingRows(points, this.outcome.value.spec);
	});
	/** The whole curve's refusal, when no row says it already. */
	curveError = $derived(!this.card.ok && !this.rowProblems.some((p) => p.rpm || p.advance) ? byField(this.card.refusals).curve : undefined);
	cardWindow = $derived(this.outcome.ok ? this.outcome.value.spec.windowDeg : 180);

	addRow() {
		const last = this.rows.at(-1);
		const rpm = last && /^\d+$/.test(last.rpm) ? String(Number(last.rpm) + 1000) : '';
		this.rows.push({ rpm, advance: last?.advance ?? '' });
	}
	removeRow(i: number) {
		this.rows.splice(i, 1);
	}
	/** Going back to the example throws the typed curve away: the offer to put it back. */
	curveReset = $state<UndoOffer | null>(null);

	resetCurve() {
		const before = this.rows.map((r) => ({ ...r }));
		this.rows = exampleRows();
		this.curveReset = { message: 'The example curve is back.', undo: () => (this.rows = before) };
	}
}

const checkPoint = (r: CurveRow) => {
	const p = checkCurvePoint(r.rpm, r.advance);
	return p.ok ? [] : p.refusals;
};
