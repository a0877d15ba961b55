// What makes a wheel impossible (refused, naming the field and the range that would work) and
// what makes it risky (warned, with the reason and where on the wheel).
import { patternRefusals, pitchDeg } from './pattern';
import { permissibleUnbalanceGmm, unbalanceForceN, type MassProperties } from './balance';
import { deg, formatLength, type Units } from './units';
import { circleClear, clearOfHole, clearOfLabel, holeBand } from './clearance';
import { etchRingRefusal } from './etch-ring';
import { characterName, labelShape, missingCharacters } from './label';
import {
	clearanceMm,
	gapOpenings,
	holeCenters,
	innerRadius,
	minLabelHeightMm,
	placeLabel,
	rootRadius,
	type HoleCircle,
	type WheelSpec
} from './wheel';

export interface Refusal {
	field: string;
	message: string;
}

export interface Warning {
	code: string;
	message: string;
	/** Wheel degrees the warning is about, for highlighting on the drawing. */
	atDeg?: number[];
}

/** Tooth tips and depth a typical 12 mm Hall or VR sensor wants (from memory; check the sensor's data sheet). */
export const sensorNeeds = { toothWidthMm: 3, toothDepthMm: 3 };

const fillet = (radius: number, rho: number, convex: boolean) =>
	rho <= 0 ? 0 : deg(Math.asin(rho / (convex ? radius - rho : radius + rho)));

/** The largest value in (0, hi] for which `fits` holds, by bisection (fits is monotone). */
function largest(fits: (v: number) => boolean, hi: number): number {
	let lo = 0;
	for (let i = 0; i < 40; i++) {
		const mid = (lo + hi) / 2;
		if (fits(mid)) lo = mid;
		else hi = mid;
	}
	return lo;
}

function holeRefusals(spec: WheelSpec, holes: HoleCircle, prefix: 'bolt' | 'balance', units: Units): Refusal[] {
	const out: Refusal[] = [];
	const [lo, hi] = holeBand(spec, holes.holeMm);
	const [lowPcd, highPcd] = [2 * lo, 2 * hi];
	const field = prefix === 'bolt' ? 'pcd' : 'balancePcd';
	const size = prefix === 'bolt' ? 'boltHole' : 'balanceHole';
	const clear = formatLength(clearanceMm, units);
	if (lowPcd > highPcd) {
		out.push({
			field: size,
			message: `${size}: at most ${formatLength(Math.max(0, rootRadius(spec) - innerRadius(spec) - 2 * clearanceMm), units)}, to fit between the bore (with its keyway) and the tooth roots with ${clear} to spare on each side`
		});
	} else if (holes.pcdMm < lowPcd - 1e-9 || holes.pcdMm > highPcd + 1e-9) {
		out.push({
			field,
			message: `${field}: ${formatLength(lowPcd, units)} to ${formatLength(highPcd, units)}, so the holes keep ${clear} from the bore, keyway and tooth roots`
		});
	}
	if (holes.count > 1 && !circleClear(spec, holes)) {
		const count = prefix === 'bolt' ? 'bolts' : 'balanceCount';
		out.push({
			field: count,
			message: `${count}: the holes come closer than ${clear} to each other; use fewer or smaller holes, or a larger pitch circle`
		});
	}
	const label = placeLabel(spec);
	if (label && holeCenters(spec, holes).some((c) => !clearOfLabel(c, holes.holeMm, label))) {
		out.push({
			field,
			message: `${field}: the ${prefix} holes come closer than ${clear} to the etched label; move them (another pitch circle or angle) or shorten the label`
		});
		out.push({
			field: 'label',
			message: `label: ${prefix} holes come closer than ${clear} to it; shorten it, or move the holes (their pitch circle or angle)`
		});
	}
	return out;
}

/** Refusals for a wheel that cannot be made; empty when it can. */
export function refusals(spec: WheelSpec, units: Units): Refusal[] {
	const out: Refusal[] = [];
	const p = spec.pattern;
	const N = p.teeth;
	out.push(...patternRefusals(p));
	if (p.kind === 'extra' && spec.duty >= 0.5)
		out.push({ field: 'duty', message: 'duty: below 0.5 on an N+1 wheel, so the extra tooth fits between two regular ones' });
	const missingChars = missingCharacters(spec.label);
	if (missingChars.length) {
		out.push({
			field: 'label',
			message: `label: the etching font has no ${missingChars.map(characterName).join(', ')}; use letters, digits and signs of Latin scripts`
		});
	}
	if (out.length) return out;

	const R = spec.odMm / 2;
	const inner = innerRadius(spec);
	if (spec.keyway && spec.keyway.widthMm >= spec.boreMm) {
		out.push({ field: 'keyWidth', message: `keyWidth: less than the bore (${formatLength(spec.boreMm, units)})` });
	}
	const tip = Math.max(spec.tipRadiusMm, 0);
	const maxDepth = R - inner - clearanceMm - tip;
	// Teeth and bore compete for the same web. When the bore alone already reaches the roots and the
	// teeth are ordinary (no deeper than half the radius), the bore is what to change; a deep tooth,
	// or a keyway's corners reaching past a bore that fits, stay the depth's.
	const boreReaches = spec.boreMm / 2 > R - clearanceMm - tip - spec.depthMm;
	if (spec.depthMm >= maxDepth && boreReaches && spec.depthMm <= (R - tip) / 2) {
		const boreFits = (b: number) => spec.depthMm < R - innerRadius({ ...spec, boreMm: b }) - clearanceMm - tip;
		const most = boreFits(0) ? largest(boreFits, spec.odMm) : 0;
		out.push({
			field: 'bore',
			message: `bore: at most ${formatLength(most, units)}${spec.keyway ? ' with this keyway' : ''} for ${formatLength(spec.depthMm, units)} deep teeth, so the tooth roots keep ${formatLength(clearanceMm, units)} from it; or make the teeth shallower`
		});
		return out;
	}
	if (spec.depthMm >= maxDepth) {
		out.push({
			field: 'depth',
			message: `depth: more than 0 and less than ${formatLength(Math.max(0, maxDepth), units)}, so the tooth roots keep ${formatLength(clearanceMm, units)} from the bore and keyway`
		});
		return out;
	}
	const r = rootRadius(spec);
	const pitch = pitchDeg(N);
	const toothDeg = spec.duty * pitch;
	const gapDeg = pitch - toothDeg; // narrowest space between two teeth
	const extraGap = p.kind === 'extra' ? pitch / 2 - toothDeg : gapDeg;
	const flankOk = (tip: number, root: number) => {
		const a = tip > 0 ? (R - tip) * Math.cos(Math.asin(tip / (R - tip))) : R;
		const b = root > 0 ? (r + root) * Math.cos(Math.asin(root / (r + root))) : r;
		return a - b > 0;
	};
	const tipFits = (rho: number) => 2 * fillet(R, rho, true) < toothDeg * 0.98 && flankOk(rho, spec.rootRadiusMm) && rho < R / 2;
	const rootFits = (rho: number) => 2 * fillet(r, rho, false) < Math.min(gapDeg, extraGap) * 0.98 && flankOk(spec.tipRadiusMm, rho);
	if (spec.tipRadiusMm > 0 && !tipFits(spec.tipRadiusMm)) {
		out.push({
			field: 'tipRadius',
			message: `tipRadius: 0 to ${formatLength(largest(tipFits, spec.depthMm), units)} for teeth this narrow and deep`
		});
	}
	if (spec.rootRadiusMm > 0 && !rootFits(spec.rootRadiusMm)) {
		out.push({
			field: 'rootRadius',
			message: `rootRadius: 0 to ${formatLength(largest(rootFits, spec.depthMm), units)} for gaps this narrow`
		});
	}
	if (labelShape(spec.label) && !placeLabel(spec)) {
		out.push({
			field: 'label',
			message: `label: no room to etch it at least ${formatLength(minLabelHeightMm, units)} high between the bore (with its keyway) and the tooth roots; shorten it or leave it empty`
		});
	}
	const ring = etchRingRefusal(spec, units);
	if (ring) out.push({ field: 'etchRing', message: `etchRing: ${ring}` });
	if (spec.bolts) out.push(...holeRefusals(spec, spec.bolts, 'bolt', units));
	if (spec.balanceHoles) out.push(...holeRefusals(spec, spec.balanceHoles, 'balance', units));
	if (spec.bolts && spec.balanceHoles) {
		// The two circles are checked apart above; a balance hole may still land on a bolt hole.
		const [bolts, balance] = [holeCenters(spec, spec.bolts), holeCenters(spec, spec.balanceHoles)];
		const [b, h] = [spec.bolts.holeMm, spec.balanceHoles.holeMm];
		if (balance.some((p) => bolts.some((q) => !clearOfHole(p, h, q, b)))) {
			out.push({
				field: 'balancePcd',
				message: `balancePcd: the balance holes come closer than ${formatLength(clearanceMm, units)} to the bolt holes; put them on another pitch circle or turn them to another angle`
			});
		}
	}
	// One message per field: the answer keys them by field.
	return out.filter((r, i) => out.findIndex((o) => o.field === r.field) === i);
}

export interface Running {
	rpm: number;
	gradeMmS: number;
}

/** Warnings for a wheel that can be made (call after `refusals` came back empty). */
export function warnings(spec: WheelSpec, units: Units, running: Running, mass: MassProperties): Warning[] {
	const out: Warning[] = [];
	const R = spec.odMm / 2;
	const r = rootRadius(spec);
	const pitch = pitchDeg(spec.pattern.teeth);
	const tipWidth = (R * spec.duty * pitch * Math.PI) / 180;
	const rootGap = (r * (1 - spec.duty) * pitch * Math.PI) / 180;
	const web = r - innerRadius(spec);
	const t = spec.thicknessMm;
	const thick = formatLength(t, units);
	if (tipWidth < t) {
		out.push({
			code: 'tooth-narrow-for-cutting',
			message: `Tooth tips are ${formatLength(tipWidth, units)} wide, narrower than the ${thick} material: a laser or waterjet holds features narrower than the thickness poorly (common cutting practice).`
		});
	}
	if (rootGap < t) {
		out.push({
			code: 'gap-narrow-for-cutting',
			message: `The space between teeth is ${formatLength(rootGap, units)} at the root, narrower than the ${thick} material (common cutting practice: keep slots at least as wide as the thickness).`
		});
	}
	if (web < t) {
		out.push({
			code: 'web-thin',
			message: `Only ${formatLength(web, units)} of material between the bore or keyway and the tooth roots, less than the ${thick} thickness: the wheel may bend or crack there.`
		});
	}
	if (tipWidth < sensorNeeds.toothWidthMm) {
		out.push({
			code: 'tooth-narrow-for-sensor',
			message: `Tooth tips (${formatLength(tipWidth, units)}) are narrower than the ${formatLength(sensorNeeds.toothWidthMm, units)} a typical 12 mm Hall or VR sensor face wants (from memory; check your sensor's data sheet).`
		});
	}
	if (spec.depthMm < sensorNeeds.toothDepthMm) {
		out.push({
			code: 'tooth-shallow-for-sensor',
			message: `Teeth ${formatLength(spec.depthMm, units)} deep are shallower than the ${formatLength(sensorNeeds.toothDepthMm, units)} a typical sensor needs to see a clean edge (from memory; check the data sheet).`
		});
	}
	const permissible = permissibleUnbalanceGmm(running.gradeMmS, mass.massG / 1000, running.rpm);
	if (mass.unbalanceGmm > permissible) {
		const gaps = gapOpenings(spec).map((g) => (g.fromDeg + g.toDeg) / 2);
		out.push({
			code: 'unbalanced',
			message: `Unbalance ${mass.unbalanceGmm.toFixed(1)} g·mm exceeds the ${permissible.toFixed(1)} g·mm ISO 21940-11 allows for G ${running.gradeMmS} at ${running.rpm} rpm (${unbalanceForceN(mass.unbalanceGmm, running.rpm).toFixed(1)} N of shaking force there). Add balance holes, or balance the assembly.`,
			atDeg: gaps
		});
	}
	return out;
}
