// The three wheel files by kind, for the stateless routes and for saved revisions alike.
import type { ParsedWheel } from '$lib/schemas/wheel';
import type { WheelSummary } from '$lib/trade/summary';
import { wheelDxf } from './dxf';
import { exportName } from './names';
import { wheelSvg } from './svg';
import { wheelPdf } from './wheel-pdf';

export const wheelFileKinds = ['dxf', 'svg', 'pdf'] as const;
export type WheelFileKind = (typeof wheelFileKinds)[number];

const types: Record<WheelFileKind, string> = { dxf: 'application/dxf', svg: 'image/svg+xml', pdf: 'application/pdf' };

export async function wheelFile(kind: WheelFileKind, wheel: ParsedWheel, summary: WheelSummary, revision?: number) {
	const { spec, units, paper } = wheel;
	const body = kind === 'dxf' ? wheelDxf(spec, units) : kind === 'svg' ? wheelSvg(spec, units) : await wheelPdf(spec, summary, units, paper);
	return { body, contentType: types[kind], name: exportName(spec, units, kind, revision) };
}
