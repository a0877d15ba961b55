import { describe, expect, it } from 'vitest';
import { delayFor, throttlePolicy } from './throttle';

describe('sign-in slow-down', () => {
	it('lets the first failures through at once, then doubles the wait up to the cap', () => {
		const waits = Array.from({ length: 10 }, (_, i) => delayFor(i + 1));
		expect(waits).toEqual([0, 0, 0, 250, 500, 1000, 2000, 4000, 4000, 4000]);
		expect(Math.max(...waits)).toBe(throttlePolicy.maxDelayMs);
	});
});
