import { describe, expect, it } from 'vitest';
import { changePassword, resetPassword, signIn, signUp } from './account';
import { parseForm } from './form';
import { buildSheetParams, checkBuildSheet, checkPhasing, phasingParams } from './phasing';
import { checkPhotoTaps, photoParams } from './photo';
import { shownErrors, type Checked, type Refusal } from './refusal';
import type { Registry } from './registry';
import { checkTape, tapeRegistry } from './tape';
import { checkTdc, tdcRegistry } from './tdc';
import { checkTimingCard, timingCardRegistry } from './timing-card';
import { checkWheel } from './wheel';
import { wheelParams } from './wheel-params';

// Every refusal a page shows stands beside its field's label, so it must read as words: no internal
// parameter name (camelCase: windowFrom, tipRadius, odMm), no `name: ` prefix repeating the field,
// no `key=value` of the API. Each tool's check runs over every parameter made bad in several ways,
// and over the cross-field cases written out below.

const camelCase = /\b[a-z]+[A-Z][A-Za-z]*\b/;
const namePrefix = /^[\w.]+: /;
const apiSyntax = /\b[a-z]+=[\w-]+/;

function wordsOf(message: string): string[] {
	return [camelCase.exec(message)?.[0], namePrefix.exec(message)?.[0], apiSyntax.exec(message)?.[0]].filter((m): m is string => !!m);
}

const badValues = ['abc', '-5', '99999', '20 furlongs', 'mm 20', '3/0', '1e400', ' '];

/** Each parameter of a registry made bad in each way, on top of a valid base. */
const eachBad = (registry: Registry, base: Record<string, string>) =>
	registry.names.flatMap((name) => badValues.map((bad) => ({ ...base, [name]: bad })));

const wheelBase = { teeth: '36', missing: '1', od: '100', depth: '5', bore: '20', units: 'mm' };
const phasingBase = { teeth: '36', missing: '1', toothAtTdc: '9' };

const cases: [string, (p: Record<string, string>) => Checked<unknown>, Record<string, string>[]][] = [
	[
		'wheel',
		checkWheel,
		[
			...eachBad(wheelParams, wheelBase),
			...eachBad(wheelParams, { ...wheelBase, units: 'in', od: '4', depth: '1/4', bore: '3/4' }),
			{ ...wheelBase, bore: '98' },
			{ ...wheelBase, depth: '45' },
			{ ...wheelBase, tipRadius: '3', rootRadius: '3' },
			{ ...wheelBase, keyway: 'custom' },
			{ ...wheelBase, keyway: 'custom', keyWidth: '25', keyDepth: '2' },
			{ ...wheelBase, keyway: 'din6885', shaft: '60', bore: '10' },
			{ ...wheelBase, keyway: 'din6885', shaft: '600' },
			{ ...wheelBase, keyway: 'b17.1', shaft: '600' },
			{ ...wheelBase, keyway: 'woodruff', woodruff: '999' },
			{ ...wheelBase, bolts: '3' },
			{ ...wheelBase, bolts: '3', pcd: '24', boltHole: '6' },
			{ ...wheelBase, bolts: '24', pcd: '60', boltHole: '9' },
			{ ...wheelBase, bolts: '3', pcd: '40', boltHole: '40' },
			{ ...wheelBase, balanceCount: '2', balancePcd: '60', balanceHole: '8', bolts: '2', pcd: '60', boltHole: '8' },
			{ ...wheelBase, balanceCount: '4', balancePcd: '50', balanceHole: '6', label: 'WHEEL ONE OF MANY' },
			{ ...wheelBase, label: 'A LABEL MUCH TOO LONG FOR ANY WHEEL OF THIS SIZE' },
			{ ...wheelBase, pattern: 'extra', teeth: '12', extraAfter: '0', duty: '0.5' },
			{ ...wheelBase, pattern: 'custom', gaps: '1,x' },
			{ ...wheelBase, material: 'custom' }
		]
	],
	[
		'phasing',
		checkPhasing,
		[
			...eachBad(phasingParams, phasingBase),
			{ ...phasingBase, input: 'angles' },
			{ ...phasingBase, input: 'angles', sensorAngle: '30', keyFromSensor: '10' },
			{ ...phasingBase, sensorAngle: '30', keyAngle: '10' },
			{ ...phasingBase, layout: 'v-twin' },
			{ ...phasingBase, layout: 'v-twin-90', vAngle: '45' },
			{ ...phasingBase, layout: 'single-4', vAngle: '45' },
			{ ...phasingBase, intervals: '180 180 180' },
			{ ...phasingBase, intervals: '180 180 180 180', cylinders: '3' },
			{ ...phasingBase, layout: 'single-4', stroke: '2' },
			{ ...phasingBase, windowFrom: '10', windowTo: '40' },
			{ ...phasingBase, target: '60' },
			{ ...phasingBase, keyFromSensor: '60' },
			{ ...phasingBase, toothAtTdc: '40' }
		]
	],
	[
		'build sheet',
		checkBuildSheet,
		[
			...eachBad(buildSheetParams, { ...phasingBase, ...wheelBase }),
			{ ...phasingBase, ...wheelBase, tdcA: '10 BTDC', tdcB: '10 BTDC' },
			{ ...phasingBase, ...wheelBase, tdcA: '10', tdcB: '20' },
			{ ...phasingBase, ...wheelBase, bore: '98', depth: '3' }
		]
	],
	['tape', checkTape, eachBad(tapeRegistry, { diameter: '76.2' })],
	['timing card', checkTimingCard, [...eachBad(timingCardRegistry, { diameter: '76.2' }), { diameter: '76.2', curve: '1000:x' }]],
	[
		'TDC',
		checkTdc,
		[
			...eachBad(tdcRegistry, { a: '10 BTDC', b: '20 ATDC' }),
			{ a: '10', b: '10' },
			{ a: '10', b: '20' },
			{ distance: '400', diameter: '100' }
		]
	],
	[
		'photo reading',
		(p) => checkPhotoTaps({ centre: { x: 10, y: 10 }, tips: [{ x: 20, y: 10 }], ...p }, { width: 100, height: 100 }),
		eachBad(photoParams, {}).filter((p) => !('odMm' in p)) // odMm is an API-only older name, never on a page
	]
];

describe('refusals read as words beside their field', () => {
	it.each(cases)('%s: no internal names, no name: prefixes, no API syntax', (_tool, check, inputs) => {
		const said: string[] = [];
		let refused = 0;
		for (const input of inputs) {
			const checked = check(input);
			if (checked.ok) continue;
			refused++;
			for (const r of checked.refusals as Refusal[])
				if (wordsOf(r.message).length) said.push(`${JSON.stringify(input)} → ${r.field}: ${r.message}`);
		}
		// The bad inputs must be refused for this test to say anything.
		expect(refused).toBeGreaterThan(inputs.length / 2);
		expect(said).toEqual([]);
	});

	it('the account forms show their reasons without the field’s name', () => {
		const forms = [
			parseForm(signUp, { name: '', email: 'nobody', password: 'short' }),
			parseForm(signIn, { email: '', password: '' }),
			parseForm(resetPassword, { password: 'long enough password', confirm: 'another one entirely' }),
			parseForm(changePassword, { current: '', password: 'x', confirm: 'y' })
		];
		const shown = forms.flatMap((f) => (f.ok ? [] : Object.values(shownErrors(f.errors))));
		expect(shown.length).toBeGreaterThanOrEqual(7);
		expect(shown.filter((m) => wordsOf(m).length)).toEqual([]);
		expect(shownErrors({ email: 'email: an address like name@example.com' })).toEqual({ email: 'an address like name@example.com' });
	});

	it('the checker itself catches what it is for', () => {
		expect(wordsOf('no more than windowFrom')).toEqual(['windowFrom']);
		expect(wordsOf('email: an address')).toEqual(['email: ']);
		expect(wordsOf('outside it, use keyway=custom')).toEqual(['keyway=custom']);
		expect(wordsOf('0.2 mm to 200 mm, in degrees BTDC')).toEqual([]);
	});
});
