// The wheel files by kind, for the stateless routes and for saved revisions alike.
import type { ParsedWheel } from '$lib/schemas/wheel';
import type { WheelSummary } from '$lib/trade/summary';
import { wheelDxf } from './dxf';
import { exportName } from './names';
import { keyOf, Recent } from './recent';
import { wheelStl } from './stl';
import { wheelSvg } from './svg';
import { wheelPdf } from './wheel-pdf';

export const wheelFileKinds = ['dxf', 'svg', 'pdf', 'stl'] as const;
export type WheelFileKind = (typeof wheelFileKinds)[number];

const types: Record<WheelFileKind, string> = { dxf: 'application/dxf', svg: 'image/svg+xml', pdf: 'application/pdf', stl: 'model/stl' };

/**
 * Recent files by what makes them: the parsed design (so `od=120` and `od=120.0` are one) and, for
 * the PDF, what its table shows besides. A PDF is kept as its promise, so that identical requests
 * arriving together make it once.
 */
const recent = new Recent<Promise<string | Buffer>>(96);

/** The summary is needed for the PDF alone (its table): the drawing files are made without one. */
export async function wheelFile(kind: WheelFileKind, wheel: ParsedWheel, summary: WheelSummary | null, revision?: number) {
	const { spec, units, paper, running } = wheel;
	// An STL is always in mm (its format has no units), so its name says mm whatever the design's units.
	const fileUnits = kind === 'stl' ? 'mm' : units;
	const key = keyOf(kind === 'pdf' ? [kind, spec, units, running, paper] : [kind, spec, fileUnits]);
	let made = recent.get(key);
	if (!made) {
		made = recent.set(
			key,
			kind === 'dxf'
				? Promise.resolve(wheelDxf(spec, units))
				: kind === 'svg'
					? Promise.resolve(wheelSvg(spec, units))
					: kind === 'stl'
						? Promise.resolve(wheelStl(spec, exportName(spec, 'mm', 'stl')))
						: summary
							? wheelPdf(spec, summary, units, paper)
							: Promise.reject(new Error('a wheel PDF needs the summary'))
		);
		made.catch(() => recent.delete(key));
	}
	return {
		body: await made,
		contentType: types[kind],
		name: exportName(spec, fileUnits, kind, revision, kind === 'pdf' ? paper : undefined)
	};
}
