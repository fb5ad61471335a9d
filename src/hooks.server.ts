import { error, type Handle, type HandleServerError, type ServerInit } from '@sveltejs/kit';
import { sequence } from '@sveltejs/kit/hooks';
import { env } from '$env/dynamic/private';
import {
	authHandle,
	findSessionUser,
	hasValidCallbackUrl,
	isClosedAuthPath,
	pinToPublicAddress,
	SESSION_COOKIES,
	sessionTokenOf
} from '$lib/server/auth';
import { resultsPageCache } from '$lib/server/results/cache';
import { useConfig } from '$lib/server/config';
import { sequelize } from '$lib/server/db';
import { DATABASE_DOWN_MESSAGE, isDatabaseDown } from '$lib/server/db/connection';
import { AREA_ROLES, areaOf, requireRole, requireUser, routedPath } from '$lib/server/policies';
import { startJobWorker } from '$lib/server/jobs/worker';
import { errorFields, logger, requestIdOf, requestLine } from '$lib/server/log';
import { devMailEnabled } from '$lib/server/startup-checks';
import { answerThrown, withSecurityHeaders } from '$lib/server/http/security-headers';

/** The plain message of an unexpected error (the details go to the log). */
const UNEXPECTED_ERROR_MESSAGE = 'Something went wrong on our side. Please try again.';

/**
 * Fills locals.user from the database session; visitors without a session cookie cost nothing.
 * A valid session that is not yet due for its rolling extension is read in one query and the
 * request goes on without Auth.js (its handle sets up its configuration on every request, which
 * such a request does not need). Auth.js's own paths (/auth/...) and anything else about a session
 * (unknown, expired, due) go through Auth.js, which extends or clears it.
 */
const sessionHandle: Handle = async ({ event, resolve }) => {
	event.locals.user = null;
	const token = sessionTokenOf((name) => event.cookies.get(name));
	const found = token ? await findSessionUser(token) : null;
	if (found && !found.due && !event.url.pathname.startsWith('/auth/')) {
		event.locals.user = found.user;
		return resolve(event);
	}
	return authHandle({
		event,
		resolve: async (authed, options) => {
			if (found && !found.due) {
				authed.locals.user = found.user;
			} else if (token) {
				// Auth.js extends (or clears) the session; the person is then read again by the token.
				const session = await authed.locals.auth();
				if (session) authed.locals.user = (await findSessionUser(token))?.user ?? null;
			}
			return resolve(authed, options);
		}
	});
};

/**
 * Before Auth.js: the request is pinned to the public address (sign-in links cannot be pointed at
 * another host), a malformed host answers 400, and Auth.js's own sign-in POST is closed (404).
 */
const authAddressHandle: Handle = async ({ event, resolve }) => {
	try {
		if (isClosedAuthPath(event.request.method, event.url.pathname)) {
			error(404, 'Ask for a sign-in link on the sign-in page.');
		}
		if (!pinToPublicAddress(event.request.headers)) error(400, 'The request names no valid host.');
		if (!hasValidCallbackUrl(event.url, (name) => event.cookies.get(name))) {
			error(400, 'The address to go to after signing in is not a web address.');
		}
	} catch (thrown) {
		return answerThrown(event, thrown);
	}
	return resolve(event);
};

/** Refuses every page and API of a role's area to people without that role, before any load runs. */
const guardHandle: Handle = async ({ event, resolve }) => {
	try {
		const area = areaOf(event.url.pathname);
		if (area) {
			const rule = AREA_ROLES[area];
			if (rule === 'signed-in') requireUser(event);
			else requireRole(event, rule);
		}
		if (routedPath(event.url.pathname).startsWith('/dev/') && !devMailEnabled()) {
			error(404, 'Not found');
		}
	} catch (thrown) {
		// Answered here, not thrown on, so that headersHandle still adds the security headers.
		return answerThrown(event, thrown);
	}
	return resolve(event);
};

/** Security headers and a content security policy on every answer (see security-headers.ts). */
const headersHandle: Handle = async ({ event, resolve }) =>
	withSecurityHeaders(await resolve(event));

/** Requests (their locals) whose error was the database being out of reach, marked by handleError. */
const databaseDownRequests = new WeakSet<object>();

/**
 * While PostgreSQL is out of reach (stopped, restarting), answers 503 with the message instead of
 * 500: the tablet's queue and other clients try again later. Connections the pool lost are
 * dropped by Sequelize, so the next request after the database is back just works.
 */
const databaseDownHandle: Handle = async ({ event, resolve }) => {
	let response: Response;
	try {
		response = await resolve(event);
	} catch (err) {
		// Thrown before any route ran (reading the session, say).
		if (isDatabaseDown(err)) error(503, DATABASE_DOWN_MESSAGE);
		throw err;
	}
	if (response.status !== 500 || !databaseDownRequests.has(event.locals)) return response;
	const headers = new Headers(response.headers);
	headers.set('Retry-After', '5');
	return new Response(response.body, { status: 503, statusText: 'Service Unavailable', headers });
};

/**
 * One JSON log line per request (route, status, time, request id; nothing personal) and the
 * request id on the answer (X-Request-Id), taken from the proxy when it sent one.
 */
const logHandle: Handle = async ({ event, resolve }) => {
	const requestId = requestIdOf(event.request.headers.get('x-request-id'));
	event.locals.requestId = requestId;
	const started = performance.now();
	let status = 500;
	try {
		const response = await resolve(event);
		status = response.status;
		try {
			response.headers.set('X-Request-Id', requestId);
		} catch {
			// An answer with immutable headers (a fetched one passed on) keeps them.
		}
		return response;
	} finally {
		logger().info(
			requestLine({
				requestId,
				method: event.request.method,
				routeId: event.route.id,
				status,
				ms: performance.now() - started,
				signedIn: !!event.locals.user
			})
		);
	}
};

export const handle = sequence(
	logHandle,
	databaseDownHandle,
	headersHandle,
	// Anonymous visitors of published results get the page's current copy (see the module).
	resultsPageCache(SESSION_COOKIES),
	authAddressHandle,
	sessionHandle,
	guardHandle
);

/** Unexpected errors: a plain message, and the command to run when the database is down. */
export const handleError: HandleServerError = ({ error: err, event, status }) => {
	if (isDatabaseDown(err)) {
		databaseDownRequests.add(event.locals);
		return { message: DATABASE_DOWN_MESSAGE };
	}
	if (status === 404) return { message: 'This page does not exist.' };
	logger().error({
		msg: 'unexpected error',
		requestId: event.locals.requestId,
		route: event.route.id,
		...errorFields(err)
	});
	return { message: UNEXPECTED_ERROR_MESSAGE };
};

/**
 * Settings are read once from `$env/dynamic/private` and checked (a wrong one stops the app with
 * a message naming it). Each app process also works the job queues unless CB_WORKER=off (then
 * run `npm run worker` as its own process); several workers on one database are safe.
 */
export const init: ServerInit = async () => {
	const config = useConfig(env);
	let stopWorker = async () => {};
	let retry: NodeJS.Timeout | undefined;
	// The app answers while the database is out of reach (503s); the worker starts once it is back.
	const start = async () => {
		try {
			stopWorker = await startJobWorker();
		} catch (err) {
			logger().warn({ msg: 'job worker not started; trying again in 5 s', ...errorFields(err) });
			retry = setTimeout(() => void start(), 5000);
			retry.unref();
		}
	};
	if (config.worker) void start();
	// adapter-node emits this after it stops taking requests (SIGTERM, SIGINT): let the process end.
	process.once('sveltekit:shutdown', () => {
		clearTimeout(retry);
		void stopWorker()
			.catch((err: unknown) => logger().error({ msg: 'worker stop', ...errorFields(err) }))
			.finally(() => void sequelize.close());
	});
};
