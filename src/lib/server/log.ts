/**
 * Structured JSON logs (pino), one line per event, to standard output. Nothing personal goes in:
 * no addresses, names, cookies, query strings or client addresses; requests are named by their
 * route (`/chair/shows/[slug]`) and a request id. Errors carry their message and stack only.
 */
import { pino, type Logger } from 'pino';
import { config } from './config';

let root: Logger | null = null;

/** The process's logger (level from LOG_LEVEL), made on first use. */
export function logger(): Logger {
	root ??= pino({
		level: config().logLevel,
		base: { pid: process.pid },
		timestamp: pino.stdTimeFunctions.isoTime,
		formatters: { level: (label) => ({ level: label }) }
	});
	return root;
}

/** The parts of an error worth a log line: its kind, message and stack (never its data). */
export function errorFields(error: unknown): { name?: string; message: string; stack?: string } {
	if (error instanceof Error)
		return { name: error.name, message: error.message, stack: error.stack };
	return { message: String(error) };
}

/** A request id: the proxy's X-Request-Id when it looks like one, else a new UUID. */
export function requestIdOf(header: string | null): string {
	return header && /^[A-Za-z0-9._:-]{8,128}$/.test(header) ? header : crypto.randomUUID();
}

/** The one line logged per request: route, not path; status and time; no personal data. */
export function requestLine(input: {
	requestId: string;
	method: string;
	routeId: string | null;
	status: number;
	ms: number;
	signedIn: boolean;
}): Record<string, unknown> {
	return {
		msg: 'request',
		requestId: input.requestId,
		method: input.method,
		route: input.routeId ?? '(no route)',
		status: input.status,
		ms: Math.round(input.ms * 10) / 10,
		signedIn: input.signedIn
	};
}
