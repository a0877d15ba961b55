import { tapeRegistry } from '$lib/schemas/tape';
import { timingCardRegistry } from '$lib/schemas/timing-card';

// What the tape page sends: to the tape's API and PDF, to the timing-light card's PDF and into its
// own address. Named by the registries, so the form cannot send a name the API does not take.

export type Params = Record<string, string>;
export type HubBy = 'diameter' | 'circumference';

/** Only what means something with the choices made, trimmed, without empty strings. */
function pick(params: Params, names: readonly string[]): Params {
	const out: Params = {};
	for (const name of names) {
		const v = params[name]?.trim();
		if (v) out[name] = v;
	}
	return out;
}

/** The other of the two hub sizes: kept in the form for switching back, not sent. */
const unsent = (hubBy: HubBy) => (hubBy === 'diameter' ? 'circumference' : 'diameter');

/** The tape's parameters as /api/v1/tape takes them. */
export const tapeSent = (params: Params, hubBy: HubBy): Params =>
	pick(
		params,
		tapeRegistry.names.filter((n) => n !== unsent(hubBy))
	);

/** The timing-light card's parameters: the tape's hub and the curve as typed in the table. */
export const cardSent = (params: Params, hubBy: HubBy, curve: string): Params => ({
	...pick(
		params,
		timingCardRegistry.names.filter((n) => n !== unsent(hubBy) && n !== 'curve')
	),
	curve
});

export interface CurveRow {
	rpm: string;
	advance: string;
}

/** The table's rows as the card's `curve` parameter: `1200:10, 2000:14`, empty rows left out. */
export const curveText = (rows: readonly CurveRow[]) =>
	rows
		.filter((r) => r.rpm.trim() !== '' || r.advance.trim() !== '')
		.map((r) => `${r.rpm.trim()}:${r.advance.trim()}`)
		.join(', ');

/** A `curve` parameter as the table's rows. */
export const curveRows = (curve: string): CurveRow[] =>
	curve
		.split(',')
		.map((s) => s.trim())
		.filter(Boolean)
		.map((item) => {
			const [rpm = '', advance = ''] = item.split(':');
			return { rpm: rpm.trim(), advance: advance.trim() };
		});
