// The tape's and the timing-light card's one check. Expected refusals are typed here from the
// ranges the tools publish (the tape's parameters as the README published them), not taken from the registry under test.
import { describe, expect, it } from 'vitest';
import { checkTape, tapeRegistry } from './tape';
import { checkTimingCard } from './timing-card';

const refusalsOf = (r: ReturnType<typeof checkTape> | ReturnType<typeof checkTimingCard>) => (r.ok ? [] : r.refusals);

describe('checkTape', () => {
	it('reads a 3 1/2 in hub into mm and fills the rest from the defaults', () => {
		const r = checkTape({ units: 'in', diameter: '3 1/2' });
		expect(r.ok).toBe(true);
		if (!r.ok) return;
		// 3.5 in = 88.9 mm; office paper 0.004 in = 0.1016 mm (1 in = 25.4 mm).
		expect(r.value.spec.hubDiameterMm).toBeCloseTo(88.9, 9);
		expect(r.value.spec.paperThicknessMm).toBeCloseTo(0.1016, 9);
		expect(r.value.spec).toMatchObject({ rotation: 'cw', windowDeg: 180, tickDeg: 1, midEveryDeg: 5, labelEveryDeg: 10 });
	});

	it('gives one reason per field, without the field’s name, in the order the form lists them', () => {
		expect(refusalsOf(checkTape({ diameter: '5', tick: '20', window: 'wide', timing: 'idle:95' }))).toEqual([
			{ field: 'diameter', message: '10 mm to 2000 mm' },
			{ field: 'tick', message: 'a number from 0.25 to 10°' },
			{ field: 'window', message: 'full, or a number from 5 to 180° each side of TDC' },
			{ field: 'timing', message: 'numbers from 0 to 90 separated by commas, optionally named, like idle:10, full:32 (degrees BTDC)' }
		]);
	});

	it('asks for a hub size, once', () => {
		expect(refusalsOf(checkTape({}))).toEqual([{ field: 'diameter', message: 'required (or give circumference instead)' }]);
		expect(refusalsOf(checkTape({ diameter: '76', circumference: '240' }))).toEqual([
			{ field: 'circumference', message: 'give either diameter or circumference, not both' }
		]);
	});

	it('refuses unknown units before reading any length', () => {
		expect(refusalsOf(checkTape({ units: 'yd', diameter: 'x' }))).toEqual([{ field: 'units', message: 'one of mm, in' }]);
	});

	it('labels every parameter it reads', () => {
		for (const name of tapeRegistry.names) expect(tapeRegistry.label(name), name).not.toBe(name);
	});
});

describe('checkTimingCard', () => {
	it('reads the curve as rpm and advance pairs', () => {
		const r = checkTimingCard({ diameter: '150', curve: '1200:10, 3000:20' });
		expect(r.ok && r.value.points).toEqual([
			{ rpm: 1200, advanceDeg: 10 },
			{ rpm: 3000, advanceDeg: 20 }
		]);
	});
	it('refuses a curve out of range with the whole range said', () => {
		expect(refusalsOf(checkTimingCard({ diameter: '150', curve: '1200:70' }))).toEqual([
			{ field: 'curve', message: 'rpm:advance pairs like 1200:10, 3000:20 (rpm 100 to 30000, advance −10 to 60° BTDC)' }
		]);
	});
});
