// Densities from handbook values (g/cm³): carbon steel 7.85, austenitic stainless 7.93 (304),
// aluminium alloy 2.70.
export const materials = {
	steel: { label: 'Mild steel', densityGcm3: 7.85 },
	stainless: { label: 'Stainless steel (304)', densityGcm3: 7.93 },
	aluminium: { label: 'Aluminium alloy', densityGcm3: 2.7 }
} as const;

export type MaterialName = keyof typeof materials;

/** g/cm³ to g/mm³. */
export const perMm3 = (gPerCm3: number) => gPerCm3 / 1000;
