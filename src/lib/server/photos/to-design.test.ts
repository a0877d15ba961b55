import { describe, expect, it } from 'vitest';
import { readingToDesign } from './to-design';

// 1 in = 25.4 mm exactly (international inch, 1959): 101.6 mm is 4 in, 88.9 mm is 3 1/2 in.
const reading = { teeth: 36, missing: 1, gaps: [{ first: 35, count: 1 }], duty: 0.5 };

describe('a photo reading as the designer’s parameters', () => {
	it('opens the designer in the units the diameter was chosen in, with the diameter in them', () => {
		expect(readingToDesign(reading, 101.6, 'in')).toEqual({
			units: 'in',
			teeth: '36',
			duty: '0.5',
			pattern: 'missing',
			missing: '1',
			od: '4'
		});
		expect(readingToDesign(reading, 88.9, 'in').od).toBe('3.5');
		expect(readingToDesign(reading, 101.6, 'mm')).toMatchObject({ units: 'mm', od: '101.6' });
	});

	it('leaves the diameter to the designer when none was given', () => {
		expect(readingToDesign(reading, undefined, 'in')).not.toHaveProperty('od');
	});
});
