// Load on the built server through autocannon, on loopback only: every run is bounded in time and
// stops by itself. Latencies are kept per response (autocannon's own summary has no p95).
import autocannon from 'autocannon';

export interface LoadRun {
	label: string;
	/** The base address, e.g. http://127.0.0.1:3100 (loopback). */
	url: string;
	connections: number;
	seconds: number;
	/** The path of the n-th request (0, 1, 2 …), so the parameters can change per request. */
	path: (n: number) => string;
	headers?: Record<string, string>;
}

export interface LoadResult {
	label: string;
	connections: number;
	seconds: number;
	responses: number;
	rps: number;
	p50: number;
	p95: number;
	p99: number;
	/** Connection errors (timeouts among them) and answers other than 2xx. */
	errors: number;
	non2xx: number;
	/** Every response's latency, ms, sorted. */
	latencies: number[];
}

/** The value below which a share q of the sorted values fall (nearest rank). */
export function percentile(sorted: number[], q: number): number {
	if (!sorted.length) return NaN;
	return sorted[Math.min(sorted.length - 1, Math.max(0, Math.ceil(q * sorted.length) - 1))]!;
}

export async function load(run: LoadRun): Promise<LoadResult> {
	const host = new URL(run.url).hostname;
	if (!/^127\.|^localhost$|^\[::1\]$/.test(host)) throw new Error(`load is sent to loopback only, not ${host}`);
	let n = 0;
	const latencies: number[] = [];
	const result = await new Promise<autocannon.Result>((resolve, reject) => {
		const instance = autocannon(
			{
				url: run.url,
				connections: run.connections,
				duration: run.seconds,
				headers: run.headers,
				requests: [{ setupRequest: (req) => ({ ...req, path: run.path(n++) }) }]
			},
			(err, result) => (err ? reject(err) : resolve(result))
		);
		instance.on('response', (_client, _status, _bytes, ms) => latencies.push(ms));
	});
	latencies.sort((a, b) => a - b);
	const non2xx = result.non2xx;
	return {
		label: run.label,
		connections: run.connections,
		seconds: run.seconds,
		responses: latencies.length,
		rps: latencies.length / (result.duration || run.seconds),
		p50: percentile(latencies, 0.5),
		p95: percentile(latencies, 0.95),
		p99: percentile(latencies, 0.99),
		errors: result.errors + non2xx,
		non2xx,
		latencies
	};
}

/** Several runs at once, each with its own connections, for the same time: one mixed load. */
export async function loadTogether(runs: LoadRun[]): Promise<LoadResult[]> {
	return Promise.all(runs.map(load));
}
