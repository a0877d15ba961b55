// Tooth patterns. A wheel has N equally spaced tooth positions (pitch p = 360/N, the missing
// positions counted: 36-1 -> 10°, 60-2 -> 6°; common practice). Position 0 is the first tooth
// after the gap; tooth k's leading edge is k*p after position 0's, in the sense of rotation.

export type Pattern =
	| { kind: 'missing'; teeth: number; missing: number }
	| { kind: 'custom'; teeth: number; missingPositions: number[] }
	| { kind: 'single'; teeth: number }
	| { kind: 'extra'; teeth: number; extraAfter: number };

export interface Tooth {
	/** Position number on the N grid; an extra (cam-sync) tooth has position k + 0.5. */
	position: number;
	/** Leading and trailing edges, degrees after position 0's leading edge, in the rotation sense. */
	leadDeg: number;
	trailDeg: number;
}

export const pitchDeg = (teeth: number) => 360 / teeth;

/** The positions left empty by a pattern. */
export function missingPositions(p: Pattern): number[] {
	switch (p.kind) {
		case 'missing':
			return Array.from({ length: p.missing }, (_, i) => p.teeth - p.missing + i);
		case 'custom':
			return [...new Set(p.missingPositions)].sort((a, b) => a - b);
		case 'single':
			return Array.from({ length: p.teeth - 1 }, (_, i) => i + 1);
		case 'extra':
			return [];
	}
}

/** Every tooth present, in rotation order, each `duty` of a pitch wide. */
export function teethOf(p: Pattern, duty: number): Tooth[] {
	const pitch = pitchDeg(p.teeth);
	const width = duty * pitch;
	const gone = new Set(missingPositions(p));
	const teeth: Tooth[] = [];
	for (let k = 0; k < p.teeth; k++) {
		if (!gone.has(k)) teeth.push({ position: k, leadDeg: k * pitch, trailDeg: k * pitch + width });
		// The extra tooth of an N+1 cam wheel sits half-way between two regular ones.
		if (p.kind === 'extra' && k === p.extraAfter) {
			teeth.push({ position: k + 0.5, leadDeg: (k + 0.5) * pitch, trailDeg: (k + 0.5) * pitch + width });
		}
	}
	return teeth;
}

/** The usual N-M name: 36-1, 60-2, 24-2+1 ... */
export function patternName(p: Pattern): string {
	switch (p.kind) {
		case 'missing':
			return `${p.teeth}-${p.missing}`;
		case 'custom':
			return `${p.teeth}-${missingPositions(p).length} (gaps at ${missingPositions(p).join(', ')})`;
		case 'single':
			return `1 tooth (${p.teeth}-position width)`;
		case 'extra':
			return `${p.teeth}+1`;
	}
}

/** Runs of consecutive missing positions (wrapping), as [first, count]: the gaps a sensor sees. */
export function gapsOf(p: Pattern): { first: number; count: number }[] {
	const gone = new Set(missingPositions(p));
	if (gone.size === 0 || gone.size === p.teeth) return gone.size ? [{ first: 0, count: p.teeth }] : [];
	const gaps: { first: number; count: number }[] = [];
	for (let k = 0; k < p.teeth; k++) {
		if (gone.has(k) && !gone.has((k - 1 + p.teeth) % p.teeth)) {
			let count = 0;
			while (gone.has((k + count) % p.teeth)) count++;
			gaps.push({ first: k, count });
		}
	}
	return gaps;
}

/** What makes a pattern impossible, as [field, message] with the public parameter names; empty when it is fine. */
export function patternRefusals(p: Pattern): { field: string; message: string }[] {
	const N = p.teeth;
	if (p.kind === 'missing' && p.missing >= N)
		return [{ field: 'missing', message: `missing: at most ${N - 1}, so that a tooth is left of the ${N} positions` }];
	if (p.kind === 'custom') {
		const bad = p.missingPositions.filter((k) => k < 0 || k >= N || !Number.isInteger(k));
		if (bad.length) return [{ field: 'gaps', message: `gaps: positions 0 to ${N - 1} (got ${bad.join(', ')})` }];
		if (missingPositions(p).length >= N)
			return [{ field: 'gaps', message: `gaps: at least one of the ${N} positions must keep its tooth` }];
	}
	if (p.kind === 'extra' && (p.extraAfter < 0 || p.extraAfter >= N)) return [{ field: 'extraAfter', message: `extraAfter: 0 to ${N - 1}` }];
	return [];
}

/**
 * The open arc of a gap of `count` missing positions, in degrees: from the trailing edge of the
 * tooth before it to the leading edge of the tooth after it, (count + 1) pitches less one tooth
 * width (design.md, "Trade math": geometry). `gapOpenings` in wheel.ts spans the same arc.
 */
export const gapSpanDeg = (teeth: number, count: number, duty: number) => (count + 1 - duty) * pitchDeg(teeth);
