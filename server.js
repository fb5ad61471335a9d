/**
 * The production server: the built app (`npm run build` first) on a node:http server, as
 * adapter-node's own `build/index.js` runs it, with the app's fast lane in front of SvelteKit's
 * handler (src/lib/server/fast-lane.ts: score sheet saves without SvelteKit's per-request work;
 * everything else goes to SvelteKit). `node build` still runs the app without the lane.
 * Reads PORT (3000), HOST (0.0.0.0) and SHUTDOWN_TIMEOUT (30 s); the app reads the rest
 * (ORIGIN, BODY_SIZE_LIMIT, DATABASE_URL, …). SIGTERM or SIGINT: stops taking requests, lets the
 * open ones finish (up to SHUTDOWN_TIMEOUT), then lets the app close its database connections.
 */
import http from 'node:http';
import { handler } from './build/handler.js';

// Set by the app's init hook, which runs while build/handler.js loads.
const lane = globalThis[Symbol.for('crownbench.fast-lane')];
if (typeof lane !== 'function') {
	throw new Error('The built app has no fast lane: build it again with `npm run build`.');
}

const host = process.env.HOST || '0.0.0.0';
const port = Number(process.env.PORT || 3000);
const shutdownSeconds = Number(process.env.SHUTDOWN_TIMEOUT || 30);

const server = http.createServer((req, res) => lane(req, res, () => handler(req, res)));
server.listen(port, host, () => console.log(`Listening on http://${host}:${port}`));

let stopping = false;
/** @param {NodeJS.Signals} signal */
function shutdown(signal) {
	if (stopping) return;
	stopping = true;
	server.close(() => process.emit('sveltekit:shutdown', signal));
	server.closeIdleConnections();
	setTimeout(() => server.closeAllConnections(), shutdownSeconds * 1000).unref();
}
process.on('SIGTERM', shutdown);
process.on('SIGINT', shutdown);
