import { untrack } from 'svelte';
import { replaceState } from '$app/navigation';
import { page } from '$app/state';

/** Not a tool's inputs but where its result goes (a build, a saved design): kept through every edit. */
export const contextParams = ['build', 'design', 'revision'] as const;

/**
 * Keeps the page's address query equal to `query()`, after the context parameters the address
 * has, a moment after typing stops, so a design can be bookmarked or shared. While `leaveBare()`
 * says so (nothing changed since the page opened without a query), a bare address stays bare.
 * Call during component initialisation.
 */
export function keepQueryInAddress(query: () => string, leaveBare: (q: string) => boolean, delayMs = 350) {
	$effect(() => {
		const own = query();
		const bare = leaveBare(own);
		const timer = setTimeout(() => {
			const here = new URLSearchParams(location.search);
			const context = new URLSearchParams(contextParams.filter((k) => here.has(k)).map((k) => [k, here.get(k)!]));
			const q = [context.toString(), own].filter(Boolean).join('&');
			const current = location.search.replace(/^\?/, '');
			if (current === q || (bare && current === '')) return;
			const url = new URL(location.href);
			url.search = q;
			replaceState(url, page.state);
		}, delayMs);
		return () => clearTimeout(timer);
	});
}

/**
 * Calls `apply` with the page's loaded parameters whenever they change after it opened: a link to
 * a tool from the tool itself (the navigation's) loads afresh rather than leaving the old numbers.
 * Call during component initialisation.
 */
export function onParamsLoaded<T>(params: () => T, apply: (next: T) => void) {
	let loaded = untrack(params);
	$effect.pre(() => {
		const next = params();
		if (next === loaded) return;
		loaded = next;
		untrack(() => apply(next));
	});
}
