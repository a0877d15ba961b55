import { describe, expect, it } from 'vitest';
import { signalHref } from './build-links';

// The signal check opened from a build: the values expected are the ones typed here.
const profile = { layout: 'single-4', teeth: '36', missing: '1', toothAtTdc: '9', rpm: '9000' };
const wheel = { units: 'mm', teeth: '60', missing: '2', od: '150' };

describe('signalHref', () => {
	it('opens at the wheel as designed, the engine as profiled, naming the build and the design', () => {
		const q = new URL(signalHref('b1', profile, { designId: 'd1', params: wheel }), 'http://x').searchParams;
		expect([q.get('teeth'), q.get('missing'), q.get('layout'), q.get('toothAtTdc'), q.get('rpm')]).toEqual([
			'60',
			'2',
			'single-4',
			'9',
			'9000'
		]);
		expect([q.get('build'), q.get('design')]).toEqual(['b1', 'd1']);
	});

	it('keeps the newest saved check’s own numbers, but never over the profile or the wheel', () => {
		const saved = { teeth: '12', missing: '1', layout: 'twin-270', ratio: '1.6', idleSwing: '30' };
		const q = new URL(signalHref('b1', profile, { designId: 'd1', params: wheel }, saved), 'http://x').searchParams;
		expect([q.get('ratio'), q.get('idleSwing')]).toEqual(['1.6', '30']);
		expect([q.get('teeth'), q.get('missing'), q.get('layout')]).toEqual(['60', '2', 'single-4']);
	});

	it('is the bare page for a build with nothing saved yet', () => {
		expect(signalHref('b1', null, null)).toBe('/signal?build=b1');
	});
});
