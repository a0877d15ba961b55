import type { Handle } from '@sveltejs/kit';
import { refusal } from './refusal';

// SvelteKit looks a posted action up as `actions[name]`, so a name the page never defined but every
// object inherits answers as if it were one: `?/constructor` and `?/__proto__` gave 500s, and
// `?/toString` "succeeded". Only a page's own actions are actions; anything else is 404.

type PageServer = { actions?: Record<string, unknown> };

// The pages' server modules, loaded when first asked for: the same modules SvelteKit runs.
const pageServers = import.meta.glob<PageServer>('/src/routes/**/+page.server.ts');

/** The action a POST to a page names, the way SvelteKit reads it: the first `?/name` parameter, else the default one. */
export function requestedAction(url: URL): { name: string; named: boolean } {
	for (const [key] of url.searchParams) if (key.startsWith('/')) return { name: key.slice(1), named: true };
	return { name: 'default', named: false };
}

export const formActionHandle: Handle = async ({ event, resolve }) => {
	if (event.request.method !== 'POST' || !event.route.id) return resolve(event);
	const load = pageServers[`/src/routes${event.route.id === '/' ? '' : event.route.id}/+page.server.ts`];
	// Not a page with a server module (an API endpoint, say): SvelteKit answers that itself.
	if (!load) return resolve(event);
	const { actions } = await load();
	if (!actions) return resolve(event);
	const { name, named } = requestedAction(event.url);
	// "default" named outright is refused by SvelteKit with an error (a 500): it is no action's name either.
	if ((named && name === 'default') || !Object.hasOwn(actions, name) || typeof actions[name] !== 'function') {
		return refusal(event, 404, `No form action “${name.slice(0, 60)}” on this page.`, 'not-found');
	}
	return resolve(event);
};
