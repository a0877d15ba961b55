import { describe, expect, it } from 'vitest';
import { convertLengths, diffParams } from './params';

describe('tool form helpers', () => {
	it('converts the given length fields between units (1 in = 25.4 mm), leaving empty and unfinished ones', () => {
		expect(
			convertLengths({ od: '100', depth: '3 1/2', bore: '', label: '7', pcd: '4/' }, ['od', 'depth', 'bore', 'pcd'], 'mm', 'in')
		).toEqual({ od: '3.937', depth: '0.1378' });
		expect(convertLengths({ od: '4' }, ['od'], 'in', 'mm')).toEqual({ od: '101.6' });
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
