// Photo reading against the independent photo set (tests/fixtures/photo-set): wheels rendered by
// POV-Ray with thickness, chamfers, finishes, benches and engine covers, tilt, hard/soft/flash light,
// occluders, noise and JPEG. Every expected value (N, M, the tap points) is the scene generator's
// own truth (scripts/photo-set, which shares no code with src/lib/trade or the reader), projected
// through the camera the render used. Issue 17 sets the bar: right N and M on 22 of 24 with accurate
// taps, on most (13+) with taps 15 px off or a single tip, and never a wrong N or M shown as high.
// Until the reader reaches it, each tap set holds the reader to what it reads today (`floor`), so it
// cannot slip back; raise a floor as the reader improves. Seen on this set (2026-12-03, the reader of
// branch reader, fourth session): 22, 21 and 20 of 24 (third session: 21, 21 and 20; second: 20, 16
// and 15; earlier that day: 17, 15 and 14; 2026-12-02: 10, 8 and 8; the first reader: 4, 2 and 4);
// (a) is held at the bar itself; (b) and (c), above theirs, one under what was seen, against a
// decoder or a libvips build that rounds a pixel differently.
import { readFileSync } from 'node:fs';
import { join, resolve } from 'node:path';
import { describe, expect, it } from 'vitest';
import { HIGH_CONFIDENCE } from '$lib/photo-confidence';
import { readPhoto, type PhotoTaps } from './reading';

interface Pt {
	x: number;
	y: number;
}
interface Truth {
	file: string;
	teeth: number;
	missing: number;
	centre: Pt;
	tips: Pt[];
	seed: number;
	occluded: boolean;
}

const dir = resolve(import.meta.dirname, '../../../../tests/fixtures/photo-set');
const index = JSON.parse(readFileSync(join(dir, 'index.json'), 'utf8')) as { cases: { name: string; set: string; truth: string }[] };
const cases = index.cases
	.filter((c) => c.set === 'test')
	.map((c) => ({ name: c.name, truth: JSON.parse(readFileSync(join(dir, c.truth), 'utf8')) as Truth }));

/** Seeded so the 15 px moves are the same on every run. */
function seeded(seed: number) {
	let a = seed >>> 0;
	return () => {
		a = (a + 0x6d2b79f5) >>> 0;
		let t = a;
		t = Math.imul(t ^ (t >>> 15), t | 1);
		t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
		return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
	};
}

const tapSets: { key: string; name: string; bar: number; floor: number; taps: (t: Truth) => PhotoTaps }[] = [
	{ key: 'a', name: 'accurate: centre and every tip', bar: 22, floor: 22, taps: (t) => ({ centre: t.centre, tips: t.tips }) },
	{
		key: 'b',
		name: 'every tap 15 px off',
		bar: 13,
		floor: 20,
		taps: (t) => {
			const next = seeded(t.seed);
			const move = (p: Pt): Pt => {
				const a = next() * 2 * Math.PI;
				return { x: p.x + 15 * Math.cos(a), y: p.y + 15 * Math.sin(a) };
			};
			return { centre: move(t.centre), tips: t.tips.map(move) };
		}
	},
	{
		key: 'c',
		name: 'centre and a single tip',
		bar: 13,
		floor: 19,
		taps: (t) => ({ centre: t.centre, tips: [t.tips[t.seed % t.tips.length]!] })
	}
];

describe('readPhoto on the independent photo set (24 test images)', () => {
	it('has 24 test images, each with its truth', () => {
		expect(cases.map((c) => c.name)).toEqual(Array.from({ length: 24 }, (_, i) => `t${String(i + 1).padStart(2, '0')}`));
		for (const c of cases) expect(c.truth.tips.length).toBeGreaterThan(0);
	});

	for (const set of tapSets) {
		it(`${set.name}: right N and M on at least ${set.floor} of 24 (the bar: ${set.bar}), never a wrong one shown as high`, async () => {
			const rows: { image: string; case: string; expected: string; got: string; confidence: string; verdict: string }[] = [];
			let right = 0;
			const wrongHigh: string[] = [];
			for (const c of cases) {
				const image = readFileSync(join(dir, c.truth.file));
				const r = await readPhoto(image, set.taps(c.truth));
				const expected = `${c.truth.teeth}-${c.truth.missing}`;
				const got = r.ok ? `${r.teeth}-${r.missing}` : `refused (${r.field})`;
				const ok = r.ok && r.teeth === c.truth.teeth && r.missing === c.truth.missing;
				if (ok) right++;
				if (r.ok && !ok && r.confidence >= HIGH_CONFIDENCE)
					wrongHigh.push(`${c.name}: ${got} for ${expected} at ${r.confidence.toFixed(2)}`);
				rows.push({
					image: c.name,
					case: set.key,
					expected,
					got,
					confidence: r.ok ? r.confidence.toFixed(2) : '-',
					verdict: ok ? 'right' : r.ok ? 'WRONG' : 'refused'
				});
			}
			console.log(
				[`photo set (${set.key}) ${set.name}: ${right} of ${cases.length} right`, 'image case expected got                confidence']
					.concat(
						rows.map(
							(w) => `${w.image}   ${w.case}    ${w.expected.padEnd(8)} ${w.got.padEnd(22)} ${w.confidence.padStart(4)}  ${w.verdict}`
						)
					)
					.join('\n')
			);
			expect.soft(wrongHigh, 'wrong N or M shown as high').toEqual([]);
			expect.soft(right, `right N and M, ${set.name}`).toBeGreaterThanOrEqual(set.floor);
		}, 600_000);
	}
});
