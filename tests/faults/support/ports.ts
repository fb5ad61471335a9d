import net from 'node:net';

/** A TCP port on 127.0.0.1 that is free right now (the system picks it). */
export function freePort(): Promise<number> {
	return new Promise((resolve, reject) => {
		const server = net.createServer();
		server.unref();
		server.on('error', reject);
		server.listen(0, '127.0.0.1', () => {
			const address = server.address();
			const port = typeof address === 'object' && address ? address.port : 0;
			server.close(() => resolve(port));
		});
	});
}

/** The port in an environment variable, or a free one. */
export async function portFromEnv(name: string): Promise<number> {
	const value = process.env[name];
	if (value) {
		const port = Number(value);
		if (!Number.isInteger(port) || port <= 0 || port > 65535) {
			throw new Error(`${name} must be a port number, not "${value}"`);
		}
		return port;
	}
	return freePort();
}
