// The files made most recently, by what they were made from: the same query often comes back
// (a download link opened twice, a fabricator's tool fetching again), and a file costs
// milliseconds to make but microseconds to hand back. Least recently used goes first.

/** The key for what a file is made from. */
export { valueKey as keyOf } from '$lib/trade/value-key';

export class Recent<V> {
	private readonly items = new Map<string, V>();

	constructor(private readonly limit: number) {}

	get(key: string): V | undefined {
		const value = this.items.get(key);
		if (value !== undefined) {
			// Map keeps insertion order: moving a hit to the end keeps the oldest first.
			this.items.delete(key);
			this.items.set(key, value);
		}
		return value;
	}

	set(key: string, value: V): V {
		this.items.delete(key);
		this.items.set(key, value);
		if (this.items.size > this.limit) this.items.delete(this.items.keys().next().value!);
		return value;
	}

	delete(key: string) {
		this.items.delete(key);
	}

	get size() {
		return this.items.size;
	}
}
