import type { Handle } from '@sveltejs/kit';

/**
 * Reads to its end, and drops, a request body the route never read: one refused before reading
 * (signed out, a made-up id, a wrong method). Left unread, a body larger than the socket's buffers
 * stalls the connection: the client gets its answer, but its next request on the same keep-alive
 * connection hangs until the server's keep-alive timeout resets it (seen with a 300 KB JSON body
 * sent signed out). What is read stays bounded by BODY_SIZE_LIMIT.
 */
export const drainBodyHandle: Handle = async ({ event, resolve }) => {
	const response = await resolve(event);
	const body = event.request.body;
	if (body && !event.request.bodyUsed) void body.pipeTo(new WritableStream()).catch(() => {});
	return response;
};
