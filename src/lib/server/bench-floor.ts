import type { Handle } from '@sveltejs/kit';
import { z } from 'zod';
import { fileResponse, queryOf } from './api';

// `npm run bench` only: the framework's floor, a body of `bytes` bytes that costs nothing to make,
// answered through the same hooks and the same file response as the exports it is compared with.
// Not part of the product: hooks.server.ts imports it only in the bench's own build
// (VITE_PW_BENCH=1, into build-bench/), so every other build leaves this file out.

const path = '/api/bench/static';
const wording = 'bytes: a whole number from 1 to 10000000';
const query = z.object({
	bytes: z.coerce.number({ error: wording }).int({ error: wording }).min(1, { error: wording }).max(10_000_000, { error: wording })
});

const bodies = new Map<number, Uint8Array>();

/** Innermost in the hooks' sequence, so the floor pays for every other hook as an export does. */
export const benchFloorHandle: Handle = async ({ event, resolve }) => {
	if (event.url.pathname !== path || event.request.method !== 'GET') return resolve(event);
	const q = queryOf(event.url, query);
	if (!q.ok) return q.response;
	const { bytes } = q.data;
	let body = bodies.get(bytes);
	if (!body) {
		if (bodies.size > 32) bodies.clear();
		body = new Uint8Array(bytes).fill(0x2e);
		bodies.set(bytes, body);
	}
	return fileResponse(body, 'application/octet-stream', `static-${bytes}.bin`);
};
