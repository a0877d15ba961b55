// What a page's JavaScript weighs on the wire, from the build: the client entry's scripts and those
// of the page's layouts and leaf (what SvelteKit preloads for it, from its server manifest), each
// gzipped at level 9 as a static file server would. Chunks loaded later by import() are not counted.
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { gzipSync } from 'node:zlib';
import { root } from '../profile';

export interface PageScripts {
	files: { file: string; bytes: number; gzip: number }[];
	bytes: number;
	gzip: number;
}

const output = join(root, '.svelte-kit', 'output', 'server');

function listAfter(text: string, pattern: RegExp, what: string): string[] {
	const m = pattern.exec(text);
	if (!m) throw new Error(`the build's server manifest has no ${what}; has the SvelteKit output format changed?`);
	return JSON.parse(m[1]!) as string[];
}

/**
 * The client scripts a page route (e.g. "/wheel") loads before it runs, read from the build in
 * `buildDir`. The manifest comes from SvelteKit's output of the last build; the client scripts do
 * not depend on which build it was (only server code reads VITE_PW_BENCH), so the names agree.
 */
export function pageScripts(routeId: string, buildDir: string): PageScripts {
	const manifest = readFileSync(join(output, 'manifest.js'), 'utf8');
	const entry = listAfter(manifest, /client: \{[^}]*?imports:(\[[^\]]*\])/, 'client entry');
	const route = new RegExp(
		`id: "${routeId.replace(/[/]/g, '\\/')}",[^}]*?page: \\{ layouts: \\[([^\\]]*)\\], errors: \\[[^\\]]*\\], leaf: (\\d+) \\}`
	).exec(manifest);
	if (!route) throw new Error(`no page ${routeId} in the build's server manifest`);
	const nodes = [...route[1]!.split(',').filter(Boolean), route[2]!].map(Number);
	const nodeScripts = nodes.flatMap((n) =>
		listAfter(readFileSync(join(output, 'nodes', `${n}.js`), 'utf8'), /export const imports = (\[[^\]]*\]);/, `imports for node ${n}`)
	);
	const files = [...new Set([...entry, ...nodeScripts])].map((file) => {
		const body = readFileSync(join(root, buildDir, 'client', file));
		return { file, bytes: body.length, gzip: gzipSync(body, { level: 9 }).length };
	});
	files.sort((a, b) => b.gzip - a.gzip);
	return { files, bytes: files.reduce((s, f) => s + f.bytes, 0), gzip: files.reduce((s, f) => s + f.gzip, 0) };
}
