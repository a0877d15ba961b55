// npm run bench: what a 60-2 wheel costs to compute (the live preview's path) and to export.
// Parameters vary per iteration (outside diameter), so no cache can hide the work: each iteration
// parses anew, and a new spec is drawn anew. The exports are called directly, below the
// endpoints' cache of recent files.
import { bench, describe } from 'vitest';
import { parseTape } from '../src/lib/schemas/tape';
import { parseWheel } from '../src/lib/schemas/wheel';
import { wheelDxf } from '../src/lib/server/exports/dxf';
import { wheelSvg } from '../src/lib/server/exports/svg';
import { tapePdf } from '../src/lib/server/exports/tape-pdf';
import { wheelPdf } from '../src/lib/server/exports/wheel-pdf';
import { summarize } from '../src/lib/trade/summary';
import { contourPath } from '../src/lib/trade/svg';
import { cutContours, drawWheel } from '../src/lib/trade/wheel';

// 100,000 diameters before one comes back: far more than any cache of recent results keeps.
let i = 0;
const params = () => ({
	teeth: '60',
	missing: '2',
	od: (120 + (i++ % 100_000) / 10_000).toFixed(4),
	depth: '5',
	bore: '25',
	keyway: 'din6885',
	shaft: '25',
	tipRadius: '0.4',
	rootRadius: '0.6',
	units: 'mm'
});
function next() {
	const parsed = parseWheel(params());
	if (!parsed.ok) throw new Error(JSON.stringify(parsed.errors));
	return parsed.value;
}
// For the parts alone: designs parsed beforehand, each a new object when used.
const designs = Array.from({ length: 5000 }, next);
let j = 0;
const another = () => {
	const w = designs[j++ % designs.length]!;
	return { ...w, spec: { ...w.spec } };
};
// Long enough runs for a median that other work on the machine does not move much.
const steady = { time: 2000, warmupTime: 300 };

describe('60-2 wheel, 120 mm', () => {
	bench(
		'live preview recompute: parse + summary + drawing + SVG paths',
		() => {
			const w = next();
			const s = summarize(w.spec, w.units, w.running);
			if (!s.ok) throw new Error('refused');
			cutContours(drawWheel(w.spec)).map((c) => contourPath(c));
		},
		steady
	);
	bench('  its parse (parseWheel)', () => void next(), steady);
	bench(
		'  its summary (summarize, with the drawing it needs)',
		() => {
			const w = another();
			summarize(w.spec, w.units, w.running);
		},
		steady
	);
	bench('  its drawing and SVG paths', () => void cutContours(drawWheel(another().spec)).map((c) => contourPath(c)), steady);

	bench('DXF export', () => {
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

let d = 0;
describe('degree tape, 150 mm hub', () => {
	bench('tape PDF export (pdfkit)', async () => {
		const parsed = parseTape({ diameter: (150 + (d++ % 100_000) / 1000).toFixed(3) });
		if (!parsed.ok) throw new Error(JSON.stringify(parsed.errors));
		await tapePdf(parsed.value.spec, parsed.value.units, parsed.value.paper);
	});
});
