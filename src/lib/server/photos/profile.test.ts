// The ring profile to a pattern, on profiles drawn by hand here: an N-M wheel sampled round the ring
// (tooth = 1, space = 0), so N, M and the gap are the drawing's own, not the reader's.
import { describe, expect, it } from 'vitest';
import { HIGH_CONFIDENCE } from '$lib/photo-confidence';
import { localLevels, readProfile } from './profile';

/** n samples round an N-M wheel: teeth at positions 0..N-M-1, each `duty` of a pitch wide; the gap after them. */
function wheel(N: number, M: number, n = 2048, duty = 0.5, space = 0, tooth = 1): Float64Array {
	const p = n / N;
	return new Float64Array(n).map((_, i) => {
		const pos = Math.floor(i / p);
		return pos < N - M && i - pos * p < duty * p ? tooth : space;
	});
}

describe('readProfile', () => {
	it('reads a clean 36-1', () => {
		const r = readProfile(wheel(36, 1));
		if ('failure' in r) throw new Error(r.failure);
		expect([r.teeth, r.missing]).toEqual([36, 1]);
	});

	it('ends, and still reads 36-1, when short unread stretches sit between teeth and spaces (a bevelled flank on every tooth)', () => {
		// The clean-up once flipped such a stretch to its own state and never ended.
		const s = wheel(36, 1);
		const p = 2048 / 36;
		for (let pos = 0; pos < 35; pos++) {
			const edge = Math.round(pos * p + 0.5 * p);
			for (let d = 0; d < 3; d++) s[edge + d] = NaN;
		}
		const r = readProfile(s);
		if ('failure' in r) throw new Error(r.failure);
		expect([r.teeth, r.missing]).toEqual([36, 1]);
	});

	it('refuses a 36-1 seen by fewer than half its teeth, though a third of the ring was read as spaces and not as unknown', () => {
		// Drawn: teeth at positions 0..11 but 6 (the gap), not read from 11.75 to 24.25 pitches (a
		// finger, just under the 35 % of the ring that refuses on its own), spaces from there to
		// position 30 (shadow), teeth 30..35: 17 of 35 teeth seen, under half. Before this rule it read.
		const n = 3600;
		const p = n / 36;
		const s = wheel(36, 1, n).map((v, i) => {
			const pos = Math.floor(i / p);
			if (pos === 6) return 0;
			if (i >= 11.75 * p && i < 24.25 * p) return NaN;
			return pos >= 24 && pos < 30 ? 0 : pos === 35 ? (i - pos * p < 0.5 * p ? 1 : 0) : v;
		});
		expect(readProfile(s)).toEqual({ failure: 'unseen' });
	});

	it("reads 30-2 when a finger covers the teeth from the middle of the first tooth after the gap, from that tooth's flank beside the gap", () => {
		// Positions 28 and 29 missing: the gap ends where tooth 0 begins (sample 0); the cover runs
		// from half-way across tooth 0 to past tooth 2, so the gap's far side is only that tooth's flank.
		const n = 2048;
		const p = n / 30;
		const s = wheel(30, 2, n);
		for (let i = Math.round(p / 4); i < Math.round(2.7 * p); i++) s[i] = NaN;
		const r = readProfile(s);
		if ('failure' in r) throw new Error(r.failure);
		expect([r.teeth, r.missing]).toEqual([30, 2]);
		expect(r.unseen).toHaveLength(1);
		// The cut tooth's middle from its flank and a whole tooth's width: a quarter pitch in.
		const first = r.seen.find((t) => t.position === 0)!;
		expect((first.phi * n) / (2 * Math.PI)).toBeCloseTo(p / 4, -1);
	});

	it('reads two single gaps, but not as high: a tooth lost in glare makes a second gap as regular as a real one', () => {
		const n = 2048;
		const p = n / 36;
		// A 36-1 drawing with tooth 17 taken out too: gaps after positions 16 and 34.
		const s = wheel(36, 1, n).map((v, i) => (Math.floor(i / p) === 17 ? 0 : v));
		const r = readProfile(s);
		if ('failure' in r) throw new Error(r.failure);
		expect([r.teeth, r.missing, r.gaps.length]).toEqual([36, 2, 2]);
		expect(r.confidence).toBeLessThan(HIGH_CONFIDENCE);
		// The same drawing with one gap is read as high: the second gap is what lowers it.
		const one = readProfile(wheel(36, 1, n));
		if ('failure' in one) throw new Error(one.failure);
		expect(one.confidence).toBeGreaterThanOrEqual(HIGH_CONFIDENCE);
	});

	it("reads 60-2, not as high, when a thin bright line crosses its gap off the pitch (a cutting mat's grid line)", () => {
		// Drawn: the line is a fifth of a pitch wide, its middle 1.45 pitches after the last tooth's
		// middle and 1.55 before the first's (teeth are half a pitch wide, middles a quarter pitch in).
		const n = 2048;
		const p = n / 60;
		const s = wheel(60, 2, n).map((v, i) => (i >= 58.6 * p && i < 58.8 * p ? 1 : v));
		const r = readProfile(s);
		if ('failure' in r) throw new Error(r.failure);
		expect([r.teeth, r.missing]).toEqual([60, 2]);
		expect(r.confidence).toBeLessThan(HIGH_CONFIDENCE);
	});

	it("reads a run of metal four pitches wide (a bracket of the metal's shade over the teeth) as a stretch not seen", () => {
		const n = 2048;
		const p = n / 36;
		const s = wheel(36, 1, n).map((v, i) => (i >= 10 * p && i < 14.6 * p ? 1 : v));
		const r = readProfile(s);
		if ('failure' in r) throw new Error(r.failure);
		expect([r.teeth, r.missing]).toEqual([36, 1]);
		expect(r.unseen).toHaveLength(1);
		// The stretch not seen covers at least the drawn run, from position 10 to half-way across 14.
		const u = r.unseen[0]!;
		expect(u.from).toBeLessThanOrEqual((2 * Math.PI * 10 * p) / n + 1e-9);
		expect(u.to).toBeGreaterThanOrEqual((2 * Math.PI * 14.5 * p) / n);
	});

	it('reads a 4-1 from its three teeth, but never as high', () => {
		const r = readProfile(wheel(4, 1, 2048, 0.3));
		if ('failure' in r) throw new Error(r.failure);
		expect([r.teeth, r.missing, r.gaps]).toEqual([4, 1, [{ first: 3, count: 1 }]]);
		expect(r.confidence).toBeLessThan(HIGH_CONFIDENCE);
	});

	it('reads 60-2 when a soft shadow lifts the spaces to 0.7 and the teeth read 1', () => {
		const s = wheel(60, 2, 2048, 0.5, 0.7, 1);
		const r = readProfile(s);
		if ('failure' in r) throw new Error(r.failure);
		expect([r.teeth, r.missing]).toEqual([60, 2]);
	});
});

describe('localLevels', () => {
	it('sits half-way between the nearby teeth and spaces, and at 0.5 inside a long flat stretch', () => {
		const lifted = localLevels(wheel(60, 2, 2048, 0.5, 0.7, 1));
		expect(lifted[100]).toBeCloseTo(0.85, 5);
		const flat = localLevels(new Float64Array(2048).fill(1));
		expect(flat[0]).toBe(0.5);
	});

	it('stays half-way between teeth and spaces when a thin dark line runs along one flank of every tooth (a flash on a chamfer)', () => {
		// Drawn: spaces 0.3, teeth 0.9, two samples at -0.5 just before each tooth's flank; half-way
		// between 0.3 and 0.9 is 0.6, by the drawing. Half-way to the lines' -0.5 (0.2) splits the spaces.
		// The level may lean to the teeth a little, not by a tenth of a tooth's height over the spaces.
		const n = 2048;
		const p = n / 36;
		const s = wheel(36, 1, n, 0.5, 0.3, 0.9);
		for (let pos = 0; pos < 35; pos++) for (const d of [1, 2]) s[(Math.round(pos * p) - d + n) % n] = -0.5;
		const level = localLevels(s);
		for (const i of [100, 700, 1500]) expect(Math.abs(level[i]! - 0.6)).toBeLessThan(0.1);
		const r = readProfile(s);
		if ('failure' in r) throw new Error(r.failure);
		expect([r.teeth, r.missing]).toEqual([36, 1]);
	});
});
