import { readdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { checkWheel } from './wheel';
import { allows } from './registry';
import { applying, filledWheel, lengthParams, newWheel, wheelParams } from './wheel-params';

// Expected values are typed here from the wheel parameter table the README published before the
// OpenAPI document replaced it (names, defaults, ranges in mm) and from 1 in = 25.4 mm exactly; none is read from the registry under test.

/** That published wheel parameter table, plus `paper` from its wheel.pdf row. */
const documented = [
	'units',
	'pattern',
	'teeth',
	'missing',
	'gaps',
	'extraAfter',
	'duty',
	'od',
	'depth',
	'tipRadius',
	'rootRadius',
	'bore',
	'keyway',
	'keyWidth',
	'keyDepth',
	'shaft',
	'woodruff',
	'keywayAngle',
	'bolts',
	'pcd',
	'boltHole',
	'boltAngle',
	'balanceCount',
	'balancePcd',
	'balanceHole',
	'balanceAngle',
	'balanceSpacing',
	'mark',
	'label',
	'etchRing',
	'rotation',
	'material',
	'density',
	'thickness',
	'rpm',
	'grade',
	'paper'
];

/** The parameter names the designer's form and balance panel write, found in their markup. */
function formNames(): string[] {
	const dir = join(import.meta.dirname, '..', '..', 'routes', 'wheel');
	const names = new Set<string>();
	// The form's parts, and the balance panel that writes the suggested holes into the design.
	const parts = readdirSync(dir).filter((f) => /^(WheelForm|\w+Fields|BalancePanel)\.svelte$/.test(f));
	expect(parts.length).toBeGreaterThanOrEqual(4);
	for (const file of parts) {
		const text = readFileSync(join(dir, file), 'utf8');
		for (const m of text.matchAll(/\bname="([\w.]+)"/g)) names.add(m[1]!);
		for (const m of text.matchAll(/\bparams\.(\w+)\s*=[^=]/g)) names.add(m[1]!);
		for (const m of text.matchAll(/\bfield="(\w+)"/g)) names.add(m[1]!);
	}
	// The index mark's on/off switch is the form's own, not a parameter: it writes `mark`.
	names.delete('mark-on');
	return [...names].sort();
}

describe('the wheel parameter registry', () => {
	it('holds every documented wheel parameter once, and nothing else', () => {
		expect([...wheelParams.names].sort()).toEqual([...documented].sort());
		expect(new Set(wheelParams.names).size).toBe(wheelParams.names.length);
	});

	it('has every name the designer form sends', () => {
		const sent = formNames();
		// The form has at least the fields a person fills in for a 36-1 wheel (README's example).
		expect(sent).toEqual(
			expect.arrayContaining(['teeth', 'missing', 'od', 'depth', 'bore', 'thickness', 'pattern', 'keyway', 'material', 'grade'])
		);
		for (const name of sent) expect(wheelParams.get(name), name).toBeDefined();
	});

	it('starts a new design from the README’s defaults, in each unit system', () => {
		expect(newWheel('mm')).toEqual({
			units: 'mm',
			pattern: 'missing',
			teeth: '36',
			missing: '1',
			duty: '0.5',
			od: '100',
			depth: '5',
			bore: '20',
			thickness: '3',
			rpm: '8000',
			grade: '6.3'
		});
		expect(newWheel('in')).toEqual({
			units: 'in',
			pattern: 'missing',
			teeth: '36',
			missing: '1',
			duty: '0.5',
			od: '4',
			depth: '3/16',
			bore: '3/4',
			thickness: '1/8',
			rpm: '8000',
			grade: '6.3'
		});
		expect(filledWheel({ units: 'in', od: '6' })).toMatchObject({ od: '6', bore: '3/4', units: 'in' });
	});

	it('gives one label per public name: od is the outside diameter, duty the tooth width', () => {
		expect(wheelParams.label('od')).toBe('Outside diameter');
		expect(wheelParams.label('duty')).toBe('Tooth width');
		expect(wheelParams.label('teeth')).toBe('Teeth');
	});

	it('words length ranges in the caller’s units: 10–2000 mm is 0.394–78.74 in', () => {
		// 10 / 25.4 = 0.3937…, 2000 / 25.4 = 78.7401…, to three places without trailing zeros.
		expect(allows(wheelParams.get('od')!, 'in')).toBe('0.394 in to 78.74 in');
		expect(allows(wheelParams.get('od')!, 'mm')).toBe('10 mm to 2000 mm');
		// Thickness 0.2–50 mm: 0.00787… and 1.9685… in.
		expect(allows(wheelParams.get('thickness')!, 'in')).toBe('0.008 in to 1.969 in');
		// Every length of the README's table is a length here (they follow the units switch).
		expect([...lengthParams].sort()).toEqual(
			[
				'od',
				'depth',
				'tipRadius',
				'rootRadius',
				'bore',
				'keyWidth',
				'keyDepth',
				'shaft',
				'pcd',
				'boltHole',
				'balancePcd',
				'balanceHole',
				'thickness',
				'etchRing'
			].sort()
		);
	});

	it('sends only what applies with the choices made', () => {
		const form = {
			units: 'mm',
			pattern: 'custom',
			teeth: '36',
			missing: '1',
			gaps: '17, 35',
			od: '100',
			depth: '5',
			keyway: 'none',
			keyWidth: '6',
			bolts: '0',
			pcd: '60',
			material: 'custom',
			density: '8',
			label: '',
			junk: 'x'
		};
		expect(applying(form)).toEqual({
			units: 'mm',
			pattern: 'custom',
			teeth: '36',
			gaps: '17, 35',
			od: '100',
			depth: '5',
			keyway: 'none',
			bolts: '0',
			material: 'custom',
			density: '8'
		});
		expect(
			applying({
				keyway: 'din6885',
				shaft: '20',
				keywayAngle: '90',
				bolts: '3',
				pcd: '60',
				boltHole: '6',
				balanceCount: '2',
				balanceHole: '5'
			})
		).toEqual({
			keyway: 'din6885',
			shaft: '20',
			keywayAngle: '90',
			bolts: '3',
			pcd: '60',
			boltHole: '6',
			balanceCount: '2',
			balanceHole: '5'
		});
		expect(applying({ keyway: 'woodruff', woodruff: '404', shaft: '20' })).toEqual({ keyway: 'woodruff', woodruff: '404' });
	});
});

describe('checkWheel', () => {
	const base = { units: 'mm', teeth: '36', missing: '1', od: '100', depth: '5' };

	it('accepts the README’s 36-1 and keeps the given parameters it knows', () => {
		const checked = checkWheel({ ...base, junk: 'x', bore: '' });
		expect(checked.ok).toBe(true);
		if (!checked.ok) return;
		expect(checked.value.params).toEqual(base);
		// 36 positions, one missing: 35 teeth, 10° pitch (geometry).
		expect(checked.value.summary.teethPresent).toBe(35);
		expect(checked.value.spec.boreMm).toBe(20);
	});

	it('refuses with the field apart from the message, the first reason per field, in the order found', () => {
		const checked = checkWheel({ units: 'in', teeth: '0', od: '100', duty: '2' });
		expect(checked).toEqual({
			ok: false,
			refusals: [
				{ field: 'depth', message: 'required, 0.008 in to 7.874 in' },
				{ field: 'teeth', message: 'a whole number from 1 to 720' },
				{ field: 'duty', message: 'a number from 0.05 to 0.95' },
				{ field: 'od', message: '0.394 in to 78.74 in' }
			]
		});
	});

	it('applies the cross-field rules: a keyway needs a bore, a missing count below the teeth', () => {
		const keyed = checkWheel({ ...base, bore: '0', keyway: 'custom', keyWidth: '5', keyDepth: '2' });
		expect(keyed.ok === false && keyed.refusals).toEqual([{ field: 'bore', message: 'needed for a keyway (more than 0)' }]);
		// 36 positions with 36 missing leaves no tooth: at most N − 1 = 35.
		const empty = checkWheel({ ...base, missing: '36' });
		expect(empty.ok === false && empty.refusals[0]).toMatchObject({ field: 'missing', message: expect.stringMatching(/at most 35/) });
		expect(empty.ok === false && empty.refusals.every((r) => !r.message.startsWith(`${r.field}:`))).toBe(true);
	});

	it('names the field the user changes: a bore too large, a looked-up key wider than the bore', () => {
		const bore = checkWheel({ ...base, bore: '98' });
		expect(bore.ok === false && bore.refusals.map((r) => r.field)).toEqual(['bore']);
		// DIN 6885-1: a shaft over 58 up to 65 mm takes an 18 mm wide key (the standard's table); the key's width is no field.
		const key = checkWheel({ ...base, bore: '10', keyway: 'din6885', shaft: '60' });
		expect(key.ok === false && key.refusals[0]).toMatchObject({
			field: 'bore',
			message: expect.stringMatching(/^more than the key’s width \(18\.00 mm/)
		});
		// A metric bore typed on an inch wheel is read in mm: 20 mm, whatever the form's units.
		const metric = checkWheel({ ...base, units: 'in', od: '4', depth: '3/16', bore: '20 mm' });
		expect(metric.ok && metric.value.spec.boreMm).toBeCloseTo(20, 9);
	});

	it('refuses units it does not know before reading any length', () => {
		expect(checkWheel({ ...base, od: 'big', units: 'yards' })).toEqual({
			ok: false,
			refusals: [{ field: 'units', message: 'one of mm, in' }]
		});
	});
});
