import { config } from './config';

export const afterSignIn = '/builds';

/**
 * Where to send the browser after signing in (or switching workshop): the path asked for when it
 * is a path on this app's own origin, parsed with `URL` against ORIGIN the way a browser would
 * resolve it (tabs and line breaks dropped, "\" read as "/"), else /builds. What comes back is the
 * parsed path, so it holds no control characters a header cannot carry.
 */
export function redirectTarget(raw: unknown, fallback = afterSignIn): string {
	return sameOriginPath(raw, config().origin, fallback);
}

/** The check itself, against a given origin (scheme://host[:port]). */
export function sameOriginPath(raw: unknown, origin: string, fallback = afterSignIn): string {
	if (typeof raw !== 'string' || !raw.startsWith('/')) return fallback;
	let url: URL;
	try {
		url = new URL(raw, origin);
	} catch {
		return fallback;
	}
	if (url.origin !== origin) return fallback;
	return url.pathname + url.search + url.hash;
}
