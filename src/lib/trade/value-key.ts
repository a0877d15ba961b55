// A text key for a plain value (a spec, its units, …), for keeping results computed from it:
// JSON, with the numbers JSON cannot tell apart (NaN, ±Infinity, -0) kept apart.
export const valueKey = (value: unknown) =>
	JSON.stringify(value, (_, v) =>
		typeof v === 'number' && (!Number.isFinite(v) || Object.is(v, -0)) ? `number:${Object.is(v, -0) ? '-0' : v}` : v
	);
