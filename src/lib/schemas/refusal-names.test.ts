// How a refusal of a tool's parameter inside a saved record (`params.b`) reads in the API's
// `errors` map: by the name the tool knows it by, as the records API has always answered
// (tests/integration/tdc-records.test.ts reads `errors['params.b']` starting with `b: `).
import { describe, expect, it } from 'vitest';
import { namedErrors, refusal } from './refusal';

describe('refusals of a field inside an object', () => {
	it('name the tool’s parameter in the errors map', () => {
		expect(namedErrors([{ field: 'params.b', message: 'must differ from a' }])).toEqual({ 'params.b': 'b: must differ from a' });
		expect(namedErrors([{ field: 'diameter', message: '10 mm to 2000 mm' }])).toEqual({ diameter: 'diameter: 10 mm to 2000 mm' });
	});
	it('take off either prefix of a message written the older way, and only that', () => {
		expect(refusal('params.teeth', 'teeth: a whole number').message).toBe('a whole number');
		expect(refusal('params.teeth', 'params.teeth: a whole number').message).toBe('a whole number');
		expect(refusal('params.teeth', 'params: an object').message).toBe('params: an object');
		// A name the tool does not take is refused as the object's own fault, named by the object.
		expect(namedErrors([refusal('params.foo', 'params: each value text')])).toEqual({ 'params.foo': 'params: each value text' });
	});
});
