// Step-by-step progress for the set-up scripts: each step prints what it does, then how it went,
// and a failed step says what to do about it.

export class StepError extends Error {
	constructor(
		message: string,
		readonly hint: string
	) {
		super(message);
	}
}

export async function step<T>(title: string, run: () => Promise<T> | T, done?: (value: T) => string): Promise<T> {
	console.log(`▸ ${title}`);
	try {
		const value = await run();
		console.log(`  ✓ ${done ? done(value) : 'done'}`);
		return value;
	} catch (err) {
		const hint = err instanceof StepError ? err.hint : 'Read the message above; `npm run stop`, then try again.';
		console.error(`  ✗ ${err instanceof Error ? err.message : String(err)}`);
		console.error(`  → ${hint}`);
		throw new StepFailed(title);
	}
}

/** Thrown after a step has printed its own failure; callers exit without printing it again. */
export class StepFailed extends Error {}

export function sleep(ms: number) {
	return new Promise((resolve) => setTimeout(resolve, ms));
}
