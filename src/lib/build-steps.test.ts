import { describe, expect, it } from 'vitest';
import { buildSteps, headWheel, wheelChanges, type BuildStep, type StepId, type ThreadSource } from './build-steps';

// Builds modelled by hand: parameters and times typed in, the expected states typed from the rules
// written at the top of build-steps.ts (our own rules, not derived from the code's output).

const B = '11111111-1111-4111-8111-111111111111';
const D1 = '22222222-2222-4222-8222-222222222222';
const D2 = '33333333-3333-4333-8333-333333333333';

/** A single-cylinder four-stroke with a 36-1 on the crank, the tooth under the sensor given. */
const profile36 = {
	layout: 'single-4',
	stroke: '4',
	teeth: '36',
	missing: '1',
	mount: 'crank',
	input: 'tooth',
	toothAtTdc: '9',
	edge: 'rising',
	rpm: '9000',
	sensor: 'hall'
};
const wheel36 = { units: 'mm', teeth: '36', missing: '1', od: '100', depth: '5', thickness: '3', bore: '20' };
const wheel24 = { ...wheel36, teeth: '24', missing: '2' };

const empty: ThreadSource = {
	build: { id: B, engineProfile: null },
	designs: [],
	headRevisions: [],
	cuttingPackages: [],
	tdcRecords: [],
	tapes: [],
	latestActivity: []
};

const at = (hhmm: string) => `2026-12-02T${hhmm}:00.000Z`;

function withWheel(params: Record<string, string>, number: number, createdAt = at('09:00')): ThreadSource {
	return {
		...empty,
		build: { id: B, engineProfile: profile36 },
		designs: [{ id: D1, name: 'Crank wheel' }],
		headRevisions: [{ designId: D1, number, params, createdAt }]
	};
}

const step = (steps: BuildStep[], id: StepId) => steps.find((s) => s.id === id)!;
const states = (steps: BuildStep[]) => Object.fromEntries(steps.map((s) => [s.id, s.state]));

describe('the steps of a build', () => {
	it('come in the order of the job, all to do on a fresh build, each tool opened for the build', () => {
		const steps = buildSteps(empty);
		expect(steps.map((s) => s.id)).toEqual(['engine', 'wheel', 'cutting', 'tdc', 'tape', 'phasing', 'sheet']);
		expect(new Set(steps.map((s) => s.state))).toEqual(new Set(['todo']));
		expect(step(steps, 'engine').href).toBe(`/phasing?build=${B}`);
		expect(step(steps, 'wheel').href).toBe(`/wheel?build=${B}`);
		expect(step(steps, 'tdc').href).toBe(`/tdc?build=${B}`);
		expect(step(steps, 'tape').href).toBe(`/tape?build=${B}`);
		// Nothing to send and no sheet to print without a wheel (and a profile).
		expect(step(steps, 'cutting').href).toBeNull();
		expect(step(steps, 'sheet').href).toBeNull();
	});

	it('marks the engine described once the profile has its layout, and starts a new wheel from its pattern', () => {
		const steps = buildSteps({ ...empty, build: { id: B, engineProfile: profile36 } });
		expect(states(steps)).toMatchObject({ engine: 'done', wheel: 'todo', phasing: 'todo', sheet: 'todo' });
		expect(step(steps, 'wheel').href).toBe(`/wheel?build=${B}&teeth=36&missing=1`);
		// Intervals typed without a preset are a layout too.
		const custom = buildSteps({ ...empty, build: { id: B, engineProfile: { intervals: '270, 450', teeth: '36' } } });
		expect(step(custom, 'engine').state).toBe('done');
		const bare = buildSteps({ ...empty, build: { id: B, engineProfile: { teeth: '36' } } });
		expect(step(bare, 'engine').state).toBe('todo');
	});

	it('checks phasing against the head revision: done when the pattern matches, defaults and spellings alike', () => {
		// The wheel leaves duty out (default 0.5); the profile spells it 0.50.
		const steps = buildSteps({ ...withWheel(wheel36, 1), build: { id: B, engineProfile: { ...profile36, duty: '0.50' } } });
		expect(states(steps)).toMatchObject({ engine: 'done', wheel: 'done', phasing: 'done' });
		expect(step(steps, 'phasing').changes).toEqual([]);
		expect(step(steps, 'wheel').href).toBe(`/wheel?design=${D1}`);
	});

	it('marks phasing stale with what changed when a new revision changes the pattern', () => {
		const steps = buildSteps(withWheel(wheel24, 2));
		const phasing = step(steps, 'phasing');
		expect(phasing.state).toBe('stale');
		expect(phasing.changes).toEqual(['teeth 36 → 24', 'missing 1 → 2']);
		// The link opens the check at the wheel's 24-2, saving back into the build, naming the design.
		const query = new URL(phasing.href!, 'http://x').searchParams;
		expect([query.get('teeth'), query.get('missing'), query.get('build'), query.get('design')]).toEqual(['24', '2', B, D1]);
		expect(query.get('toothAtTdc')).toBe('9');
		expect(step(steps, 'engine').href).toBe(phasing.href);
	});

	it('compares the keyway angle only when the sensor was placed by angles', () => {
		const byAngles = { ...profile36, input: 'angles', keywayAngle: '90', sensorAngle: '60', keyAngle: '30' };
		const keyed = { ...wheel36, keyway: 'din6885', shaft: '20' };
		// The keyed wheel gives no keyway angle: its default is 0 (common-params.ts).
		expect(wheelChanges(byAngles, keyed)).toEqual(['keyway angle 90° → 0°']);
		expect(wheelChanges(byAngles, { ...keyed, keywayAngle: '90' })).toEqual([]);
		expect(wheelChanges({ ...profile36, keywayAngle: '90' }, keyed)).toEqual([]);
		// A wheel without a keyway has no keyway angle to compare.
		expect(wheelChanges(byAngles, wheel36)).toEqual([]);
	});

	it('words lengths with the wheel’s units and leaves out names that apply on neither side', () => {
		expect(wheelChanges({ ...profile36, gaps: '5, 17' }, wheel36)).toEqual([]);
		expect(wheelChanges({ ...profile36, pattern: 'custom', gaps: '17, 35' }, wheel36)).toEqual([
			'pattern custom → missing',
			'gap positions 17, 35 → none'
		]);
	});

	it('marks the cutting package stale when only an older revision was sent, done once the head is sent', () => {
		const source = withWheel(wheel24, 4);
		const older = { ...source, cuttingPackages: [{ designId: D1, revision: 3, createdAt: at('08:00') }] };
		const cutting = step(buildSteps(older), 'cutting');
		expect(cutting.state).toBe('stale');
		expect(cutting.changes).toEqual(['sent for revision 3; the wheel is now at revision 4']);
		const sent = { ...source, cuttingPackages: [...older.cuttingPackages, { designId: D1, revision: 4, createdAt: at('10:00') }] };
		expect(step(buildSteps(sent), 'cutting').state).toBe('done');
		// A package of another design does not count for this one.
		const other = { ...source, cuttingPackages: [{ designId: D2, revision: 4, createdAt: at('10:00') }] };
		expect(step(buildSteps(other), 'cutting').state).toBe('todo');
	});

	it('follows the first design by name that has a revision, as the build sheet does', () => {
		const source: ThreadSource = {
			...empty,
			designs: [
				{ id: D2, name: 'Arbor test' },
				{ id: D1, name: 'Crank wheel' }
			],
			headRevisions: [{ designId: D1, number: 2, params: wheel24, createdAt: at('09:00') }]
		};
		expect(headWheel(source)?.design.id).toBe(D1);
	});

	it('marks TDC found and the tape printed from the records, the tape link carrying the newest tape’s hub', () => {
		const source: ThreadSource = {
			...empty,
			// Marks 14° BTDC and 15° ATDC: TDC half-way, 0.5° ATDC (common practice: piston stop).
			tdcRecords: [{ params: { a: '-14', b: '15', scale: 'signed' }, tdcDeg: '0.5', createdAt: at('09:00') }],
			tapes: [
				{ params: { units: 'mm', diameter: '150' }, createdAt: at('08:00') },
				{ params: { units: 'in', diameter: '5 1/2' }, createdAt: at('10:00') }
			]
		};
		const steps = buildSteps(source);
		expect(states(steps)).toMatchObject({ tdc: 'done', tape: 'done' });
		expect(step(steps, 'tdc').detail).toContain('0.5° ATDC');
		expect(step(steps, 'tape').href).toBe(`/tape?build=${B}&units=in&diameter=5+1%2F2`);
		expect(step(steps, 'tape').detail).toContain('5 1/2 in');
	});

	it('marks the build sheet issued from its newest download, and stale with what changed after it', () => {
		const base = {
			...withWheel(wheel36, 3, at('09:00')),
			tdcRecords: [{ params: { a: '-14', b: '15', scale: 'signed' }, tdcDeg: '0.5', createdAt: at('09:30') }],
			tapes: [{ params: { units: 'mm', diameter: '150' }, createdAt: at('09:40') }]
		};
		const before = step(buildSteps(base), 'sheet');
		expect(before.state).toBe('todo');
		expect(before.href).toBe(`/api/v1/builds/${B}/build-sheet.pdf?design=${D1}`);
		expect(before.download).toBe(true);

		const issued = { kind: 'build-sheet', summary: 'Build sheet issued, wheel revision 3 of “Crank wheel”', createdAt: at('10:00') };
		const done = step(buildSteps({ ...base, latestActivity: [issued, { kind: 'engine', summary: '', createdAt: at('08:00') }] }), 'sheet');
		expect(done.state).toBe('done');
		expect(done.detail).toBe(issued.summary);

		const later = {
			...base,
			headRevisions: [{ designId: D1, number: 4, params: wheel36, createdAt: at('11:00') }],
			tdcRecords: [{ params: { a: '-10', b: '10', scale: 'signed' }, tdcDeg: '0', createdAt: at('11:05') }, ...base.tdcRecords],
			latestActivity: [issued, { kind: 'engine', summary: '', createdAt: at('11:10') }]
		};
		const stale = step(buildSteps(later), 'sheet');
		expect(stale.state).toBe('stale');
		expect(stale.changes).toEqual(['wheel revision 4 saved', 'engine profile saved', 'TDC record added']);
	});

	it('reads times given as text (the JSON API) the same as dates', () => {
		const issued = { kind: 'build-sheet', summary: 'issued', createdAt: new Date(at('10:00')) };
		const source = { ...withWheel(wheel36, 1, at('10:30')), latestActivity: [issued] };
		expect(step(buildSteps(source), 'sheet').changes).toEqual(['wheel revision 1 saved']);
	});
});
