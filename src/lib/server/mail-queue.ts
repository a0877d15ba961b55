/**
 * Work that ends in an e-mail, done after the answer has gone out. What the answer says must not
 * depend on whether an address has an account, and neither may how long it takes: looking the
 * account up, writing a token and talking to the mail server took 158 ms for a registered address
 * against 4 ms for an unknown one. Queued here, both answer as soon as the request is counted
 * (mail-throttle.ts). A job lost to a restart costs one e-mail, which the person asks for again.
 */
const pending: (() => Promise<unknown>)[] = [];
let running = false;

/** Jobs waiting beyond this are dropped (and logged): the throttle keeps the queue far below it. */
const maxPending = 1000;

export function queueMail(job: () => Promise<unknown>) {
	if (pending.length >= maxPending) {
		console.error('[mail-queue] queue full; a message was dropped');
		return;
	}
	pending.push(job);
	if (!running) setTimeout(drain, 0);
	running = true;
}

async function drain() {
	for (let job = pending.shift(); job; job = pending.shift()) {
		try {
			await job();
		} catch (err) {
			console.error('[mail-queue]', err);
		}
	}
	running = false;
}
