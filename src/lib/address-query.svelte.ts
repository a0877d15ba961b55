import { replaceState } from '$app/navigation';
import { page } from '$app/state';

/**
 * Keeps the page's address query equal to `query()`, a moment after typing stops, so a design
 * can be bookmarked or shared. While `leaveBare()` says so (nothing changed since the page opened
 * without a query), a bare address stays bare. Call during component initialisation.
 */
export function keepQueryInAddress(query: () => string, leaveBare: (q: string) => boolean, delayMs = 350) {
	$effect(() => {
		const q = query();
		const bare = leaveBare(q);
		const timer = setTimeout(() => {
			const current = location.search.replace(/^\?/, '');
			if (current === q || (bare && current === '')) return;
			const url = new URL(location.href);
			url.search = q;
			replaceState(url, page.state);
		}, delayMs);
		return () => clearTimeout(timer);
	});
}
