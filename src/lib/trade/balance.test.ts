import { describe, expect, it } from 'vitest';
import { balanceHoles, massProperties, permissibleUnbalanceGmm, unbalanceForceN } from './balance';
import { exampleSpec } from '$support/example-spec';

describe('balance', () => {
	// ISO 21940-11: U_per = 9549·G·m/n. G 6.3, 1 kg at 3000 rpm -> 20.05 g·mm.
	it('permissible residual unbalance follows ISO 21940-11', () => {
		expect(permissibleUnbalanceGmm(6.3, 1, 3000)).toBeCloseTo(20.0529, 3);
	});

	it('force of an unbalance: F = U·ω² (100 g·mm at 6000 rpm ≈ 39.5 N)', () => {
		expect(unbalanceForceN(100, 6000)).toBeCloseTo(1e-4 * (200 * Math.PI) ** 2, 9);
	});

	it("a 36-1 wheel's unbalance is the missing tooth's mass times its centroid radius, heavy side opposite the gap", () => {
		const spec = exampleSpec();
		const { unbalanceGmm, heavyDeg } = massProperties(spec);
		// One missing tooth: annular sector R 50, r 45, 5° wide, 3 mm steel (ρ 7.85 g/cm³).
		const alpha = (2.5 * Math.PI) / 180;
		const momentMm3 = (2 / 3) * Math.sin(alpha) * (50 ** 3 - 45 ** 3);
		expect(unbalanceGmm).toBeCloseTo(momentMm3 * 3 * 7.85e-3, 6);
		// Position 35's tooth would lead at 350° and be centred at 352.5°; the heavy side is 180° from there.
		expect(heavyDeg).toBeCloseTo(172.5, 6);
	});

	it('suggested balance holes cancel the unbalance to within what ISO 21940-11 allows (G 6.3 at 8000 rpm)', () => {
		const spec = exampleSpec();
		const running = { rpm: 8000, gradeMmS: 6.3 };
		const advice = balanceHoles(spec, running, 'mm');
		if (!advice.ok) throw new Error(advice.reason);
		const after = massProperties({ ...spec, balanceHoles: advice.holes });
		expect(after.unbalanceGmm).toBeCloseTo(advice.holes.residualGmm, 9);
		// U_per = 9549·G·m/n, typed from ISO 21940-11.
		expect(after.unbalanceGmm).toBeLessThanOrEqual((9549 * 6.3 * (after.massG / 1000)) / 8000);
	});
});
