// The local S3-compatible store: s3rver on loopback, keeping objects under .data/.
import S3rver from 's3rver';

export async function startObjectStore(opts: { port: number; dir: string; bucket: string }) {
	const server = new S3rver({
		port: opts.port,
		address: '127.0.0.1',
		directory: opts.dir,
		silent: true,
		configureBuckets: [{ name: opts.bucket, configs: [] }]
	});
	await server.run();
	return { close: () => server.close() };
}
