import { describe, expect, it } from 'vitest';
import { ansiSlot, dinSlot, fraction, woodruffNumbers, woodruffSlot } from './keys';

const IN = 25.4;

describe('DIN 6885-1 parallel keys', () => {
	// [over, up to, b, h, t2] mm, typed from: Siemens catalogue MD 31.1 (2016) p. 7/3 "Parallel key
	// and keyway according to DIN 6885-1" for 38–230 mm; a published DIN 6885 extract (keyway, key
	// details) for 6–22 mm; 22–38 and 230–500 mm from memory.
	const rows: [number, number, number, number, number][] = [
		[6, 8, 2, 2, 1.0],
		[8, 10, 3, 3, 1.4],
		[10, 12, 4, 4, 1.8],
		[12, 17, 5, 5, 2.3],
		[17, 22, 6, 6, 2.8],
		[22, 30, 8, 7, 3.3], // from memory
		[30, 38, 10, 8, 3.3], // from memory
		[38, 44, 12, 8, 3.3],
		[44, 50, 14, 9, 3.8],
		[50, 58, 16, 10, 4.3],
		[58, 65, 18, 11, 4.4],
		[65, 75, 20, 12, 4.9],
		[75, 85, 22, 14, 5.4],
		[85, 95, 25, 14, 5.4],
		[95, 110, 28, 16, 6.4],
		[110, 130, 32, 18, 7.4],
		[130, 150, 36, 20, 8.4],
		[150, 170, 40, 22, 9.4],
		[170, 200, 45, 25, 10.4],
		[200, 230, 50, 28, 11.4],
		[230, 260, 56, 32, 12.4], // from memory
		[260, 290, 63, 32, 12.4], // from memory
		[290, 330, 70, 36, 14.4], // from memory
		[330, 380, 80, 40, 15.4], // from memory
		[380, 440, 90, 45, 17.4], // from memory
		[440, 500, 100, 50, 19.5] // from memory
	];

	it.each(rows)('shaft over %d up to %d mm: key %d x %d, hub depth t2 %d mm', (over, upTo, b, h, t2) => {
		for (const shaft of [over + 0.01, (over + upTo) / 2, upTo]) {
			const slot = dinSlot(shaft)!;
			expect(slot, `${shaft} mm`).toMatchObject({ widthMm: b, depthMm: t2 });
			expect(slot.source).toContain(`${b} x ${h}`);
		}
	});

	it('range ends belong to the lower row ("over 17 up to 22"); the table ends at 500 mm', () => {
		expect(dinSlot(22)?.widthMm).toBe(6);
		expect(dinSlot(22.01)?.widthMm).toBe(8);
		expect(dinSlot(6)).toBeUndefined();
		expect(dinSlot(500)?.widthMm).toBe(100);
		expect(dinSlot(500.01)).toBeUndefined();
	});

	it('a float’s hair past a limit stays on the limit (0.1 * 3 * 100 = 30.000000000000004 mm is "up to 30": 8 x 7)', () => {
		expect(0.1 * 3 * 100).toBeGreaterThan(30);
		expect(dinSlot(0.1 * 3 * 100)?.widthMm).toBe(8);
		expect(dinSlot(30.01)?.widthMm).toBe(10);
	});
});

describe('ANSI B17.1 square keys', () => {
	// Key size versus shaft diameter, Table 1 of ANSI B17.1-1967 as printed in "Shop Reference for
	// Students and Apprentices" (Industrial Press), square keys: [over, up to, W] inches.
	const sizes: [number, number, number][] = [
		[5 / 16, 7 / 16, 3 / 32],
		[7 / 16, 9 / 16, 1 / 8],
		[9 / 16, 7 / 8, 3 / 16],
		[7 / 8, 1.25, 1 / 4],
		[1.25, 1.375, 5 / 16],
		[1.375, 1.75, 3 / 8],
		[1.75, 2.25, 1 / 2],
		[2.25, 2.75, 5 / 8],
		[2.75, 3.25, 3 / 4],
		[3.25, 3.75, 7 / 8],
		[3.75, 4.5, 1],
		[4.5, 5.5, 1.25],
		[5.5, 6.5, 1.5]
	];

	it.each(sizes)('shaft over %f up to %f in takes the %f in key', (over, upTo, w) => {
		for (const shaft of [over + 0.001, (over + upTo) / 2, upTo]) expect(ansiSlot(shaft)!.widthMm).toBeCloseTo(w * IN, 9);
	});

	// Hub depth T across the bore, parallel square keys: Machinery's Handbook 31st ed., Table 2
	// "Depth Control Values S and T for Shaft and Hub ANSI/ASME B17.1-1967 (R2013)", column Hubs,
	// Parallel, Square. Nominal shaft diameters 1/2 to 2 1/2 in by sixteenths.
	const published: [number, number][] = [
		[8 / 16, 0.56],
		[9 / 16, 0.623],
		[10 / 16, 0.709],
		[11 / 16, 0.773],
		[12 / 16, 0.837],
		[13 / 16, 0.9],
		[14 / 16, 0.964],
		[15 / 16, 1.051],
		[16 / 16, 1.114],
		[17 / 16, 1.178],
		[18 / 16, 1.241],
		[19 / 16, 1.304],
		[20 / 16, 1.367],
		[21 / 16, 1.455],
		[22 / 16, 1.518],
		[23 / 16, 1.605],
		[24 / 16, 1.669],
		[25 / 16, 1.732],
		[26 / 16, 1.796],
		[27 / 16, 1.859],
		[28 / 16, 1.922],
		[29 / 16, 2.032],
		[30 / 16, 2.096],
		[31 / 16, 2.16],
		[32 / 16, 2.223],
		[33 / 16, 2.287],
		[34 / 16, 2.35],
		[35 / 16, 2.414],
		[36 / 16, 2.477],
		[37 / 16, 2.587],
		[38 / 16, 2.651],
		[39 / 16, 2.714],
		[40 / 16, 2.778]
	];

	it.each(published)('a %f in shaft: T = %f in (published table, to 0.0005 in)', (shaft, T) => {
		const slot = ansiSlot(shaft)!;
		expect(Math.abs(shaft + slot.depthMm / IN - T)).toBeLessThanOrEqual(0.0005);
		// The same shaft typed in mm (the designer's units) gets the same slot.
		expect(ansiSlot((shaft * IN) / IN)!.depthMm).toBeCloseTo(slot.depthMm, 9);
	});

	it('beyond the published rows: T from the keyseat corner found numerically on the bore circle', () => {
		// Geometry model: the keyseat side x = W/2 meets the bore circle at height y (bisection);
		// the key's half height plus 0.005 in clearance (B17.1's allowance for parallel keys) stands
		// above that corner. Depth over the bore on the centre line = y + H/2 + C − D/2.
		for (const [shaft, w] of [
			[2.75, 5 / 8],
			[3, 3 / 4],
			[3.5, 7 / 8],
			[4.25, 1],
			[5, 1.25],
			[6.5, 1.5]
		] as const) {
			const R = shaft / 2;
			let lo = 0;
			let hi = R;
			for (let i = 0; i < 200; i++) {
				const mid = (lo + hi) / 2;
				if ((w / 2) ** 2 + mid ** 2 < R ** 2) lo = mid;
				else hi = mid;
			}
			const depth = lo + w / 2 + 0.005 - R;
			const slot = ansiSlot(shaft)!;
			expect(slot.widthMm).toBeCloseTo(w * IN, 9);
			expect(slot.depthMm / IN).toBeCloseTo(depth, 6);
		}
	});

	it('the 1 in shaft of the issue: 1/4 in key, T = 1.114 in, not 1.125', () => {
		const slot = ansiSlot(1)!;
		expect(slot.widthMm).toBeCloseTo(6.35, 9);
		expect(1 + slot.depthMm / IN).toBeCloseTo(1.114, 3);
		expect(slot.source).toContain('T = 1.114 in');
	});

	it('shafts typed in mm at a row limit take that row (22.225 mm = 7/8 in -> 3/16; 11.1125 mm = 7/16 -> 3/32; 44.45 mm = 1 3/4 -> 3/8)', () => {
		expect(ansiSlot(22.225 / IN)!.widthMm).toBeCloseTo((3 / 16) * IN, 9);
		expect(ansiSlot(11.1125 / IN)!.widthMm).toBeCloseTo((3 / 32) * IN, 9);
		expect(ansiSlot(44.45 / IN)!.widthMm).toBeCloseTo((3 / 8) * IN, 9);
		// Just past a limit, the next key.
		expect(ansiSlot(22.26 / IN)!.widthMm).toBeCloseTo((1 / 4) * IN, 9);
	});

	it('the square-key table ends at 6 1/2 in', () => {
		expect(ansiSlot(6.5)).toBeDefined();
		expect(ansiSlot(6.51)).toBeUndefined();
		expect(ansiSlot(5 / 16)).toBeUndefined();
	});
});

describe('ANSI B17.2 Woodruff keys', () => {
	// Hub keyseat depth by key width, Shigley's Mechanical Engineering Design (9th ed.), Table 7-7
	// "Dimensions of Woodruff Keys — Inch Series": [key number, width in, hub depth in].
	const shigley: [string, number, number][] = [
		['202', 1 / 16, 0.0372],
		['203', 1 / 16, 0.0372],
		['303', 3 / 32, 0.0529],
		['304', 3 / 32, 0.0529],
		['305', 3 / 32, 0.0529],
		['404', 1 / 8, 0.0685],
		['405', 1 / 8, 0.0685],
		['406', 1 / 8, 0.0685],
		['505', 5 / 32, 0.0841],
		['506', 5 / 32, 0.0841],
		['507', 5 / 32, 0.0841],
		['606', 3 / 16, 0.0997],
		['607', 3 / 16, 0.0997],
		['608', 3 / 16, 0.0997],
		['807', 1 / 4, 0.131],
		['808', 1 / 4, 0.131],
		['810', 1 / 4, 0.131],
		['1008', 5 / 16, 0.1622],
		['1010', 5 / 16, 0.1622],
		['1012', 5 / 16, 0.1622],
		['1210', 3 / 8, 0.1935],
		['1212', 3 / 8, 0.1935]
	];

	it.each(shigley)('No. %s: %f in wide, hub keyseat %f in deep', (number, w, depth) => {
		const slot = woodruffSlot(number)!;
		expect(slot.widthMm).toBeCloseTo(w * IN, 9);
		expect(Math.abs(slot.depthMm / IN - depth)).toBeLessThanOrEqual(0.00005);
	});

	it('names the size from the number: No. 404 is 1/8 x 1/2 in; No. 1210 is 3/8 x 1 1/4 in; No. 202.5 is 1/16 x 5/16', () => {
		expect(woodruffSlot('404')!.source).toContain('1/8 x 1/2 in');
		expect(woodruffSlot('1210')!.source).toContain('3/8 x 1 1/4 in');
		expect(woodruffSlot('202.5')!.source).toContain('1/16 x 5/16 in');
		expect(woodruffSlot('817-1')!.source).toContain('1/4 x 2 1/8 in');
	});

	it('refuses numbers that are no standard key (999, 1299, 1650, 2002, 12)', () => {
		for (const n of ['999', '1299', '1650', '2002', '12', '', '404.5', '0404']) expect(woodruffSlot(n), n).toBeUndefined();
	});

	it('every listed number has a hub depth', () => {
		for (const n of woodruffNumbers) expect(woodruffSlot(n)!.depthMm, n).toBeGreaterThan(0);
	});
});

it('writes inch fractions the way a machinist reads them', () => {
	expect(fraction(0.1875)).toBe('3/16');
	expect(fraction(1.25)).toBe('1 1/4');
	expect(fraction(2)).toBe('2');
});
