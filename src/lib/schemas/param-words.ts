import { defaultOf, type Params, type ParamDef, type Registry } from './registry';

// A parameter's value as a person reads it in a comparison: with its unit, a choice by its words,
// and an empty value as what it means for that parameter, never "not given".

const hasUnit = /[a-z"″]/i;

/** A value given as text, in the words of its kind, lengths in the set's own units. */
function givenWords(def: ParamDef, text: string, units: string): string {
	switch (def.kind) {
		case 'length':
			// A length typed with its own unit ("20 mm" on an inch wheel) says it already.
			return hasUnit.test(text) ? text : `${text} ${units}`;
		case 'angle':
			return text.endsWith('°') ? text : `${text}${def.unit ?? '°'}`;
		case 'whole':
		case 'number':
			return `${text}${def.unit ?? ''}`;
		case 'choice':
			return def.labels?.[text] ?? text;
		case 'text':
			return `“${text}”`;
		case 'free':
			return text;
	}
}

/** Parameter `name` of one set of parameters, in words. */
export function valueWords(registry: Registry, name: string, params: Params): string {
	const def = registry.get(name);
	const text = (params[name] ?? '').trim();
	const units = params.units === 'in' ? 'in' : 'mm';
	if (!def) return text || 'not given';
	if (text) return givenWords(def, text, units);
	if (def.appliesWhen && !def.appliesWhen(params)) return 'not used';
	if (def.whenEmpty) return def.whenEmpty;
	const fallback = defaultOf(def, units);
	return fallback ? `${givenWords(def, fallback, units)} (default)` : 'not given';
}
