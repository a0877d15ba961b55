import type { ParamDef, Params } from '$lib/schemas/registry';
import type { Units } from '$lib/trade/units';

// What the engine and wheel fields need of a tool page's state (the phasing check's, the signal
// check's): its flat strings, the registry's words for each field and the check's refusals by field.

export interface ToolForm {
	params: Params;
	units: Units;
	/** Ids are `<idPrefix>-<field>`, unique per page. */
	idPrefix: string;
	defOf: (name: string) => ParamDef | undefined;
	labelOf: (name: string, units: Units) => string;
	err: (name: string) => string | undefined;
	/** The build sheet's own refusals, where the page has a sheet (the phasing check). */
	sheetErr?: (name: string) => string | undefined;
}

/** A form with the engine's layout: a preset, a V-twin's angle, or intervals typed. */
export interface EngineForm extends ToolForm {
	readonly custom: boolean;
	readonly vtwin: boolean;
	chooseLayout: (id: string) => void;
}
