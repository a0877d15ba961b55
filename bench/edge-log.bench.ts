// npm run bench: reading a recorded edge log of 100,000 edges (a 60-2 cranking with a swing, jitter
// and some noise), from its text as the API gets it, and the reading alone. Several logs, used in
// turn, so no cache of a previous answer could stand in for the work.
import { bench, describe } from 'vitest';
import { parseEdgeLog, readEdgeLog, type EdgeLog } from '../src/lib/trade/edge-log';
import { edgeLogCsv, wheelEdges } from '../tests/support/edge-logs';

const logs = [0, 1, 2].map((k) =>
	edgeLogCsv(
		wheelEdges({
			teeth: 60,
			missing: 2,
			rpm: 900 + 100 * k,
			turns: Math.ceil(100_000 / 58) + 1,
			startPosition: 7 + k,
			swingPct: 25,
			swingOrder: 0.5,
			jitter: 0.01,
			drop: [5000, 40_000 + k],
			double: [20_000, 70_000 + k],
			seed: k + 1
		}).slice(0, 100_000),
		'us'
	)
);
const parsed: EdgeLog[] = logs.map((text) => {
	const p = parseEdgeLog(text);
	if (!p.ok) throw new Error(JSON.stringify(p.refusals));
	return p.value;
});
let i = 0;

describe('edge log, 100,000 edges', () => {
	bench('parseEdgeLog + readEdgeLog (the text of a 60-2 log, about 1 MB)', () => {
		const p = parseEdgeLog(logs[i++ % logs.length]!);
		if (!p.ok) throw new Error('refused');
		readEdgeLog(p.value, { teeth: 60, missing: 2 });
	});
	bench('readEdgeLog alone', () => {
		readEdgeLog(parsed[i++ % parsed.length]!, { teeth: 60, missing: 2 });
	});
});
