// The words and numbers of the shop drawing: what each dimension says on the view, the notes under
// it and the title block. Kept apart from the drawing so that each line can be read on its own.
import { boreFit, generalTolerance } from '$lib/trade/fits';
import { hubDimension } from '$lib/trade/keys';
import { patternName } from '$lib/trade/pattern';
import { gapPositions } from '$lib/trade/shop-drawing';
import { fromMm, type Units } from '$lib/trade/units';
import { rootRadius, type HoleCircle, type WheelSpec } from '$lib/trade/wheel';
import { markWords } from '../wheel-pdf';

/** A length as the drawing writes it, without its unit (the notes state the unit once). */
export function dim(mm: number, units: Units): string {
	return units === 'in' ? fromMm(mm, units).toFixed(3) : mm.toFixed(2);
}

/** A deviation: three decimals in mm (micrometres), four in inches. */
function deviation(mm: number, units: Units): string {
	if (mm === 0) return '0';
	const v = units === 'in' ? fromMm(mm, units).toFixed(4) : mm.toFixed(3);
	return mm > 0 ? `+${v}` : v;
}

const angle = (d: number) => `${Number(d.toFixed(2))}°`;

/** The bore's size with its fit and limits: "Ø20.00 H7 (+0.021 / 0)". */
export function boreText(spec: WheelSpec, units: Units): string | null {
	if (spec.boreMm <= 0) return null;
	const fit = boreFit(spec.boreMm);
	const size = `Ø${dim(spec.boreMm, units)}`;
	return fit ? `${size} ${fit.fit} (${deviation(fit.upperMm, units)} / ${deviation(fit.lowerMm, units)})` : size;
}

export function keywayText(spec: WheelSpec, units: Units): string | null {
	if (!spec.keyway || spec.boreMm <= 0) return null;
	const hub = hubDimension(spec.boreMm, spec.keyway);
	return `Keyway ${dim(spec.keyway.widthMm, units)} wide, ${hub.name} = ${dim(hub.mm, units)}`;
}

export function holesText(h: HoleCircle | null, units: Units): string | null {
	return h && h.count > 0 ? `${h.count} × Ø${dim(h.holeMm, units)} on PCD ${dim(h.pcdMm, units)}` : null;
}

/** Each gap's centre line from the keyway's, as the drawing shows it. */
export function gapTexts(spec: WheelSpec): string[] {
	return gapPositions(spec).map((g) =>
		g.fromKeyway
			? `Gap centre ${angle(g.fromKeyway.deg)} ${g.fromKeyway.sense} from keyway centre line, ${angle(g.widthDeg)} open`
			: `Gap centre as drawn, ${angle(g.widthDeg)} open (no keyway: the gap is set to the engine when fitted)`
	);
}

/** The notes under the view, in the order a fabricator reads them. */
export function drawingNotes(spec: WheelSpec, units: Units, dxfName: string): string[] {
	const unit = units === 'in' ? 'inches' : 'millimetres';
	const notes = [
		`Dimensions in ${unit}. General tolerances ${generalTolerance} unless stated. Cut from the DXF ${dxfName}; this drawing states its sizes and checks the part.`,
		`Outline: ${patternName(spec.pattern)}, OD Ø${dim(spec.odMm, units)}, root circle Ø${dim(2 * rootRadius(spec), units)} (tooth depth ${dim(spec.depthMm, units)}); corner radius tip ${dim(spec.tipRadiusMm, units)}, root ${dim(spec.rootRadiusMm, units)}.`
	];
	const bore = boreText(spec, units);
	const fit = boreFit(spec.boreMm);
	if (bore)
		notes.push(
			spec.keyway && fit
				? `Bore ${bore}: ${fit.fit} is the hole-basis fit for a hub on a keyed shaft, limits from ${fit.source}.`
				: `Bore ${bore}${fit ? `, limits from ${fit.source}` : ''}.`
		);
	if (spec.keyway && spec.boreMm > 0) {
		const hub = hubDimension(spec.boreMm, spec.keyway);
		notes.push(
			`${keywayText(spec, units)} (${hub.source}; ${dim(spec.keyway.depthMm, units)} deep over the bore on its centre line). Key: ${spec.keyway.source}.`
		);
	}
	const bolts = holesText(spec.bolts, units);
	if (bolts) notes.push(`Bolt holes: ${bolts}, through.`);
	const balance = holesText(spec.balanceHoles, units);
	if (balance) notes.push(`Balance holes: ${balance}, through.`);
	notes.push(...gapTexts(spec).map((g) => `${g} (seen from the drawn face).`));
	const mark = markWords(spec);
	const etched = [mark, spec.label ? `label “${spec.label}”` : null].filter((w) => w !== null);
	if (etched.length) notes.push(`Etch, do not cut through: ${etched.join('; ')}.`);
	notes.push(
		'Deburr all edges: cut parts are sharp. Keep the outline to the drawing; the gap and tooth edges set the engine’s timing. A missing-tooth wheel is out of balance by design; check it before running at speed.'
	);
	return notes;
}
