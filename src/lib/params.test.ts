import { describe, expect, it } from 'vitest';
import { convertLengths, withoutField } from './params';

describe('tool form helpers', () => {
	it('converts the given length fields between units (1 in = 25.4 mm), leaving empty and unfinished ones', () => {
		expect(convertLengths({ od: '100', depth: '3 1/2', bore: '', label: '7', pcd: '4/' }, ['od', 'depth', 'bore', 'pcd'], 'mm', 'in')).toEqual({ od: '3.937', depth: '0.1378' });
		expect(convertLengths({ od: '4' }, ['od'], 'in', 'mm')).toEqual({ od: '101.6' });
	});

	it('drops the field name a message starts with, only when it is that field', () => {
		expect(withoutField('od', 'od: 10 mm to 2000 mm')).toBe('10 mm to 2000 mm');
		expect(withoutField('bore', 'od: 10 mm to 2000 mm')).toBe('od: 10 mm to 2000 mm');
	});
});
