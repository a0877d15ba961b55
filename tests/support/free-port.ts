import { once } from 'node:events';
import { createServer } from 'node:net';

/** A loopback port free at the moment of asking: for a test that starts a server of its own. */
export async function freePort(): Promise<number> {
	const server = createServer();
	server.listen(0, '127.0.0.1');
	await once(server, 'listening');
	const port = (server.address() as { port: number }).port;
	server.close();
	await once(server, 'close');
	return port;
}
