// `npm run bench -- --scale`: the big shop of issue 20 measured signed in, route by route, each
// figure beside its aim.
import { load, type LoadResult } from './load';
import { scaleSize, searchWord, type ScaleShop } from './scale-seed';

export const scaleAims = {
	p95Ms: 50,
	/**
	 * Our line for "bounded": a page of a list (20 to 100 rows) with its frame stays well under it,
	 * while an answer that grows with the data (2.6 MB and 14.2 MB in the issue) does not.
	 */
	maxBytes: 256 * 1024
} as const;

export interface ScaleRoute {
	label: string;
	path: string;
	accept: 'application/json' | 'text/html';
	/** How the route was reached, when that is worth saying (the paging used). */
	note?: string;
}

export interface ScaleFigure {
	route: ScaleRoute;
	bytes: number;
	load: LoadResult;
}

type Get = (path: string, accept: string) => Promise<{ status: number; text: string }>;

/** The builds list's next page after `listPath`, by the answer's `next` cursor; undefined on the last page. */
function nextPath(listPath: string, body: { next?: string | null }): string | undefined {
	if (!body.next) return undefined;
	const u = new URL(listPath, 'http://bench.invalid');
	u.searchParams.set('cursor', body.next);
	return u.pathname + u.search;
}

/**
 * The builds list about 50,000 rows deep (the issue measured page 2,500 of 20 by OFFSET), reached by
 * following `next` 100 rows at a time for at most `budgetMs`.
 */
export async function deepPage(get: Get, budgetMs = 60_000): Promise<{ api: string; page: string; note: string }> {
	const walk = '/api/v1/builds?size=100';
	const first = await get(walk, 'application/json');
	if (first.status !== 200) throw new Error(`${walk} answered ${first.status}`);
	let next = nextPath(walk, JSON.parse(first.text) as { next?: string | null });
	const deadline = Date.now() + budgetMs;
	let rows = 100;
	let at = next ?? walk;
	while (next && rows < 49_900 && Date.now() < deadline) {
		at = next;
		const res = await get(next, 'application/json');
		if (res.status !== 200) break;
		next = nextPath(next, JSON.parse(res.text) as { next?: string | null });
		rows += 100;
	}
	// The page size was only for the walk: the measured answer is the list's own default size.
	const u = new URL(at, 'http://bench.invalid');
	u.searchParams.delete('size');
	const page = new URL('/builds', 'http://bench.invalid');
	u.searchParams.forEach((v, k) => page.searchParams.set(k, v));
	return { api: u.pathname + u.search, page: page.pathname + page.search, note: `cursor, ${rows.toLocaleString('en')} rows in` };
}

export async function scaleRoutes(get: Get, shop: ScaleShop): Promise<ScaleRoute[]> {
	const deep = await deepPage(get);
	const { buildId, designId } = shop.longDesign;
	return [
		{ label: 'builds list (API)', path: '/api/v1/builds', accept: 'application/json' },
		{ label: 'builds list (page)', path: '/builds', accept: 'text/html' },
		{ label: 'deep page (API)', path: deep.api, accept: 'application/json', note: deep.note },
		{ label: 'deep page (page)', path: deep.page, accept: 'text/html', note: deep.note },
		{ label: `search, ${scaleSize.searchMatches} match (API)`, path: `/api/v1/builds?q=${searchWord}`, accept: 'application/json' },
		{ label: `search, ${scaleSize.searchMatches} match (page)`, path: `/builds?q=${searchWord}`, accept: 'text/html' },
		{ label: 'build, 1k photos+TDC (API)', path: `/api/v1/builds/${shop.bigBuildId}`, accept: 'application/json' },
		{ label: 'build, 1k photos+TDC (page)', path: `/builds/${shop.bigBuildId}`, accept: 'text/html' },
		{ label: 'build, 50k activity (page)', path: `/builds/${shop.busyBuildId}`, accept: 'text/html' },
		{ label: 'typical build (page)', path: `/builds/${shop.typicalBuildId}`, accept: 'text/html' },
		{ label: 'history, 5k revisions (page)', path: `/builds/${buildId}/designs/${designId}`, accept: 'text/html' },
		{ label: 'design, 5k revisions (API)', path: `/api/v1/designs/${designId}`, accept: 'application/json' }
	];
}

/** Each route alone: its answer's size once, then 10 connections for `seconds` after a short warm-up. */
export async function measureScale(
	url: string,
	routes: ScaleRoute[],
	headers: Record<string, string>,
	seconds: number,
	get: Get
): Promise<ScaleFigure[]> {
	const figures: ScaleFigure[] = [];
	for (const route of routes) {
		const first = await get(route.path, route.accept);
		if (first.status !== 200) throw new Error(`${route.label}: ${route.path} answered ${first.status}`);
		const bytes = Buffer.byteLength(first.text);
		const run = { label: route.label, url, connections: 10, path: () => route.path, headers: { ...headers, accept: route.accept } };
		await load({ ...run, seconds: Math.min(2, seconds) });
		figures.push({ route, bytes, load: await load({ ...run, seconds }) });
		console.log(`  ${route.label}: p95 ${figures.at(-1)!.load.p95.toFixed(0)} ms, ${bytes} B`);
	}
	return figures;
}

const kb = (b: number) => (b >= 1024 * 1024 ? `${(b / 1024 / 1024).toFixed(1)} MB` : `${(b / 1024).toFixed(1)} KB`);
const num = (v: number) => (Number.isFinite(v) ? (v >= 100 ? v.toFixed(0) : v.toFixed(1)) : '-');

/** The table: each figure beside its aim, ✓ or ✗. */
export function scaleReport(figures: ScaleFigure[], seconds: number, seedSeconds: number): string[] {
	const out = [
		'',
		`Big shop (${scaleSize.builds.toLocaleString('en')} builds, ${scaleSize.revisions.toLocaleString('en')} revisions, ` +
			`${scaleSize.activity.toLocaleString('en')} activity rows, ${scaleSize.photos.toLocaleString('en')} photos, ` +
			`${scaleSize.tdcRecords.toLocaleString('en')} TDC records; seeded in ${seedSeconds.toFixed(0)} s), signed in, ` +
			`10 connections, ${seconds} s a route`
	];
	const w = [30, 8, 12, 8, 13, 10, 13, 7];
	const pad = (cells: string[]) => cells.map((c, i) => (i === 0 ? c.padEnd(w[i]!) : c.padStart(w[i]!))).join('  ');
	out.push(pad(['', 'req/s', 'p50 ms', 'p95 ms', 'aim p95', 'size', 'aim size', 'errors']));
	for (const f of figures) {
		// No answer within the run (a 14 MB page under load): no latency to give, and the aim missed.
		const none = f.load.responses === 0;
		const fast = !none && f.load.p95 < scaleAims.p95Ms;
		const small = f.bytes <= scaleAims.maxBytes;
		out.push(
			pad([
				f.route.label,
				f.load.rps.toFixed(0),
				none ? `none in ${seconds} s` : num(f.load.p50),
				none ? '' : num(f.load.p95),
				`< ${scaleAims.p95Ms} ${fast ? '✓' : '✗'}`,
				kb(f.bytes),
				`≤ ${kb(scaleAims.maxBytes)} ${small ? '✓' : '✗'}`,
				String(f.load.errors)
			])
		);
		if (f.route.note) out.push(`    ${f.route.note}: ${f.route.path}`);
	}
	const met = figures.filter((f) => f.load.responses > 0 && f.load.p95 < scaleAims.p95Ms && f.bytes <= scaleAims.maxBytes).length;
	out.push(`  aims met: ${met} of ${figures.length} routes (p95 under ${scaleAims.p95Ms} ms and the answer bounded)`);
	return out;
}
