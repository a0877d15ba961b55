import { describe, expect, it } from 'vitest';
import { syncVerdict } from './sync-verdict';

// The words for the margin: negative fails (the rule misses the gap or takes a space for it, by the
// definition of the margin), below 15 % tight (our rule of thumb, from memory), else safe.
describe('syncVerdict', () => {
	it('reads the margin', () => {
		expect([-0.01, 0, 0.1499, 0.15, 0.8].map(syncVerdict)).toEqual(['fails', 'tight', 'tight', 'safe', 'safe']);
	});
	it('fails a margin that could not be worked out', () => {
		expect(syncVerdict(Number.NaN)).toBe('fails');
	});
});
