// Stopping without dropping work, so a rolling deploy behind a balancer loses nothing.
// adapter-node does the listening part: on SIGTERM/SIGINT it stops accepting, closes idle
// keep-alive connections, lets open ones finish (closing them after SHUTDOWN_TIMEOUT seconds,
// 30 unless set) and then emits 'sveltekit:shutdown'. It counts connections, not our work: a
// request whose client has gone (a load generator stopping at its deadline) still runs its handler,
// and the mail queue sends after the answer. Ending the pool at that event ran such work into
// "Cannot use a pool after calling end on the pool" (seen at the end of `npm run bench`), and lost
// the queued e-mails. So work is counted here, and the pool and the mail transport close only once
// it is done, or once SHUTDOWN_TIMEOUT has passed since the signal.

let inFlight = 0;
let idle: (() => void)[] = [];
const closers: { name: string; close: () => unknown }[] = [];

/** Counts one piece of work until the returned function is called (once). */
export function hold(): () => void {
	inFlight++;
	let released = false;
	return () => {
		if (released) return;
		released = true;
		inFlight--;
		if (inFlight === 0) {
			const waiting = idle;
			idle = [];
			for (const resolve of waiting) resolve();
		}
	};
}

/** Runs `work`, counted as in flight until it settles. */
export async function counted<T>(work: () => Promise<T>): Promise<T> {
	const release = hold();
	try {
		return await work();
	} finally {
		release();
	}
}

export const workInFlight = () => inFlight;

/** Resolves true once no work is in flight, or false when `ms` pass first. */
export function settled(ms: number): Promise<boolean> {
	if (inFlight === 0) return Promise.resolve(true);
	return new Promise((resolve) => {
		const timer = setTimeout(() => {
			idle = idle.filter((r) => r !== done);
			resolve(false);
		}, ms);
		const done = () => {
			clearTimeout(timer);
			resolve(true);
		};
		idle.push(done);
	});
}

/** Something to close at shutdown (the pool, the mail transport), after the work in flight. */
export function onShutdown(name: string, close: () => unknown) {
	closers.push({ name, close });
}

/** Waits for the work in flight (at most `ms`), then closes everything registered; never throws. */
export async function closeAfterWork(ms: number, log: (line: string) => void = console.log): Promise<void> {
	const finished = await settled(Math.max(0, ms));
	if (!finished) log(`shutdown: ${inFlight} piece(s) of work still running after the time limit; closing anyway`);
	const results = await Promise.allSettled(closers.map(async (c) => c.close()));
	results.forEach((r, i) => {
		if (r.status === 'rejected') log(`shutdown: closing the ${closers[i]!.name} failed (${String(r.reason)})`);
	});
}

/** adapter-node's own limit (its default too), read the way it reads it. */
export function shutdownTimeoutMs(env: Record<string, string | undefined> = process.env): number {
	const seconds = Number.parseInt(env.SHUTDOWN_TIMEOUT ?? '30', 10);
	return (Number.isFinite(seconds) && seconds >= 0 ? seconds : 30) * 1000;
}

let installed = false;

/**
 * Called once by the server's hooks (not at import: scripts import the pool too, and a SIGTERM
 * listener would take the default "end the process" away from them).
 */
export function installShutdown() {
	if (installed) return;
	installed = true;
	let signalAt: number | undefined;
	for (const signal of ['SIGTERM', 'SIGINT'] as const) process.once(signal, () => (signalAt ??= Date.now()));
	process.once('sveltekit:shutdown', () => {
		const left = (signalAt ?? Date.now()) + shutdownTimeoutMs() - Date.now();
		// A floor of one second: work that was just answered (its e-mail queued) still gets to finish.
		void closeAfterWork(Math.max(left, 1000)).then(() => {
			// Nothing should hold the process now; if something does, end it anyway (unref: no wait otherwise).
			setTimeout(() => process.exit(0), 2000).unref();
		});
	});
}
