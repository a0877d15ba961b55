import { describe, expect, it } from 'vitest';
import { namedErrors, refusal, refusalsUnder } from './refusal';

// The expected `errors` shapes are the public API's as its integration tests have always read them
// (tests/integration/builds-api.test.ts: `errors['params.teeth']` starts with `teeth: `).
describe('refusals of a tool parameter inside a body', () => {
	it('take the tool’s own field name off the message, for the nested and the plain name alike', () => {
		expect(refusal('params.teeth', 'teeth: a whole number from 1 to 720')).toEqual({
			field: 'params.teeth',
			message: 'a whole number from 1 to 720'
		});
		expect(refusal('params.teeth', 'params.teeth: a whole number')).toEqual({ field: 'params.teeth', message: 'a whole number' });
		expect(refusal('od', 'bore: too large')).toEqual({ field: 'od', message: 'bore: too large' });
	});

	it('nest a tool’s field map under the body’s key', () => {
		expect(refusalsUnder('params', { a: 'a: a reading from 0 to 360', b: 'another reading' })).toEqual([
			{ field: 'params.a', message: 'a reading from 0 to 360' },
			{ field: 'params.b', message: 'another reading' }
		]);
	});

	it('answer the old errors map: the key as sent, the message starting with the tool’s field name', () => {
		expect(
			namedErrors([
				{ field: 'params.teeth', message: 'a whole number from 1 to 720' },
				{ field: 'name', message: '1 to 80 characters' }
			])
		).toEqual({
			'params.teeth': 'teeth: a whole number from 1 to 720',
			name: 'name: 1 to 80 characters'
		});
	});
});
