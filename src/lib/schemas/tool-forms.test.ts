// Every field the tape and TDC pages send, read from their address or show a refusal for is a
// public parameter in that tool's registry: a form cannot grow a name the API does not take.
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { load as tapeLoad } from '../../routes/tape/+page';
import { cardSent, tapeSent } from '../../routes/tape/sent';
import { load as tdcLoad } from '../../routes/tdc/+page';
import { tdcSent } from '../../routes/tdc/sent';
import { tapeRegistry } from './tape';
import { tdcRegistry } from './tdc';
import { timingCardRegistry } from './timing-card';

const tape = new Set<string>(tapeRegistry.names);
const card = new Set<string>(timingCardRegistry.names);
const tdc = new Set<string>(tdcRegistry.names);

/** A form holding every name either registry knows, plus ones none does, each with a value. */
const everything = Object.fromEntries(
	[...tape, ...card, ...tdc, 'build', 'design', 'od', 'teeth'].map((n) => [n, n === 'units' ? 'mm' : '1'])
);

/** The parameter names a component's source uses: its text fields, the params it sets and the refusals it shows. */
function namesIn(file: string): string[] {
	const source = readFileSync(new URL(file, import.meta.url), 'utf8');
	const patterns = [/text\('(\w+)'/g, /(?:page|this)\.params\.(\w+)/g, /errors\.(\w+)/g, /err\('(\w+)'\)/g];
	const names = patterns.flatMap((re) => [...source.matchAll(re)].map((m) => m[1]!));
	return [...new Set(names)];
}

// The loads read only `url`: the rest of a load event is not used.
const loadOf = (load: unknown, query: string) =>
	(load as (e: { url: URL }) => { params: Record<string, string> })({ url: new URL(`http://x/?${query}`) });

describe('the tape page', () => {
	it('sends the tape and the card only names their registries list', () => {
		for (const hubBy of ['diameter', 'circumference'] as const) {
			expect(Object.keys(tapeSent(everything, hubBy)).filter((n) => !tape.has(n))).toEqual([]);
			expect(Object.keys(cardSent(everything, hubBy, '1200:10')).filter((n) => !card.has(n))).toEqual([]);
		}
	});
	it('sends one hub size, the one chosen', () => {
		expect(Object.keys(tapeSent(everything, 'circumference'))).not.toContain('diameter');
		expect(Object.keys(cardSent(everything, 'diameter', ''))).not.toContain('circumference');
	});
	it('reads from its address only registry names, and its fields are registry names', () => {
		const query = new URLSearchParams(everything).toString();
		expect(Object.keys(loadOf(tapeLoad, query).params).filter((n) => !tape.has(n) && !card.has(n))).toEqual([]);
		for (const file of ['../../routes/tape/TapeForm.svelte', '../../routes/tape/tape-page.svelte.ts']) {
			expect(namesIn(file).length, file).toBeGreaterThan(0);
			expect(
				namesIn(file).filter((n) => !tape.has(n)),
				file
			).toEqual([]);
		}
	});
});

describe('the TDC page', () => {
	it('sends only names the TDC registry lists, in either mode', () => {
		for (const mode of ['marks', 'rim'] as const) expect(Object.keys(tdcSent(everything, mode)).filter((n) => !tdc.has(n))).toEqual([]);
	});
	it('sends no rim distance with two readings, and no readings with a rim distance', () => {
		expect(Object.keys(tdcSent(everything, 'marks'))).not.toContain('distance');
		expect(Object.keys(tdcSent(everything, 'rim')).sort()).toEqual(['diameter', 'distance', 'units']);
	});
	it('reads from its address only registry names, and its fields are registry names', () => {
		const query = new URLSearchParams(everything).toString();
		expect(Object.keys(loadOf(tdcLoad, query).params).filter((n) => !tdc.has(n))).toEqual([]);
		for (const file of ['../../routes/tdc/TdcForm.svelte', '../../routes/tdc/tdc-page.svelte.ts']) {
			expect(namesIn(file).length, file).toBeGreaterThan(0);
			expect(
				namesIn(file).filter((n) => !tdc.has(n)),
				file
			).toEqual([]);
		}
	});
});
