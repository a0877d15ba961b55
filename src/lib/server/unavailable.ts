import { createHash } from 'node:crypto';
import type { Handle, RequestEvent } from '@sveltejs/kit';
import { palette } from '../../../tailwind.config';

// While PostgreSQL is down or restarting, a request that needs it fails with a connection error.
// That is not a fault of the request nor of the code: the answer is 503 with Retry-After, so
// clients and load balancers wait and retry, and the pool reconnects by itself once the database
// is back. handleError recognises these errors and marks the request; unavailableHandle turns the
// 500 that SvelteKit would send into that 503.

/** Seconds a client should wait before trying again: a restart or failover takes a few. */
export const retryAfterS = 5;

export const unavailableMessage = 'Phasewright cannot reach its database just now; try again in a few seconds.';

// PostgreSQL SQLSTATEs meaning "the server is not there for you right now": class 08 (connection
// exception), 53300 too many connections, 57P01-57P03 admin shutdown, crash shutdown, cannot
// connect now (starting up or shutting down). PostgreSQL documentation, Appendix A.
const sqlStates = new Set(['08000', '08001', '08003', '08004', '08006', '08P01', '53300', '57P01', '57P02', '57P03']);
// Node's socket errors when the server's port is closed, reset or silent.
const socketCodes = new Set(['ECONNREFUSED', 'ECONNRESET', 'EPIPE', 'ETIMEDOUT', 'EHOSTUNREACH', 'ENETUNREACH']);
// node-postgres reports a dropped connection and a full pool's wait by message only.
const driverMessages =
	/connection terminated|timeout exceeded when trying to connect|not queryable|connection is closed|database system is (starting up|shutting down|in recovery mode)/i;

/** True when the error, or anything it wraps (Drizzle and Auth.js keep the driver's error as `cause`), is a lost database connection. */
export function isUnavailable(err: unknown, depth = 0): boolean {
	if (depth > 6 || typeof err !== 'object' || err === null) return false;
	const { code, message, cause, errors } = err as { code?: unknown; message?: unknown; cause?: unknown; errors?: unknown };
	if (typeof code === 'string' && (sqlStates.has(code) || socketCodes.has(code))) return true;
	if (typeof message === 'string' && driverMessages.test(message)) return true;
	// Node reports a refused connection to a host with several addresses as an AggregateError.
	if (Array.isArray(errors) && errors.some((e) => isUnavailable(e, depth + 1))) return true;
	return isUnavailable(cause, depth + 1);
}

const marked = new WeakSet<object>();

/**
 * For handleError: when `error` is a lost connection, marks the request for unavailableHandle
 * and gives the error body to show; otherwise undefined.
 */
export function unavailableError(error: unknown, event: RequestEvent): App.Error | undefined {
	if (!isUnavailable(error)) return undefined;
	marked.add(event.locals);
	console.warn(`unavailable: ${event.request.method} ${event.url.pathname} answered 503 (${describe(error)})`);
	return { message: unavailableMessage, code: 'unavailable' };
}

function describe(err: unknown): string {
	const messages: string[] = [];
	for (let e = err, i = 0; e instanceof Error && i < 4; e = e.cause, i++) messages.push(e.message.split('\n')[0]!);
	return messages.at(-1) ?? String(err);
}

/** Turns the 500 of a request marked by unavailableError (or a connection error thrown past every handle) into a 503. */
export const unavailableHandle: Handle = async ({ event, resolve }) => {
	let response: Response;
	try {
		response = await resolve(event);
	} catch (err) {
		if (!isUnavailable(err)) throw err;
		console.warn(`unavailable: ${event.request.method} ${event.url.pathname} answered 503 (${describe(err)})`);
		return unavailableResponse(event);
	}
	// A client-side navigation's data request carries a failed load inside a 200; the client
	// shows a non-200 answer as an error page of that status, and then reloads the page in full.
	if (marked.has(event.locals) && (response.status === 500 || event.isDataRequest)) return unavailableResponse(event, response);
	return response;
};

export function unavailableResponse(event: RequestEvent, original?: Response): Response {
	const headers = new Headers(original?.headers);
	for (const name of ['content-type', 'content-length', 'content-encoding', 'etag', 'last-modified', 'location']) headers.delete(name);
	headers.set('retry-after', String(retryAfterS));
	headers.set('cache-control', 'no-store');
	const body = { message: unavailableMessage, code: 'unavailable' };
	if (event.request.headers.get('x-sveltekit-action') === 'true') {
		// What `enhance` reads from a form action; it keeps the status of the response.
		headers.set('content-type', 'application/json');
		return new Response(JSON.stringify({ type: 'error', error: body }), { status: 503, headers });
	}
	const accept = event.request.headers.get('accept') ?? '';
	if (event.url.pathname.startsWith('/api/') || event.isDataRequest || !accept.includes('text/html')) {
		headers.set('content-type', 'application/json');
		return new Response(JSON.stringify(body), { status: 503, headers });
	}
	headers.set('content-type', 'text/html; charset=utf-8');
	// Whatever policy the failed answer carried was made for other content.
	headers.set('content-security-policy', unavailablePagePolicy);
	headers.set('x-content-type-options', 'nosniff');
	return new Response(unavailablePage(event.locals.theme), { status: 503, headers });
}

const css = (mode: 'light' | 'dark') =>
	Object.entries(palette)
		.map(([name, v]) => `--pw-${name}:${v[mode]}`)
		.join(';');

const style = `
			:root { ${css('light')}; color-scheme: light; }
			:root[data-theme='dark'] { ${css('dark')}; color-scheme: dark; }
			@media (prefers-color-scheme: dark) { :root[data-theme='system'] { ${css('dark')}; color-scheme: dark; } }
			body { font: 16px/1.5 Inter, system-ui, sans-serif; margin: 3rem auto; max-width: 36rem; padding: 0 1.25rem; color: var(--pw-ink); background: var(--pw-paper); }
			p.note { color: var(--pw-ink-muted); }
			a { display: inline-flex; align-items: center; min-height: 2.75rem; padding: 0 1rem; border-radius: 0.375rem; background: var(--pw-layout); color: var(--pw-on-layout); font-weight: 600; text-decoration: none; }
			a:focus-visible { outline: 2px solid var(--pw-layout); outline-offset: 2px; }
		`;

/** The page's own policy: its one inline style by hash, nothing else loads (CSP Level 3, hash-source). */
export const unavailablePagePolicy = `default-src 'none'; style-src 'sha256-${createHash('sha256').update(style).digest('base64')}'; base-uri 'none'; form-action 'self'; frame-ancestors 'none'`;

/**
 * A page of its own, not the app's layout: the layout reads the signed-in user's workshops from
 * the very database that is missing. No automatic reload: a timed refresh takes the page away
 * from someone still reading it (WCAG 2.2.1).
 */
export function unavailablePage(theme: string | undefined): string {
	const chosen = theme === 'light' || theme === 'dark' ? theme : 'system';
	return `<!doctype html>
<html lang="en" data-theme="${chosen}">
	<head>
		<meta charset="utf-8" />
		<meta name="viewport" content="width=device-width, initial-scale=1" />
		<title>Briefly unavailable: Phasewright</title>
		<style>${style}</style>
	</head>
	<body>
		<main>
			<p class="note">Error 503 · unavailable</p>
			<h1>Briefly unavailable</h1>
			<p>${unavailableMessage}</p>
			<p class="note">If you were saving something, go back and save it again once Phasewright answers.</p>
			<p><a href="">Try again now</a></p>
		</main>
	</body>
</html>
`;
}
