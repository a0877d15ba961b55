import { error } from '@sveltejs/kit';
import { env } from '$env/dynamic/private';
import { z } from 'zod';
import { fileResponse, queryOf } from '$lib/server/api';

// `npm run bench` only: the framework's floor, a body of `bytes` bytes that costs nothing to make,
// answered through the same hooks and the same file response as the exports it is compared with.
// Not part of the product: 404 unless the server was started with PW_BENCH=1.

const query = z.object({
	bytes: z.coerce
		.number({ error: 'bytes: a whole number from 1 to 10000000' })
		.int({ error: 'bytes: a whole number from 1 to 10000000' })
		.min(1, { error: 'bytes: a whole number from 1 to 10000000' })
		.max(10_000_000, { error: 'bytes: a whole number from 1 to 10000000' })
});

const bodies = new Map<number, Uint8Array>();

export function GET({ url }) {
	if (env.PW_BENCH !== '1') error(404, 'Not found');
	const q = queryOf(url, query);
	if (!q.ok) return q.response;
	const { bytes } = q.data;
	let body = bodies.get(bytes);
	if (!body) {
		if (bodies.size > 32) bodies.clear();
		body = new Uint8Array(bytes).fill(0x2e);
		bodies.set(bytes, body);
	}
	return fileResponse(body, 'application/octet-stream', `static-${bytes}.bin`);
}
