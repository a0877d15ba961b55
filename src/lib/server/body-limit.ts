import type { Handle } from '@sveltejs/kit';
import { edgeLogLimits } from '$lib/trade/edge-log';
import { refusal } from './refusal';

/**
 * The largest request body each route reads. BODY_SIZE_LIMIT (21M, scripts/profile.ts) is what
 * adapter-node lets through at all, for the photo upload; everything else is a form or a JSON
 * object of a few KB (a design's 80 parameters of at most 500 characters fit in 64 KB), and a
 * 20 MB form posted to /signin cost 7 s of CPU to parse before anything looked at it.
 */
export const bodyLimits = { default: 64 * 1024 } as const;

/** Routes that read larger bodies, with their own caps inside BODY_SIZE_LIMIT (photos/+server.ts). */
const largeBodyRoutes = new Set(['/api/v1/builds/[buildId]/photos']);

/** Routes whose larger cap this handle keeps: the edge log's text, with a multipart form's framing. */
const routeLimits: Record<string, number> = { '/api/v1/signal/log': edgeLogLimits.bytes + 64 * 1024 };

const tooLarge = (limit: number) =>
	`body: at most ${limit / 1024} KB (${limit} bytes) for this request${limit === bodyLimits.default ? '; only photo uploads take more' : ''}`;

/**
 * Refuses a body over the route's limit with 413 before anything parses it: by its declared
 * Content-Length, or, streamed without one (or longer than declared), as it comes in. A body within
 * the limit is read here and handed on whole, so the route's parser never sees more.
 */
export const bodyLimitHandle: Handle = async ({ event, resolve }) => {
	const { request } = event;
	if (!request.body || request.method === 'GET' || request.method === 'HEAD') return resolve(event);
	if (event.route.id && largeBodyRoutes.has(event.route.id)) return resolve(event);
	const limit = (event.route.id && routeLimits[event.route.id]) || bodyLimits.default;
	const declared = Number(request.headers.get('content-length'));
	// Left unread: drain-body.ts reads it to its end (no parsing) so the connection serves the next request.
	if (Number.isFinite(declared) && declared > limit) return refusal(event, 413, tooLarge(limit), 'too-large');

	const reader = request.body.getReader();
	const chunks: Uint8Array[] = [];
	let size = 0;
	try {
		for (let next = await reader.read(); !next.done; next = await reader.read()) {
			size += next.value.byteLength;
			if (size > limit) {
				void discard(reader);
				return refusal(event, 413, tooLarge(limit), 'too-large');
			}
			chunks.push(next.value);
		}
	} catch (err) {
		// adapter-node errors the stream when a body outgrows its Content-Length or BODY_SIZE_LIMIT.
		if ((err as { status?: number }).status === 413) return refusal(event, 413, tooLarge(limit), 'too-large');
		return refusal(event, 400, 'body: the request body could not be read to its end', 'invalid');
	}
	const body = new Uint8Array(size);
	let at = 0;
	for (const chunk of chunks) {
		body.set(chunk, at);
		at += chunk.byteLength;
	}
	event.request = new Request(request.url, { method: request.method, headers: request.headers, body, signal: request.signal });
	return resolve(event);
};

/** Reads the rest of a refused body without keeping it, so the client can read our answer and reuse the connection. */
async function discard(reader: ReadableStreamDefaultReader<Uint8Array>) {
	try {
		while (!(await reader.read()).done);
	} catch {
		// The client went away, or adapter-node's own limit ended the stream: nothing left to read.
	}
}
