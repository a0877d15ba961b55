import { describe, expect, it } from 'vitest';
import { buildSheetParams, phasingParams } from './phasing';
import { photoParams } from './photo';
import type { Registry } from './registry';
import { tapeRegistry } from './tape';
import { tdcRegistry } from './tdc';
import { timingCardRegistry } from './timing-card';
import { wheelParams } from './wheel-params';

// Issue 15: one label per public name across every tool. Each tool's registry is written on its
// own; this reads them all side by side, so a second wording for the same name fails here.
const tools: Record<string, Registry> = {
	wheel: wheelParams,
	phasing: phasingParams,
	buildSheet: buildSheetParams,
	tape: tapeRegistry,
	timingCard: timingCardRegistry,
	tdc: tdcRegistry,
	photo: photoParams
};

// The tape's `label` (number the scale every N degrees) predates the wheel's etched `label`; both
// are public API names already, so the clash is listed here rather than renamed under callers.
const knownClashes = new Set(['label']);

describe('public parameter names across the tools', () => {
	it('have one label each', () => {
		const labels = new Map<string, Set<string>>();
		for (const [tool, registry] of Object.entries(tools)) {
			for (const p of registry.params) {
				const seen = labels.get(p.name) ?? new Set<string>();
				seen.add(`${p.label}`);
				labels.set(p.name, seen);
				expect(p.label.trim(), `${tool}.${p.name}`).not.toBe('');
			}
		}
		const split = [...labels]
			.filter(([name, s]) => s.size > 1 && !knownClashes.has(name))
			.map(([name, s]) => `${name}: ${[...s].join(' | ')}`);
		expect(split).toEqual([]);
	});
	it('share the names the trade uses: od is the outside diameter wherever it is asked', () => {
		// design.md's vocabulary: OD, the diameter across the tooth tips.
		for (const registry of [wheelParams, buildSheetParams, photoParams]) expect(registry.label('od')).toBe('Outside diameter');
	});
});
