// What makes a wheel impossible (refused, naming the field and the range that would work) and
// what makes it risky (warned, with the reason and where on the wheel).
import { patternRefusals, pitchDeg } from './pattern';
import { permissibleUnbalanceGmm, unbalanceForceN, type MassProperties } from './balance';
import { deg, formatLength, type Units } from './units';
import { gapOpenings, holeCenters, rootRadius, type HoleCircle, type WheelSpec } from './wheel';

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

/** Smallest web, bolt-hole edge or flank left standing that we still draw, mm. */
const minMaterialMm = 0.5;

const fillet = (radius: number, rho: number, convex: boolean) => (rho <= 0 ? 0 : deg(Math.asin(rho / (convex ? radius - rho : radius + rho))));

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

/** How far the bore reaches: with a keyway, out to the slot's outer corners (the slot's depth is measured on its centre line). */
const innerRadius = (spec: WheelSpec) =>
	spec.keyway ? Math.hypot(spec.boreMm / 2 + spec.keyway.depthMm, spec.keyway.widthMm / 2) : Math.max(spec.boreMm / 2, 0);

function holeRefusals(spec: WheelSpec, holes: HoleCircle, prefix: 'bolt' | 'balance', units: Units): Refusal[] {
	const out: Refusal[] = [];
	const inner = innerRadius(spec) + minMaterialMm;
	const outer = rootRadius(spec) - minMaterialMm;
	const lowPcd = 2 * (inner + holes.holeMm / 2);
	const highPcd = 2 * (outer - holes.holeMm / 2);
	const field = prefix === 'bolt' ? 'pcd' : 'balancePcd';
	if (lowPcd > highPcd) {
		out.push({ field: prefix === 'bolt' ? 'boltHole' : 'balanceHole', message: `${prefix === 'bolt' ? 'boltHole' : 'balanceHole'}: at most ${formatLength(Math.max(0, outer - inner), units)} to fit between the bore and the tooth roots` });
	} else if (holes.pcdMm < lowPcd || holes.pcdMm > highPcd) {
		out.push({ field, message: `${field}: ${formatLength(lowPcd, units)} to ${formatLength(highPcd, units)}, so the holes cut neither the bore nor the tooth roots` });
	}
	// The closest two holes, by angle round the circle: with a given spacing the last hole can come
	// back round near the first (3 holes 165° apart: the third sits 30° before the first).
	const step = holes.spacingDeg ?? 360 / holes.count;
	const at = Array.from({ length: holes.count }, (_, i) => (((i * step) % 360) + 360) % 360).sort((a, b) => a - b);
	const closestDeg = Math.min(...at.map((a, i) => (i + 1 < at.length ? at[i + 1]! - a : at[0]! + 360 - a)));
	if (holes.count > 1 && 2 * (holes.pcdMm / 2) * Math.sin((Math.min(closestDeg, 180) * Math.PI) / 360) < holes.holeMm + minMaterialMm) {
		out.push({ field: prefix === 'bolt' ? 'bolts' : 'balanceCount', message: `${prefix === 'bolt' ? 'bolts' : 'balanceCount'}: the holes overlap; use fewer or smaller holes, or a larger pitch circle` });
	}
	return out;
}

/** Refusals for a wheel that cannot be made; empty when it can. */
export function refusals(spec: WheelSpec, units: Units): Refusal[] {
	const out: Refusal[] = [];
	const p = spec.pattern;
	const N = p.teeth;
	out.push(...patternRefusals(p));
	if (p.kind === 'extra' && spec.duty >= 0.5) out.push({ field: 'duty', message: 'duty: below 0.5 on an N+1 wheel, so the extra tooth fits between two regular ones' });
	if (out.length) return out;

	const R = spec.odMm / 2;
	const inner = innerRadius(spec);
	if (spec.keyway && spec.keyway.widthMm >= spec.boreMm) {
		out.push({ field: 'keyWidth', message: `keyWidth: less than the bore (${formatLength(spec.boreMm, units)})` });
	}
	const maxDepth = R - inner - minMaterialMm - Math.max(spec.tipRadiusMm, 0);
	if (spec.depthMm >= maxDepth) {
		out.push({ field: 'depth', message: `depth: more than 0 and less than ${formatLength(Math.max(0, maxDepth), units)}, so the tooth roots stay outside the bore and keyway` });
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
		out.push({ field: 'tipRadius', message: `tipRadius: 0 to ${formatLength(largest(tipFits, spec.depthMm), units)} for teeth this narrow and deep` });
	}
	if (spec.rootRadiusMm > 0 && !rootFits(spec.rootRadiusMm)) {
		out.push({ field: 'rootRadius', message: `rootRadius: 0 to ${formatLength(largest(rootFits, spec.depthMm), units)} for gaps this narrow` });
	}
	if (spec.bolts) out.push(...holeRefusals(spec, spec.bolts, 'bolt', units));
	if (spec.balanceHoles) out.push(...holeRefusals(spec, spec.balanceHoles, 'balance', units));
	if (spec.bolts && spec.balanceHoles) {
		// The two circles are checked apart above; a balance hole may still land on a bolt hole.
		const [bolts, balance] = [holeCenters(spec, spec.bolts), holeCenters(spec, spec.balanceHoles)];
		const clear = (spec.bolts.holeMm + spec.balanceHoles.holeMm) / 2 + minMaterialMm;
		if (balance.some((p) => bolts.some((q) => Math.hypot(p.x - q.x, p.y - q.y) < clear))) {
			out.push({ field: 'balancePcd', message: 'balancePcd: the balance holes cut into the bolt holes; put them on another pitch circle or turn them with balanceAngle' });
		}
	}
	return out;
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
		out.push({ code: 'tooth-narrow-for-cutting', message: `Tooth tips are ${formatLength(tipWidth, units)} wide, narrower than the ${thick} material: a laser or waterjet holds features narrower than the thickness poorly (common cutting practice).` });
	}
	if (rootGap < t) {
		out.push({ code: 'gap-narrow-for-cutting', message: `The space between teeth is ${formatLength(rootGap, units)} at the root, narrower than the ${thick} material (common cutting practice: keep slots at least as wide as the thickness).` });
	}
	if (web < t) {
		out.push({ code: 'web-thin', message: `Only ${formatLength(web, units)} of material between the bore or keyway and the tooth roots, less than the ${thick} thickness: the wheel may bend or crack there.` });
	}
	if (tipWidth < sensorNeeds.toothWidthMm) {
		out.push({ code: 'tooth-narrow-for-sensor', message: `Tooth tips (${formatLength(tipWidth, units)}) are narrower than the ${formatLength(sensorNeeds.toothWidthMm, units)} a typical 12 mm Hall or VR sensor face wants (from memory; check your sensor's data sheet).` });
	}
	if (spec.depthMm < sensorNeeds.toothDepthMm) {
		out.push({ code: 'tooth-shallow-for-sensor', message: `Teeth ${formatLength(spec.depthMm, units)} deep are shallower than the ${formatLength(sensorNeeds.toothDepthMm, units)} a typical sensor needs to see a clean edge (from memory; check the data sheet).` });
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
