import { error, type Handle, type HandleServerError, type ServerInit } from '@sveltejs/kit';
import { sequence } from '@sveltejs/kit/hooks';
import {
	authHandle,
	findSessionUser,
	hasValidCallbackUrl,
	isClosedAuthPath,
	pinToPublicAddress,
	SESSION_COOKIES,
	sessionTokenOf
} from '$lib/server/auth';
import { resultsPageCache } from '$lib/server/cache/results';
import { checkHostSettings } from '$lib/server/config';
import { sequelize } from '$lib/server/db';
import { DATABASE_DOWN_MESSAGE, isDatabaseDown } from '$lib/server/db/connection';
import { AREA_ROLES, areaOf, requireRole, requireUser, routedPath } from '$lib/server/policies';
import { startOutboxWorker } from '$lib/server/mail/outbox';
import { devMailEnabled, productionSettingProblems } from '$lib/server/startup-checks';
import { startRefundSender } from '$lib/server/services/refunds';
import { startReminderSchedule } from '$lib/server/services/reminders';
import { todayIn } from '$lib/domain/dates';
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

export const handle = sequence(
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
	console.error(err);
	return { message: UNEXPECTED_ERROR_MESSAGE };
};

/**
 * Each app process also sends the outbox unless CB_OUTBOX_WORKER=off (then run
 * `npm run worker` as its own process). Several senders are safe: rows are claimed with SKIP LOCKED.
 */
export const init: ServerInit = () => {
	// A host setting with a wrong value stops the app here, with a message naming it.
	checkHostSettings();
	const problems = productionSettingProblems();
	if (problems.length > 0) throw new Error(`Crownbench will not start: ${problems.join(' ')}`);
	const off = process.env.CB_OUTBOX_WORKER === 'off';
	const stopWorker = off ? () => {} : startOutboxWorker();
	const stopRefunds = off ? () => {} : startRefundSender();
	// Entry reminders: an hourly check queues them once per show and member (CB_REMINDERS=off stops it).
	const stopReminders =
		process.env.CB_REMINDERS !== 'off' ? startReminderSchedule((zone) => todayIn(zone)) : () => {};
	// adapter-node emits this after it stops taking requests (SIGTERM, SIGINT): let the process end.
	process.once('sveltekit:shutdown', () => {
		stopWorker();
		stopRefunds();
		stopReminders();
		void sequelize.close();
	});
};
