/**
 * Work that ends in an e-mail, done after the answer has gone out. What the answer says must not
 * depend on whether an address has an account, and neither may how long it takes: looking the
 * account up, writing a token and talking to the mail server took 158 ms for a registered address
 * against 4 ms for an unknown one. Queued here, both answer as soon as the request is counted
 * (mail-throttle.ts). A graceful stop waits for the queue (shutdown.ts); a job lost to a crash costs
 * one e-mail, which the person asks for again.
 */
import { hold } from './shutdown';

/** Each job with its hold on the shutdown (shutdown.ts): a stop waits for the queue to empty. */
const pending: { job: () => Promise<unknown>; release: () => void }[] = [];
let running = false;

/** Jobs waiting beyond this are dropped (and logged): the throttle keeps the queue far below it. */
const maxPending = 1000;

export function queueMail(job: () => Promise<unknown>) {
	if (pending.length >= maxPending) {
		console.error('[mail-queue] queue full; a message was dropped');
		return;
	}
	pending.push({ job, release: hold() });
	if (!running) setTimeout(drain, 0);
	running = true;
}

async function drain() {
	for (let next = pending.shift(); next; next = pending.shift()) {
		try {
			await next.job();
		} catch (err) {
			console.error('[mail-queue]', err);
		} finally {
			next.release();
		}
	}
	running = false;
}
