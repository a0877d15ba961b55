import { describe, expect, it } from 'vitest';
import { limiter } from './limit';

describe('decode limiter', () => {
	it('never runs more tasks at once than allowed, and runs them all', async () => {
		const run = limiter(2);
		let now = 0;
		let peak = 0;
		const task = (i: number) =>
			run(async () => {
				peak = Math.max(peak, ++now);
				await new Promise((r) => setTimeout(r, 5));
				now--;
				return i;
			});
		expect(await Promise.all([0, 1, 2, 3, 4, 5].map(task))).toEqual([0, 1, 2, 3, 4, 5]);
		expect(peak).toBe(2);
	});

	it('frees the slot when a task fails', async () => {
		const run = limiter(1);
		await expect(run(() => Promise.reject(new Error('bad photo')))).rejects.toThrow('bad photo');
		expect(await run(async () => 'next')).toBe('next');
	});
});
