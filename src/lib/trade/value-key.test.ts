import { describe, expect, it } from 'vitest';
import { summarize } from './summary';
import { exampleSpec } from '$support/example-spec';
import { valueKey } from './value-key';

describe('keys for recent results', () => {
	it('tell apart the numbers JSON writes alike (ECMA-404 has no NaN, Infinity or -0)', () => {
		expect(valueKey({ a: NaN })).not.toBe(valueKey({ a: null }));
		expect(valueKey({ a: Infinity })).not.toBe(valueKey({ a: -Infinity }));
		expect(valueKey({ a: -0 })).not.toBe(valueKey({ a: 0 }));
		expect(valueKey({ a: 1, b: [2, 'x'] })).toBe(valueKey({ a: 1, b: [2, 'x'] }));
	});

	it('let a summary asked again answer as a fresh one, and a changed design answer anew', () => {
		const running = { rpm: 8000, gradeMmS: 6.3 };
		const first = summarize(exampleSpec(), 'mm', running);
		const bigger = summarize(exampleSpec({ odMm: 120 }), 'mm', running);
		expect(first.ok && bigger.ok).toBe(true);
		if (!first.ok || !bigger.ok) return;
		// A 120 mm wheel has more steel than a 100 mm one.
		expect(bigger.summary.massG).toBeGreaterThan(first.summary.massG);
		expect(summarize(exampleSpec(), 'mm', running)).toEqual(first);
		// Units change the wording of warnings: 10 mm plate is thicker than the 4.4 mm tooth tips.
		const thick = exampleSpec({ thicknessMm: 10 });
		expect(JSON.stringify(summarize(thick, 'in', running))).toContain(' in wide');
		expect(JSON.stringify(summarize(thick, 'mm', running))).toContain(' mm wide');
	});
});
