import { describe, expect, it } from 'vitest';
import { checkWheel } from '$lib/schemas/wheel';
import { hubDimension } from './keys';
import { gapPositions, scaleFor } from './shop-drawing';

const spec = (p: Record<string, string>) => {
	const c = checkWheel({ units: 'mm', teeth: '36', missing: '1', od: '100', depth: '5', thickness: '3', bore: '20', ...p });
	if (!c.ok) throw new Error(JSON.stringify(c.refusals));
	return c.value.spec;
};

describe('the gap from the keyway', () => {
	// 36-1, duty 0.5: pitch 10°, the gap opens at tooth 34's trailing edge (345°) and closes at tooth 0's
	// leading edge (360°): centre 352.5 wheel degrees, 15° open. A keyway at 90° leaves 262.5° of
	// rotation to the gap; on a wheel turning clockwise, later in rotation lies counter-clockwise on the
	// face, so 262.5° counter-clockwise, i.e. 97.5° clockwise (worked by hand).
	it('is measured on the drawn face, the short way round', () => {
		const [g] = gapPositions(spec({ keyway: 'din6885', shaft: '20', keywayAngle: '90', rotation: 'cw' }));
		expect(g!.widthDeg).toBeCloseTo(15, 9);
		expect(g!.fromKeyway!.deg).toBeCloseTo(97.5, 9);
		expect(g!.fromKeyway!.sense).toBe('clockwise');
		// Turning the other way mirrors the face.
		const [m] = gapPositions(spec({ keyway: 'din6885', shaft: '20', keywayAngle: '90', rotation: 'ccw' }));
		expect(m!.fromKeyway).toMatchObject({ sense: 'counter-clockwise' });
		expect(m!.fromKeyway!.deg).toBeCloseTo(97.5, 9);
	});
	it('has no keyway to measure from without one', () => {
		expect(gapPositions(spec({}))[0]!.fromKeyway).toBeNull();
	});
});

describe('the hub dimension over the bore', () => {
	it('is d + t2 for DIN 6885-1 (row over 17 up to 22 mm: t2 = 2.8, published DIN 6885 extract)', () => {
		const s = spec({ keyway: 'din6885', shaft: '20' });
		expect(hubDimension(20, s.keyway!)).toMatchObject({ name: 'd + t2' });
		expect(hubDimension(20, s.keyway!).mm).toBeCloseTo(22.8, 9);
	});
	// Machinery's Handbook's B17.1 depth T for a 1 in bore, 1/4 in key: T = D − Y + H/2 + C with
	// Y = (1 − √(1 − 1/16))/2 = 0.01588 in, so T = 1 − 0.01588 + 0.125 + 0.005 = 1.1141 in (worked by hand).
	it('is T for ANSI B17.1, from the far side of the bore', () => {
		const c = checkWheel({
			units: 'in',
			teeth: '36',
			missing: '1',
			od: '4',
			depth: '0.2',
			thickness: '0.125',
			bore: '1',
			keyway: 'b17.1',
			shaft: '1'
		});
		if (!c.ok) throw new Error(JSON.stringify(c.refusals));
		const hub = hubDimension(25.4, c.value.spec.keyway!);
		expect(hub.name).toBe('T');
		expect(hub.mm / 25.4).toBeCloseTo(1.1141, 4);
	});
});

describe('the drawing scale', () => {
	it('is 1:1 when the wheel fits, else the largest ISO 5455 reduction that does', () => {
		expect(scaleFor(100, 110).label).toBe('1:1');
		expect(scaleFor(200, 110).label).toBe('1:2');
		expect(scaleFor(400, 110).label).toBe('1:5');
	});
});
