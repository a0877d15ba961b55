import { describe, expect, it } from 'vitest';
import { convertLengths, diffParams } from './params';
import { valueWords } from './schemas/param-words';
import { wheelParams } from './schemas/wheel-params';

describe('tool form helpers', () => {
	it('converts the given length fields between units (1 in = 25.4 mm), leaving empty and unfinished ones', () => {
		expect(
			convertLengths({ od: '100', depth: '3 1/2', bore: '', label: '7', pcd: '4/' }, ['od', 'depth', 'bore', 'pcd'], 'mm', 'in')
		).toEqual({ od: '3.937', depth: '0.1378' });
		expect(convertLengths({ od: '4' }, ['od'], 'in', 'mm')).toEqual({ od: '101.6' });
	});

	it('keeps what was typed through a switch and back: 3 mm stays 3, 1/8 in stays 1/8, 3 1/2 stays 3 1/2', () => {
		const memory = {};
		let form: Record<string, string> = { od: '3', depth: '1/8' };
		// mm -> in: 3 / 25.4 = 0.11811… in, shown to 0.0001.
		form = { ...form, ...convertLengths({ od: '3' }, ['od'], 'mm', 'in', memory) };
		expect(form.od).toBe('0.1181');
		form = { ...form, ...convertLengths(form, ['od'], 'in', 'mm', memory) };
		expect(form.od).toBe('3');
		// 1/8 in = 3.175 mm, shown to 0.01 as 3.18; back in inches it is 1/8 again, not 0.1252.
		const inch = { depth: '1/8', bore: '3 1/2' };
		const inMm = { ...inch, ...convertLengths(inch, ['depth', 'bore'], 'in', 'mm', memory) };
		expect(inMm).toEqual({ depth: '3.18', bore: '88.9' });
		expect({ ...inMm, ...convertLengths(inMm, ['depth', 'bore'], 'mm', 'in', memory) }).toEqual(inch);
		// Switching back and forth again keeps both.
		const again = { ...inch, ...convertLengths(inch, ['depth', 'bore'], 'in', 'mm', memory) };
		expect({ ...again, ...convertLengths(again, ['depth', 'bore'], 'mm', 'in', memory) }).toEqual(inch);
	});

	it('converts a field edited after the switch from its new text, not the memory', () => {
		const memory = {};
		const inMm = convertLengths({ depth: '1/8' }, ['depth'], 'in', 'mm', memory);
		expect(inMm).toEqual({ depth: '3.18' });
		// 4 mm / 25.4 = 0.15748… in.
		expect(convertLengths({ depth: '4' }, ['depth'], 'mm', 'in', memory)).toEqual({ depth: '0.1575' });
	});

	it('leaves a length with its own unit as typed: it means the same in either units', () => {
		expect(convertLengths({ bore: '20 mm', od: '4' }, ['bore', 'od'], 'in', 'mm')).toEqual({ od: '101.6' });
		expect(convertLengths({ bore: '3/4"' }, ['bore'], 'mm', 'in')).toEqual({});
	});

	it('lists the parameters that differ between two revisions, by name, treating empty as not given', () => {
		const changes = diffParams({ teeth: '36', missing: '1', od: '100', label: '' }, { teeth: '60', missing: '2', od: '100', bore: '20' });
		expect(changes).toEqual([
			{ name: 'bore', from: '', to: '20' },
			{ name: 'missing', from: '1', to: '2' },
			{ name: 'teeth', from: '36', to: '60' }
		]);
		expect(diffParams({ od: '100' }, { od: '100' })).toEqual([]);
	});
});

describe('the revision comparison in words', () => {
	// Expected words typed here from the designer's labels and plain trade usage, not from the code.
	it('names each change by its label, with units, choice words and what an empty value means', () => {
		const from = { units: 'mm', teeth: '36', missing: '1', od: '100', depth: '5', bore: '20', keyway: 'none', thickness: '3' };
		const to = {
			units: 'mm',
			teeth: '36',
			missing: '1',
			od: '100',
			depth: '5',
			bore: '20',
			tipRadius: '0.5',
			keyway: 'din6885',
			shaft: '20',
			keywayAngle: '45',
			thickness: '3',
			label: 'CRANK',
			rotation: 'ccw'
		};
		expect(diffParams(from, to, wheelParams).map((c) => [c.label, c.fromWords, c.toWords])).toEqual([
			['Tip corner radius', '0 (sharp)', '0.5 mm'],
			['Keyway', 'None', 'DIN 6885-1 parallel key'],
			['Shaft diameter', 'not used', '20 mm'],
			['Keyway angle', 'not used', '45°'],
			['Etched label', 'no label', '“CRANK”'],
			['Rotation', 'Clockwise (default)', 'Counter-clockwise']
		]);
	});

	it('keeps each set in its own units, and a length typed with its unit as typed', () => {
		const changes = diffParams({ units: 'mm', thickness: '3', bore: '20' }, { units: 'in', thickness: '1/8', bore: '20 mm' }, wheelParams);
		expect(changes.map((c) => [c.name, c.fromWords, c.toWords])).toEqual([
			['units', 'mm', 'in'],
			['bore', '20 mm', '20 mm'],
			['thickness', '3 mm', '1/8 in']
		]);
		expect(valueWords(wheelParams, 'bolts', { units: 'in' })).toBe('none');
		expect(valueWords(wheelParams, 'grade', { grade: '2.5' })).toBe('2.5 mm/s');
	});
});
