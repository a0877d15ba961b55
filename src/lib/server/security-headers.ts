import { json, type Handle } from '@sveltejs/kit';

// Response headers every answer carries, after OWASP's HTTP Security Response Headers cheat sheet
// (common practice). Pages get their Content-Security-Policy from SvelteKit (kit.csp in
// svelte.config.js), which puts a nonce on its own inline script; everything else (the API, files,
// Auth.js's answers) gets the strict one below, since none of it is a page to run scripts in.

/** For answers that are not pages: nothing loads, nothing frames it. */
export const nonPagePolicy = "default-src 'none'; frame-ancestors 'none'; base-uri 'none'; form-action 'none'";

/** The phone camera is used from the upload form (<input capture>); nothing else is needed. */
export const permissionsPolicy =
	'camera=(self), microphone=(), geolocation=(), payment=(), usb=(), serial=(), bluetooth=(), midi=(), display-capture=()';

export const alwaysHeaders: Record<string, string> = {
	'x-content-type-options': 'nosniff',
	// Invitation and reset tokens travel in paths: never hand a path to another site.
	'referrer-policy': 'same-origin',
	'x-frame-options': 'DENY',
	'permissions-policy': permissionsPolicy,
	'cross-origin-opener-policy': 'same-origin'
};

/** Two years, sub-domains too (the value the HSTS preload list asks for); only ever sent over https. */
export const hsts = 'max-age=63072000; includeSubDomains';

const writes = new Set(['POST', 'PUT', 'PATCH', 'DELETE']);

function withHeaders(response: Response, headers: Record<string, string>): Response {
	try {
		for (const [name, value] of Object.entries(headers)) response.headers.set(name, value);
		return response;
	} catch {
		// Headers of a response that came from fetch() are immutable: copy it.
		const copy = new Response(response.body, response);
		for (const [name, value] of Object.entries(headers)) copy.headers.set(name, value);
		return copy;
	}
}

export const securityHeadersHandle: Handle = async ({ event, resolve }) => {
	// SvelteKit refuses cross-site form posts (form and text/plain bodies); an API write of any
	// other content type from a page of another origin is refused here too, so no CORS set-up in
	// front of the app can open the JSON API to other sites. Clients without a browser send no Origin.
	const origin = event.request.headers.get('origin');
	if (writes.has(event.request.method) && event.url.pathname.startsWith('/api/') && origin !== null && origin !== event.url.origin) {
		return withHeaders(
			json(
				{ message: `Cross-origin writes are refused (Origin ${origin} is not ${event.url.origin}).`, code: 'cross-origin' },
				{ status: 403 }
			),
			{
				...alwaysHeaders,
				'content-security-policy': nonPagePolicy
			}
		);
	}
	const response = await resolve(event);
	const headers: Record<string, string> = { ...alwaysHeaders };
	if (!response.headers.has('content-security-policy')) headers['content-security-policy'] = nonPagePolicy;
	if (event.url.protocol === 'https:') headers['strict-transport-security'] = hsts;
	return withHeaders(response, headers);
};
