import { randomBytes, randomUUID } from 'node:crypto';
import { describe, expect, it } from 'vitest';
import { deleteObject, ensureBucket, getObject, putObject } from '../../src/lib/server/storage';

describe('objects through the S3 SDK in the S3-compatible fake', () => {
	it('stores, reads back byte for byte, and deletes an object', async () => {
		await ensureBucket();
		const key = `tests/${randomUUID()}/photo.bin`;
		const bytes = new Uint8Array(randomBytes(64 * 1024));

		await putObject(key, bytes, 'application/octet-stream');
		const read = await getObject(key);
		expect(read.contentType).toBe('application/octet-stream');
		expect(Buffer.from(read.body).equals(Buffer.from(bytes))).toBe(true);

		await deleteObject(key);
		await expect(getObject(key)).rejects.toThrow();
	});
});
