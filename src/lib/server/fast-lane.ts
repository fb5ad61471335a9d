/**
 * The fast lane: the production server (server.js) hands every request to it first. It answers
 * the one request that judges' tablets send many times a minute, a score sheet save, as a plain
 * node:http handler, without SvelteKit's per-request work (request and response objects, streams,
 * hooks). It takes a save only when nothing unusual is about it: `PUT /api/judging/sheets` as
 * JSON of a stated, small length, with a live session not yet due for its rolling extension, of
 * someone allowed to save. Every other request, and every save it does not take, goes on to
 * SvelteKit unread, where the hooks and the route (which answers with the same function) apply.
 * Its answers carry the same security headers, the same 503 while the database is out of reach
 * and the same plain 500 as SvelteKit's.
 */
import type { IncomingMessage, ServerResponse } from 'node:http';
import { parse as parseCookies } from 'cookie';
import { findSessionUser, sessionTokenOf } from '$lib/server/auth';
import { DATABASE_DOWN_MESSAGE, isDatabaseDown } from '$lib/server/db/connection';
import { hasRole } from '$lib/server/policies';
import { FALLBACK_CSP, SECURITY_HEADERS } from '$lib/server/security-headers';
import { answerSheetChange, SHEET_SAVERS } from '$lib/server/sheet-save';

/** The plain message of an unexpected error (the details go to the log). */
export const UNEXPECTED_ERROR_MESSAGE = 'Something went wrong on our side. Please try again.';

/** A request handler in front of SvelteKit's: it answers, or calls `next` to pass the request on. */
export type Lane = (req: IncomingMessage, res: ServerResponse, next: () => void) => void;

/** Where server.js finds the lane: set by the app's init hook when the built app loads. */
export const FAST_LANE_KEY = Symbol.for('crownbench.fast-lane');

/** BODY_SIZE_LIMIT as adapter-node reads it (bytes, or a number with K, M or G; 512K unset). */
function bodySizeLimit(value = process.env.BODY_SIZE_LIMIT ?? '512K'): number {
	const unit = { K: 1024, M: 1024 ** 2, G: 1024 ** 3 }[value.slice(-1).toUpperCase()];
	const bytes = unit ? Number(value.slice(0, -1)) * unit : Number(value);
	return Number.isNaN(bytes) ? 0 : bytes;
}

/**
 * A sheet change is well under 64 kB; larger bodies go to SvelteKit and its own size limit, and
 * so does every body when that limit is set lower.
 */
const MAX_BODY_BYTES = Math.min(64 * 1024, bodySizeLimit());

function send(
	res: ServerResponse,
	status: number,
	body: unknown,
	extra: Record<string, string> = {}
): void {
	const text = JSON.stringify(body);
	res.writeHead(status, {
		...SECURITY_HEADERS,
		'content-security-policy': FALLBACK_CSP,
		'content-type': 'application/json',
		'content-length': String(Buffer.byteLength(text)),
		...extra
	});
	res.end(text);
}

/** True for a save the lane may take, judged from the request line and headers alone. */
function isPlainSave(req: IncomingMessage): boolean {
	if (req.method !== 'PUT' || req.url !== '/api/judging/sheets') return false;
	const type = req.headers['content-type'] ?? '';
	const length = Number(req.headers['content-length']);
	return (
		/^application\/json\s*(;|$)/i.test(type) &&
		!req.headers['transfer-encoding'] &&
		Number.isInteger(length) &&
		length > 0 &&
		length <= MAX_BODY_BYTES
	);
}

/** The signed-in person allowed to save, or null when SvelteKit should answer the request. */
async function allowedSaver(req: IncomingMessage): Promise<App.SignedInUser | null> {
	const cookies = parseCookies(req.headers.cookie ?? '');
	const token = sessionTokenOf((name) => cookies[name]);
	if (!token) return null;
	const found = await findSessionUser(token);
	if (!found || found.due || !hasRole(found.user, SHEET_SAVERS)) return null;
	return found.user;
}

/** Thrown when a body turns out longer than its stated length allowed: the request is dropped. */
class BodyTooLong extends Error {}

function readBody(req: IncomingMessage): Promise<string> {
	return new Promise((resolve, reject) => {
		const chunks: Buffer[] = [];
		let size = 0;
		req.on('data', (chunk: Buffer) => {
			size += chunk.length;
			if (size > MAX_BODY_BYTES) req.destroy(new BodyTooLong());
			else chunks.push(chunk);
		});
		req.on('end', () => resolve(Buffer.concat(chunks).toString('utf8')));
		req.on('error', reject);
	});
}

async function takeSave(req: IncomingMessage, res: ServerResponse, next: () => void) {
	let user: App.SignedInUser | null;
	try {
		user = await allowedSaver(req);
	} catch {
		// The database out of reach, say: SvelteKit meets the same error and answers it.
		user = null;
	}
	if (!user) return next();
	try {
		let body: unknown;
		try {
			body = JSON.parse(await readBody(req));
		} catch (err) {
			if (err instanceof BodyTooLong) return;
			if (!(err instanceof SyntaxError)) throw err;
			return send(res, 400, { message: 'Send the change as JSON.' });
		}
		const answer = await answerSheetChange(user, body);
		send(res, answer.status, answer.body);
	} catch (err) {
		if (isDatabaseDown(err)) {
			return send(res, 503, { message: DATABASE_DOWN_MESSAGE }, { 'retry-after': '5' });
		}
		console.error(err);
		send(res, 500, { message: UNEXPECTED_ERROR_MESSAGE });
	}
}

/** The lane server.js puts in front of SvelteKit's handler. */
export const fastLane: Lane = (req, res, next) => {
	if (!isPlainSave(req)) return next();
	takeSave(req, res, next).catch((err: unknown) => {
		console.error(err);
		if (!res.headersSent) send(res, 500, { message: UNEXPECTED_ERROR_MESSAGE });
	});
};

/** Makes the lane findable by server.js (called by the init hook of hooks.server.ts). */
export function registerFastLane(): void {
	(globalThis as Record<symbol, unknown>)[FAST_LANE_KEY] = fastLane;
}
