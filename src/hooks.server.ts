import type { Handle, HandleServerError } from '@sveltejs/kit';
import { sequence } from '@sveltejs/kit/hooks';
import { building, dev } from '$app/environment';
import { parseTheme, themeCookie } from '$lib/theme';
import { bodyLimitHandle } from '$lib/server/body-limit';
import { drainBodyHandle } from '$lib/server/drain-body';
import { hostHandle } from '$lib/server/origin';
import { formActionHandle } from '$lib/server/form-actions';
import { securityHeadersHandle } from '$lib/server/security-headers';
import { counted, installShutdown } from '$lib/server/shutdown';
import { unavailableError, unavailableHandle } from '$lib/server/unavailable';
import { authHandle } from './auth';

/**
 * Reads the theme choice from its cookie and writes it into <html data-theme>, so the first paint
 * already has the right colours (no flash of the wrong theme).
 */
export const themeHandle: Handle = async ({ event, resolve }) => {
	const theme = parseTheme(event.cookies.get(themeCookie));
	event.locals.theme = theme;
	return resolve(event, {
		transformPageChunk: ({ html }) => html.replace('%pw.theme%', theme)
	});
};

// Only the built server stops by signal through adapter-node; Vite's dev server keeps its own Ctrl-C.
if (!dev && !building) installShutdown();

/**
 * Counts each request as work in flight until its handler is done, even when its client has gone
 * (adapter-node counts connections only), so a stop closes the pool after it (shutdown.ts).
 */
export const inFlightHandle: Handle = ({ event, resolve }) => counted(async () => resolve(event));

// inFlightHandle outermost of all. Auth.js first: it answers its own routes under /auth and gives every request
// locals.auth().
// unavailableHandle outermost: it turns a lost database connection anywhere inside into a 503.
// drainBodyHandle around even that: it reads what a refusal left unread, so the connection serves
// the next request (drain-body.ts). hostHandle next: a request for another host name is refused
// before anything reads it (origin.ts). formActionHandle answers 404 for an action the page does
// not define, and bodyLimitHandle 413 for a body over the route's cap, both before Auth.js or a
// route reads anything.
// The bench's floor (`npm run bench`) last, behind every other hook as the exports are. The constant
// is fixed at build time: only the bench's own build (VITE_PW_BENCH=1) has the branch and the module.
const benchHandles: Handle[] = import.meta.env.VITE_PW_BENCH === '1' ? [(await import('$lib/server/bench-floor')).benchFloorHandle] : [];
export const handle: Handle = sequence(
	inFlightHandle,
	drainBodyHandle,
	hostHandle,
	unavailableHandle,
	securityHeadersHandle,
	formActionHandle,
	bodyLimitHandle,
	authHandle,
	themeHandle,
	...benchHandles
);

/** A lost database connection answers 503 (see unavailable.ts); anything else is logged as a fault. */
export const handleError: HandleServerError = ({ error, event, status, message }) => {
	const unavailable = unavailableError(error, event);
	if (unavailable) return unavailable;
	// SvelteKit reports an address that matches no route here too: that is no fault of ours.
	if (status !== 404) console.error(error);
	return { message };
};
