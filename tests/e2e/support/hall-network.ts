import http from 'node:http';
import type { AddressInfo, Socket } from 'node:net';

/**
 * The hall's network between a tablet and the app: an HTTP relay on a port of its own that can
 * be taken down, so the browser and its service worker both lose the app for real (Playwright's
 * offline switch does not always reach a service worker). While down, every connection is cut.
 * The relay speaks for the app's own address (Host, Origin and redirects), as a front server does.
 */
export interface HallNetwork {
	origin: string;
	up(): void;
	down(): void;
	close(): Promise<void>;
}

export async function startHallNetwork(appOrigin: string): Promise<HallNetwork> {
	const app = new URL(appOrigin);
	const sockets = new Set<Socket>();
	let isUp = true;
	let origin = '';
	const server = http.createServer((req, res) => {
		if (!isUp) {
			req.socket.destroy();
			return;
		}
		const headers = { ...req.headers, host: app.host };
		if (headers.origin) headers.origin = app.origin;
		if (headers.referer) headers.referer = headers.referer.replace(origin, app.origin);
		const upstream = http.request(
			{ host: app.hostname, port: app.port, method: req.method, path: req.url, headers },
			(answer) => {
				const out = { ...answer.headers };
				if (typeof out.location === 'string')
					out.location = out.location.replace(app.origin, origin);
				res.writeHead(answer.statusCode ?? 502, out);
				answer.pipe(res);
			}
		);
		upstream.on('error', () => res.destroy());
		req.pipe(upstream);
	});
	server.on('connection', (socket) => {
		sockets.add(socket);
		socket.on('close', () => sockets.delete(socket));
		if (!isUp) socket.destroy();
	});
	await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
	origin = `http://127.0.0.1:${(server.address() as AddressInfo).port}`;
	return {
		origin,
		up: () => {
			isUp = true;
		},
		down: () => {
			isUp = false;
			for (const socket of sockets) socket.destroy();
		},
		close: () => {
			for (const socket of sockets) socket.destroy();
			return new Promise((resolve) => server.close(() => resolve()));
		}
	};
}
