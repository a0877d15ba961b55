// Everything a builder, fabricator and tuner read off a wheel design, in one object: what the API
// answers as JSON and what the page and the spec sheets show.
import { balanceHoles, massProperties, permissibleUnbalanceGmm, unbalanceForceN, type BalanceSuggestion } from './balance';
import { refusals, warnings, type Refusal, type Running, type Warning } from './checks';
import { patternName, pitchDeg, teethOf } from './pattern';
import type { Units } from './units';
import { valueKey } from './value-key';
import { gapOpenings, rootRadius, type WheelSpec } from './wheel';

export interface WheelSummary {
	pattern: string;
	positions: number;
	teethPresent: number;
	pitchDeg: number;
	toothWidthDeg: number;
	/** Tooth pitch frequency at the rev limit, f = N·rpm/60 (common practice), wheel on the crank. */
	pitchFrequencyHz: number;
	teeth: { position: number; leadDeg: number; trailDeg: number }[];
	gaps: { firstPosition: number; positions: number; spanDeg: number }[];
	rootDiameterMm: number;
	areaMm2: number;
	massG: number;
	unbalance: { gmm: number; heavySideDeg: number; forceAtRpmN: number; rpm: number };
	permissible: { gmm: number; grade: number; standard: 'ISO 21940-11' };
	/** Balance holes that bring the wheel within `permissible`, for the wheel without any. */
	balanceSuggestion: BalanceSuggestion | null;
	/** Why there is no suggestion, when there is none. */
	balanceNote: string | null;
	warnings: Warning[];
}

const round = (x: number, places = 4) => Math.round(x * 10 ** places) / 10 ** places;

type Summarized = { ok: true; summary: WheelSummary } | { ok: false; refusals: Refusal[] };

// The same design comes back often: a file downloaded after its summary was shown, the designer
// switched back to a value it had a moment ago. The answer depends on the values alone, so recent
// ones are kept by them (a few, then start afresh). Summaries are values: nobody changes one.
const recent = new Map<string, Summarized>();
const recentLimit = 64;

export function summarize(spec: WheelSpec, units: Units, running: Running): Summarized {
	const key = valueKey([spec, units, running]);
	let s = recent.get(key);
	if (!s) {
		if (recent.size >= recentLimit) recent.clear();
		recent.set(key, (s = summarizeAnew(spec, units, running)));
	}
	return s;
}

function summarizeAnew(spec: WheelSpec, units: Units, running: Running): Summarized {
	const refused = refusals(spec, units);
	if (refused.length) return { ok: false, refusals: refused };
	const pitch = pitchDeg(spec.pattern.teeth);
	const teeth = teethOf(spec.pattern, spec.duty);
	const mass = massProperties(spec);
	const bare = spec.balanceHoles ? massProperties({ ...spec, balanceHoles: null }) : mass;
	const advice = balanceHoles(spec, running, units, bare);
	const permissible = permissibleUnbalanceGmm(running.gradeMmS, mass.massG / 1000, running.rpm);
	return {
		ok: true,
		summary: {
			pattern: patternName(spec.pattern),
			positions: spec.pattern.teeth,
			teethPresent: teeth.length,
			pitchDeg: round(pitch),
			toothWidthDeg: round(spec.duty * pitch),
			pitchFrequencyHz: round((spec.pattern.teeth * running.rpm) / 60, 1),
			teeth: teeth.map((t) => ({ position: t.position, leadDeg: round(t.leadDeg), trailDeg: round(t.trailDeg) })),
			// Each gap spans (M + 1)·p − one tooth width, trailing edge to leading edge.
			gaps: gapOpenings(spec).map((g) => ({ firstPosition: g.first, positions: g.count, spanDeg: round(g.toDeg - g.fromDeg) })),
			rootDiameterMm: round(2 * rootRadius(spec)),
			areaMm2: round(mass.areaMm2, 2),
			massG: round(mass.massG, 2),
			unbalance: {
				gmm: round(mass.unbalanceGmm, 2),
				heavySideDeg: round(mass.heavyDeg, 1),
				forceAtRpmN: round(unbalanceForceN(mass.unbalanceGmm, running.rpm), 2),
				rpm: running.rpm
			},
			permissible: { gmm: round(permissible, 2), grade: running.gradeMmS, standard: 'ISO 21940-11' },
			balanceSuggestion: advice.ok ? advice.holes : null,
			balanceNote: advice.ok ? null : advice.reason,
			warnings: warnings(spec, units, running, mass)
		}
	};
}
