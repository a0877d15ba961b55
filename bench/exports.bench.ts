// npm run bench: each export route's own work for a file made anew, below HTTP and below the
// routes' caches of recent files: the query's check, then the file (what `npm run bench` then
// measures under load beside the static floor). A new outside or hub diameter every iteration, none
// repeated within 100,000, so no cache of recent checks, summaries or files can answer.
import { bench, describe } from 'vitest';
import { checkTape } from '../src/lib/schemas/tape';
import { checkWheel, checkWheelShape } from '../src/lib/schemas/wheel';
import { wheelDxf } from '../src/lib/server/exports/dxf';
import { wheelSvg } from '../src/lib/server/exports/svg';
import { tapePdf } from '../src/lib/server/exports/tape-pdf';
import { wheelPdf } from '../src/lib/server/exports/wheel-pdf';

// The 60-2 wheel of scripts/bench.ts's endpoints, its outside diameter what changes.
let i = 0;
const wheelQuery = () => ({
	teeth: '60',
	missing: '2',
	od: (100 + (i++ % 100_000) / 1000).toFixed(3),
	depth: '5',
	bore: '25',
	keyway: 'din6885',
	shaft: '25',
	tipRadius: '0.4',
	rootRadius: '0.6'
});
let d = 0;
const tapeQuery = () => ({ diameter: (100 + (d++ % 100_000) / 1000).toFixed(3) });

const refused = (what: string) => new Error(`${what} refused`);
const long = { time: 2000, warmupTime: 300 };

describe('export routes, a file made anew (check + file)', () => {
	const shape = () => {
		const c = checkWheelShape(wheelQuery());
		if (!c.ok) throw refused('wheel');
		return c.value;
	};
	bench(
		'wheel.dxf',
		() => {
			const { spec, units } = shape();
			wheelDxf(spec, units);
		},
		long
	);
	bench(
		'wheel.svg',
		() => {
			const { spec, units } = shape();
			wheelSvg(spec, units);
		},
		long
	);
	bench(
		'wheel.pdf',
		async () => {
			const c = checkWheel(wheelQuery());
			if (!c.ok) throw refused('wheel');
			await wheelPdf(c.value.spec, c.value.summary, c.value.units, c.value.paper);
		},
		long
	);
	bench(
		'tape.pdf',
		async () => {
			const c = checkTape(tapeQuery());
			if (!c.ok) throw refused('tape');
			await tapePdf(c.value.spec, c.value.units, c.value.paper);
		},
		long
	);
});
