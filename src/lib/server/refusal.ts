import { json, type RequestEvent } from '@sveltejs/kit';

/**
 * A refusal answered from a handle, before any route code runs, in the shape the caller reads:
 * a form posted by `enhance` gets SvelteKit's action result ({ type: 'error', error }), a JSON
 * client gets { message, code }, a browser plain text.
 */
export function refusal(event: RequestEvent, status: number, message: string, code: string): Response {
	const accept = event.request.headers.get('accept') ?? '';
	if (event.request.method === 'POST' && event.request.headers.get('x-sveltekit-action') === 'true') {
		return json({ type: 'error', error: { message, code } }, { status });
	}
	if (accept.includes('application/json') || event.url.pathname.startsWith('/api/')) return json({ message, code }, { status });
	return new Response(`${message}\n`, { status, headers: { 'content-type': 'text/plain; charset=utf-8' } });
}
