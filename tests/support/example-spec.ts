// A plain wheel spec for tests and examples: 36-1, 100 mm, 5 mm teeth, 3 mm mild steel.
import type { WheelSpec } from '$lib/trade/wheel';

export function exampleSpec(over: Partial<WheelSpec> = {}): WheelSpec {
	return {
		pattern: { kind: 'missing', teeth: 36, missing: 1 },
		duty: 0.5,
		odMm: 100,
		depthMm: 5,
		tipRadiusMm: 0,
		rootRadiusMm: 0,
		boreMm: 20,
		keyway: null,
		keywayDeg: 0,
		bolts: null,
		balanceHoles: null,
		indexMarkDeg: 0,
		label: '',
		rotation: 'cw',
		thicknessMm: 3,
		densityGcm3: 7.85,
		materialLabel: 'Mild steel',
		...over
	};
}
