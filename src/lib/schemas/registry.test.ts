import { describe, expect, it } from 'vitest';
import { defineRegistry } from './registry';

// Expected values are written out here from the definitions below (inches: 25.4 mm exactly).
const tool = defineRegistry([
	{ name: 'teeth', label: 'Teeth', kind: 'whole', min: 1, max: 720, required: true },
	{ name: 'od', label: 'Outside diameter', kind: 'length', minMm: 10, maxMm: 2000, default: { mm: '100', in: '4' } },
	{ name: 'rotation', label: 'Rotation', kind: 'choice', values: ['cw', 'ccw'], default: 'cw' },
	{ name: 'shaft', label: 'Shaft', kind: 'length', minMm: 1, maxMm: 500, required: true, appliesWhen: (p) => p.keyway === 'din' },
	{ name: 'keyway', label: 'Keyway', kind: 'choice', values: ['none', 'din'], default: 'none' }
]);

describe('a parameter registry', () => {
	it('reads lengths in the caller’s units into mm and fills defaults', () => {
		const read = tool.read({ teeth: '36', od: '3 1/2' }, 'in');
		expect(read.ok && read.value).toMatchObject({ teeth: 36, rotation: 'cw', keyway: 'none' });
		expect(read.ok && (read.value.od as number)).toBeCloseTo(88.9, 9);
		const dflt = tool.read({ teeth: '36', od: '' }, 'mm');
		expect(dflt.ok && dflt.value.od).toBe(100);
	});
	it('refuses with the field apart from the message, first reason per field', () => {
		const read = tool.read({ od: '5', rotation: 'left' }, 'mm');
		expect(read.ok).toBe(false);
		if (read.ok) return;
		expect(read.refusals).toEqual([
			{ field: 'teeth', message: 'required, a whole number from 1 to 720' },
			{ field: 'od', message: '10 mm to 2000 mm' },
			{ field: 'rotation', message: 'one of cw, ccw' }
		]);
	});
	it('asks for a parameter only when it applies', () => {
		expect(tool.read({ teeth: '36' }, 'mm').ok).toBe(true);
		const din = tool.read({ teeth: '36', keyway: 'din' }, 'mm');
		expect(!din.ok && din.refusals.map((r) => r.field)).toEqual(['shaft']);
	});
	it('states ranges in inches for inch callers', () => {
		const read = tool.read({ teeth: '36', od: '100' }, 'in');
		expect(!read.ok && read.refusals[0]).toEqual({ field: 'od', message: '0.394 in to 78.74 in' });
	});
	it('reads a length with its own unit whatever the form’s units (1 in = 25.4 mm exactly)', () => {
		const metricOnInch = tool.read({ teeth: '36', od: '20 mm' }, 'in');
		expect(metricOnInch.ok && (metricOnInch.value.od as number)).toBeCloseTo(20, 9);
		const inchOnMetric = tool.read({ teeth: '36', od: '3/4"' }, 'mm');
		expect(inchOnMetric.ok && (inchOnMetric.value.od as number)).toBeCloseTo(19.05, 9);
	});
	it('says why a length cannot be read, then what the field takes', () => {
		const why = (od: string) => {
			const read = tool.read({ teeth: '36', od }, 'mm');
			return !read.ok && read.refusals[0];
		};
		expect(why('mm 20')).toEqual({ field: 'od', message: 'units go after the number; 10 mm to 2000 mm' });
		expect(why('abc')).toEqual({ field: 'od', message: 'not a number; 10 mm to 2000 mm' });
		expect(why('20 furlongs')).toEqual({ field: 'od', message: 'unknown unit: use mm or in; 10 mm to 2000 mm' });
		// A number with its unit that is out of range is refused with the range alone.
		expect(why('1 mm')).toEqual({ field: 'od', message: '10 mm to 2000 mm' });
	});
	it('gives defaults per unit system and one label per name', () => {
		expect(tool.defaults('in')).toEqual({ od: '4', rotation: 'cw', keyway: 'none' });
		expect(tool.label('od')).toBe('Outside diameter');
	});
});
