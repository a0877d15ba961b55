// The drawing files' check (no summary) must refuse exactly what the full check refuses, field for
// field and word for word, and accept the same wheel: the oracle is checkWheel, which goes through
// the summary.
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { checkWheel, checkWheelShape } from '$lib/schemas/wheel';
import { wheelParams } from '../../../tests/support/wheel-params';

describe('checkWheelShape', () => {
	it('refuses and accepts as checkWheel does (property test over generated parameters, bad ones included)', () => {
		let refused = 0;
		fc.assert(
			fc.property(wheelParams, (params) => {
				const full = checkWheel(params);
				const shape = checkWheelShape(params);
				expect(shape.ok).toBe(full.ok);
				if (!full.ok && !shape.ok) {
					refused++;
					expect(shape.refusals).toEqual(full.refusals);
				}
				if (full.ok && shape.ok) {
					const { summary: _summary, params: _params, ...wheel } = full.value;
					expect(shape.value).toEqual(wheel);
				}
			}),
			{ numRuns: 400 }
		);
		// Not a test of accepted wheels alone.
		expect(refused).toBeGreaterThan(20);
	});

	it('refuses a tooth deeper than the wheel allows, on the depth, as checkWheel does', () => {
		const params = { teeth: '36', missing: '1', od: '60', depth: '29', bore: '25' };
		const shape = checkWheelShape(params);
		expect(shape.ok).toBe(false);
		expect(shape.ok ? [] : shape.refusals).toEqual((checkWheel(params) as { refusals: unknown }).refusals);
	});
});
