// npm run bench: the signal check for a 60-2 crank wheel on a flat-plane four, over 10 engine
// cycles, at the four default speeds with the clocking sweep: what the /signal page runs on each
// change (the aim: under 5 ms). The tooth at TDC changes every run, so no cache can hide the work.
import { bench, describe } from 'vitest';
import { checkSignal } from '../src/lib/schemas/signal';
import { signalCheck } from '../src/lib/trade/signal';

let i = 0;
const params = () => ({ teeth: '60', missing: '2', toothAtTdc: ((i++ % 6000) / 100).toFixed(2), layout: 'four-inline', cycles: '10' });
const steady = { time: 2000, warmupTime: 300 };

describe('signal check, 60-2 crank wheel, inline four, 10 cycles', () => {
	bench(
		'checkSignal + signalCheck: 4 speed cases, sweep, sensor',
		() => {
			const checked = checkSignal(params());
			if (!checked.ok) throw new Error(JSON.stringify(checked.refusals));
			signalCheck(checked.value.input);
		},
		steady
	);
});
