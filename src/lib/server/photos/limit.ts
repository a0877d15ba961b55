// Decoding a 50-megapixel photo takes a few hundred MB: at most a couple at once per process,
// the rest wait their turn instead of running the server out of memory.

export function limiter(concurrent: number) {
	let running = 0;
	const waiting: (() => void)[] = [];
	return async function run<T>(task: () => Promise<T>): Promise<T> {
		if (running >= concurrent) await new Promise<void>((resolve) => waiting.push(resolve));
		running++;
		try {
			return await task();
		} finally {
			running--;
			waiting.shift()?.();
		}
	};
}

/** Shared by the uploads and the photo readings. */
export const decodeSlot = limiter(2);
