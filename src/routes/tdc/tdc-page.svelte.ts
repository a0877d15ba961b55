import { convertLengths, type SwitchMemory } from '$lib/params';
import { byField } from '$lib/schemas/refusal';
import { checkTdc, tdcRegistry } from '$lib/schemas/tdc';
import type { Rotation } from '$lib/trade/hub';
import { spreadFromRim, tdcAdvice, type Scale, type TdcAdvice } from '$lib/trade/tdc';
import { formatLength, type Units } from '$lib/trade/units';
import { tdcSent, type Params, type TdcMode } from './sent';

// The TDC page's state: the form's strings as typed (the public names of /api/v1/tdc), which
// measurement they are, and the answer of the TDC finder's one check.

export type TdcOutcome =
	| {
			ok: true;
			kind: 'marks';
			a: number;
			b: number;
			scale: Scale;
			delta: number;
			tdcDeg: number;
			spreadDeg: number;
			halfSpreadDeg: number;
			advice: TdcAdvice;
	  }
	| { ok: true; kind: 'rim'; spreadDeg: number; halfSpreadDeg: number; fromEitherMarkMm: number }
	| { ok: false; errors: Record<string, string> };

const lengthFields = tdcRegistry.params.filter((p) => p.kind === 'length').map((p) => p.name);

export class TdcPage {
	params = $state<Params>({});
	mode = $state<TdcMode>('marks');

	constructor(start: Params, mode: TdcMode) {
		this.reset(start, mode);
	}

	reset(next: Params, mode: TdcMode) {
		Object.assign(this.params, next);
		this.mode = mode;
	}

	units: Units = $derived(this.params.units === 'in' ? 'in' : 'mm');
	scale: Scale = $derived(this.params.scale === 'full' ? 'full' : this.params.scale === 'quadrant' ? 'quadrant' : 'signed');
	rotation: Rotation = $derived(this.params.rotation === 'ccw' ? 'ccw' : 'cw');

	/** What the unit switches wrote over, so switching back gives the lengths as typed (`1/8`). */
	#switchMemory: SwitchMemory = {};

	setUnits(next: string) {
		const to: Units = next === 'in' ? 'in' : 'mm';
		if (to === this.units) return;
		Object.assign(this.params, convertLengths(this.params, lengthFields, this.units, to, this.#switchMemory));
		this.params.units = to;
	}

	sent = $derived(tdcSent(this.params, this.mode));

	outcome: TdcOutcome = $derived.by(() => {
		const found = checkTdc(this.sent);
		if (!found.ok) return { ok: false, errors: byField(found.refusals) };
		if (found.value.kind === 'rim') return { ok: true, kind: 'rim', ...spreadFromRim(found.value.distanceMm, found.value.diameterMm) };
		const { marks, result } = found.value;
		const advice = tdcAdvice(result.tdcDeg, marks.scale, {
			rotation: marks.rotation ?? undefined,
			diameterMm: marks.diameterMm ?? undefined,
			lengthText: (mm) => formatLength(mm, this.units)
		});
		const { tdcDeg, spreadDeg, halfSpreadDeg, deltaDeg: delta } = result;
		return {
			ok: true,
			kind: 'marks',
			a: marks.a.atdcDeg,
			b: marks.b.atdcDeg,
			scale: marks.scale,
			delta,
			tdcDeg,
			spreadDeg,
			halfSpreadDeg,
			advice
		};
	});

	/** Nothing typed yet is not an error to shout about. */
	untouched = $derived(
		this.mode === 'marks'
			? !this.params.a?.trim() && !this.params.b?.trim()
			: !this.params.distance?.trim() && !this.params.diameter?.trim()
	);

	/** A field's refusal as it stands beside the field, which the page calls by its label. */
	err(field: string): string | undefined {
		if (this.untouched || this.outcome.ok) return undefined;
		return this.outcome.errors[field]?.replace(/\bfrom a;/, 'from the first mark;').replace(/^both readings/, 'Both readings');
	}
}
