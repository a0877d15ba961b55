import { describe, expect, it } from 'vitest';
import { closeAfterWork, counted, hold, onShutdown, settled, shutdownTimeoutMs, workInFlight } from './shutdown';

const tick = (ms: number) => new Promise((r) => setTimeout(r, ms));

describe('work in flight at shutdown', () => {
	it('is settled only once every hold is released, and a release counts once', async () => {
		const a = hold();
		const b = hold();
		let done = false;
		const waiting = settled(1000).then((v) => (done = v));
		a();
		a();
		await tick(10);
		expect(done).toBe(false);
		expect(workInFlight()).toBe(1);
		b();
		await waiting;
		expect(done).toBe(true);
	});

	it('gives up at the time limit while work still runs', async () => {
		const release = hold();
		expect(await settled(20)).toBe(false);
		release();
		expect(workInFlight()).toBe(0);
	});

	it('closes what was registered only after the work counted with it (as a request using the pool)', async () => {
		const order: string[] = [];
		onShutdown('pool', () => order.push('pool closed'));
		const request = counted(async () => {
			await tick(30);
			order.push('request finished');
		});
		await closeAfterWork(1000, () => undefined);
		await request;
		expect(order).toEqual(['request finished', 'pool closed']);
	});

	it('reads SHUTDOWN_TIMEOUT in seconds as adapter-node does, 30 when unset', () => {
		expect(shutdownTimeoutMs({})).toBe(30_000);
		expect(shutdownTimeoutMs({ SHUTDOWN_TIMEOUT: '10' })).toBe(10_000);
		expect(shutdownTimeoutMs({ SHUTDOWN_TIMEOUT: 'x' })).toBe(30_000);
	});
});
