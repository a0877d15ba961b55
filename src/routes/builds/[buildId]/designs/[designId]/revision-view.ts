// The history page's view in its address: which page of revisions (cursor), what was searched (q)
// and the two compared (a, b). Every link and form of the page is built from it, so each works
// without JavaScript and a shared address opens the same view.

/** A revision as the page gets it from its load. */
export interface ShownRevision {
	number: number;
	params: Record<string, string>;
	message: string;
	restoredFrom: number | null;
	author: string | null;
	createdAt: string | Date;
}

export interface HistoryView {
	q: string;
	cursor: string | null;
	a: number | null;
	b: number | null;
}

/** The address of a view: only what differs from the default (the newest page, the two newest compared). */
export function historyHref(path: string, view: HistoryView): string {
	const query = new URLSearchParams();
	if (view.q) query.set('q', view.q);
	if (view.cursor) query.set('cursor', view.cursor);
	if (view.a !== null) query.set('a', String(view.a));
	if (view.b !== null) query.set('b', String(view.b));
	const search = query.toString();
	return search ? `${path}?${search}` : path;
}
