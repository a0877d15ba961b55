import { z } from 'zod';

/**
 * The query of a build's list routes (photos, TDC records, tapes, signal checks, cutting packages,
 * activity): `cursor` is the `next` an earlier page answered; without it the list starts at its newest.
 * The server reads the cursor itself (src/lib/server/keyset.ts) and refuses one it did not write.
 */
export const listQuery = z.object({
	cursor: z.string().max(120).optional().describe('The `next` of the page before; opaque. Without it, the newest page.')
});
