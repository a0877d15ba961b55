import { readdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { buildSheetParams, phasingParams } from '$lib/schemas/phasing';
import { formStart, labelOf, phasingSent, sheetFormKeys, sheetSent } from './form-query';

// The phasing page's form against its registries (src/lib/schemas/phasing.ts): every field it
// shows or sends is a registered public name. Expected names are typed from the API's parameter
// list as README.md published it, not read from the code.

const here = import.meta.dirname;
/** The engine and wheel fields the page shares with the signal check. */
const shared = join(here, '..', '..', 'lib', 'components', 'engine');
const known = new Set<string>([...phasingParams.names, ...buildSheetParams.names]);

/** Every field name the route's components (not the page's head) give a control: `name="…"` on Param, Choice, Field. */
function namesInComponents(): string[] {
	const names: string[] = [];
	for (const dir of [here, shared])
		for (const file of readdirSync(dir).filter((f) => f.endsWith('.svelte') && !f.startsWith('+'))) {
			for (const m of readFileSync(join(dir, file), 'utf8').matchAll(/\bname="([A-Za-z]+)"/g)) names.push(m[1]!);
		}
	return names;
}

describe('the phasing form and its registry', () => {
	it('gives a control only to registered parameters, and has one for each the README names for the page', () => {
		const shown = namesInComponents();
		expect(shown.filter((n) => !known.has(n))).toEqual([]);
		// UnitsToggle names its own control `units`.
		const onPage = new Set([...shown, 'units']);
		const expected = [
			'teeth',
			'missing',
			'duty',
			'mount',
			'layout',
			'vAngle',
			'stroke',
			'intervals',
			'input',
			'toothAtTdc',
			'sensorAngle',
			'keywayAngle',
			'keyAngle',
			'edge',
			'rpm',
			'cranking',
			'sensor',
			'sensorMaxHz',
			'windowFrom',
			'windowTo',
			'resolution',
			'target',
			'keyFromSensor',
			'buildName',
			'units',
			'od',
			'depth',
			'thickness',
			'bore',
			'material',
			'paper',
			'tdcA',
			'tdcB',
			'tapeDiameter'
		];
		expect(expected.filter((n) => !onPage.has(n))).toEqual([]);
	});

	it('sends only registered names, and of those only the ones that apply', () => {
		// Every field typed in, as a form someone filled everywhere before switching.
		const everything = Object.fromEntries(Object.keys(formStart()).map((k) => [k, '7']));
		const tooth = { ...everything, input: 'tooth', layout: 'twin-270', pattern: 'missing' };
		const sent = Object.keys({ ...phasingSent(tooth), ...sheetSent(tooth) });
		expect(sent.filter((n) => !known.has(n))).toEqual([]);
		// With the tooth given: no measured angles; with a preset layout: no intervals, stroke or V angle; N-M: no gaps or extra tooth.
		for (const n of ['sensorAngle', 'keyAngle', 'keywayAngle', 'intervals', 'stroke', 'vAngle', 'gaps', 'extraAfter'])
			expect(sent).not.toContain(n);
		expect(sent).toEqual(expect.arrayContaining(['toothAtTdc', 'keyFromSensor', 'layout', 'teeth', 'missing', 'buildName', 'od', 'tdcA']));

		const angles = Object.keys(phasingSent({ ...everything, input: 'angles', layout: 'custom' }));
		for (const n of ['toothAtTdc', 'keyFromSensor', 'layout', 'vAngle']) expect(angles).not.toContain(n);
		expect(angles).toEqual(expect.arrayContaining(['sensorAngle', 'keyAngle', 'keywayAngle', 'intervals', 'stroke']));
	});

	it('keeps a saved design’s revision out of the sheet’s fields (the address keeps it for the design)', () => {
		expect(sheetFormKeys).not.toContain('revision');
		expect(buildSheetParams.names).toContain('revision');
	});

	it('labels a shared name as the designer does, with the unit the form shows', () => {
		// The designer's labels (WheelForm): Outside diameter, Tooth width, Keyway angle.
		expect(labelOf('od', 'in')).toBe('Outside diameter (in)');
		expect(labelOf('duty', 'mm')).toBe('Tooth width');
		expect(labelOf('keywayAngle', 'mm')).toBe('Keyway angle (wheel °)');
	});
});
