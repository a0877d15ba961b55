// npm run bench: what a 60-2 wheel costs to compute (the live preview's path) and to export.
// Parameters vary per iteration (outside diameter), so no cache can hide the work.
import { bench, describe } from 'vitest';
import { parseWheel } from '../src/lib/schemas/wheel';
import { wheelDxf } from '../src/lib/server/exports/dxf';
import { wheelSvg } from '../src/lib/server/exports/svg';
import { wheelPdf } from '../src/lib/server/exports/wheel-pdf';
import { summarize } from '../src/lib/trade/summary';
import { contourPath } from '../src/lib/trade/svg';
import { cutContours, drawWheel } from '../src/lib/trade/wheel';

let i = 0;
function next() {
	const od = String(120 + (i++ % 50) * 0.1);
	const parsed = parseWheel({ teeth: '60', missing: '2', od, depth: '5', bore: '25', keyway: 'din6885', shaft: '25', tipRadius: '0.4', rootRadius: '0.6', units: 'mm' });
	if (!parsed.ok) throw new Error(JSON.stringify(parsed.errors));
	return parsed.value;
}

describe('60-2 wheel, 120 mm', () => {
	bench('live preview recompute: parse + summary + drawing + SVG paths', () => {
		const w = next();
		const s = summarize(w.spec, w.units, w.running);
		if (!s.ok) throw new Error('refused');
		cutContours(drawWheel(w.spec)).map((c) => contourPath(c));
	});

	bench('DXF export (makerjs)', () => {
		const w = next();
		wheelDxf(w.spec, w.units);
	});

	bench('SVG export', () => {
		const w = next();
		wheelSvg(w.spec, w.units);
	});

	bench('PDF template export (pdfkit)', async () => {
		const w = next();
		const s = summarize(w.spec, w.units, w.running);
		if (!s.ok) throw new Error('refused');
		await wheelPdf(w.spec, s.summary, w.units, 'a4');
	});
});
