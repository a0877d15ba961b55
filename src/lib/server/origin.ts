import type { Handle, RequestEvent } from '@sveltejs/kit';
import { dev } from '$app/environment';
import { config } from './config';

// The app's address is what ORIGIN says, never what a request claims: Host and X-Forwarded-*
// are chosen by whoever sends the request, and Auth.js builds its sign-in links from them.

/** An absolute link into the app, for e-mails: the configured origin and a path. */
export function linkTo(path: string): string {
	return new URL(path, config().origin).href;
}

/** The same link moved onto the configured origin (Auth.js makes its links from the request). */
export function onOrigin(url: string): string {
	const parsed = new URL(url);
	return linkTo(parsed.pathname + parsed.search);
}

export function isLoopback(address: string): boolean {
	const a = address.replace(/^::ffff:/i, '');
	return a === '::1' || /^127\.\d{1,3}\.\d{1,3}\.\d{1,3}$/.test(a);
}

/** Whether a Host-style value names the origin's host (the default port may be written out). */
function namesHost(value: string | null, origin: URL): boolean {
	if (value === null) return false;
	const v = value.trim().toLowerCase();
	const defaultPort = origin.protocol === 'https:' ? '443' : '80';
	return v === origin.host || (!origin.port && v === `${origin.host}:${defaultPort}`);
}

/**
 * Why a request does not belong to this app, or null when it does: its Host (or the header
 * adapter-node's HOST_HEADER names) must be the configured origin's, and X-Forwarded-Host and
 * X-Forwarded-Proto, when sent, must say the same (DNS rebinding; links built from headers).
 * A health probe from loopback may use any name (a container's `curl localhost/api/health`).
 */
export function hostRefusal(
	headers: Headers,
	opts: { origin: string; hostHeader?: string; client: () => string; path: string }
): string | null {
	if (opts.path === '/api/health' && isLoopback(opts.client())) return null;
	const origin = new URL(opts.origin);
	if (!namesHost(headers.get(opts.hostHeader?.toLowerCase() || 'host'), origin)) return 'Host';
	const forwardedHost = headers.get('x-forwarded-host');
	if (forwardedHost !== null && !namesHost(forwardedHost, origin)) return 'X-Forwarded-Host';
	const forwardedProto = headers.get('x-forwarded-proto');
	if (forwardedProto !== null && `${forwardedProto.toLowerCase()}:` !== origin.protocol) return 'X-Forwarded-Proto';
	return null;
}

/** The client's address, or '' where there is none to tell (adapter-node throws when ADDRESS_HEADER is missing). */
export function clientAddress(event: RequestEvent): string {
	try {
		return event.getClientAddress();
	} catch {
		return '';
	}
}

/**
 * The built server answers only under its configured name: 421 Misdirected Request (RFC 9110
 * 15.5.20) otherwise. SvelteKit's own fetches during a page load (sub-requests) carry no Host.
 */
export const hostHandle: Handle = async ({ event, resolve }) => {
	if (dev || event.isSubRequest) return resolve(event);
	const refused = hostRefusal(event.request.headers, {
		origin: config().origin,
		hostHeader: process.env.HOST_HEADER,
		client: () => clientAddress(event),
		path: event.url.pathname
	});
	if (!refused) return resolve(event);
	return new Response(
		`421 Misdirected Request: this server answers only for ${config().origin} (the request's ${refused} names another).\n`,
		{
			status: 421,
			headers: { 'content-type': 'text/plain; charset=utf-8' }
		}
	);
};

/** Request headers for Auth.js's own requests: the configured host, nothing forwarded (Auth.js reads them for its links). */
export function originHeaders(from: Headers): Headers {
	const headers = new Headers(from);
	headers.set('host', new URL(config().origin).host);
	headers.delete('x-forwarded-host');
	headers.delete('x-forwarded-proto');
	return headers;
}
