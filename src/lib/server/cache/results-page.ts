/**
 * A copy of the public results page as anonymous visitors get it, kept per show in each app
 * process and keyed by the show's publishing time, which is read fresh (one query) on every
 * request: a new publish anywhere is seen by every instance at once, and a copy is never the
 * only record of anything. Signed-in people (whose page carries their own menu), data requests
 * and pages with a query string go through the app as usual.
 *
 * The page's content security policy uses a fresh nonce per response; a copy is served with a
 * new nonce swapped into both the body and the header, so no two answers share one.
 */
import { randomBytes } from 'node:crypto';
import type { Handle } from '@sveltejs/kit';
import { QueryTypes } from 'sequelize';
import { sequelize } from '../db';
import { nonceOf, swapNonce } from './nonce';

const PATH = /^\/shows\/([a-z0-9-]{1,80})\/results$/;
const SIZE = 16;

interface Copy {
	key: string;
	body: string;
	nonce: string | null;
	headers: [string, string][];
}

const copies = new Map<string, Copy>();

/** The key of a show's published results (null while unpublished: then nothing is kept). */
async function publishedKey(slug: string): Promise<string | null> {
	const [row] = await sequelize.query<{ published: Date | null; updated: Date }>(
		'SELECT results_published_at AS published, updated_at AS updated FROM shows WHERE slug = :slug',
		{ replacements: { slug }, type: QueryTypes.SELECT }
	);
	if (!row?.published) return null;
	return `${row.published.toISOString()}|${row.updated.toISOString()}`;
}

function serve(copy: Copy): Response {
	const nonce = randomBytes(16).toString('base64');
	const headers = new Headers();
	for (const [name, value] of copy.headers) headers.set(name, swapNonce(value, copy.nonce, nonce));
	headers.set('x-results-copy', 'hit');
	return new Response(swapNonce(copy.body, copy.nonce, nonce), { status: 200, headers });
}

/** Serves the public results page from its copy when the copy is current; keeps new copies. */
export function resultsPageCache(sessionCookies: string[]): Handle {
	return async ({ event, resolve }) => {
		const match = PATH.exec(event.url.pathname);
		if (
			!match ||
			event.request.method !== 'GET' ||
			event.url.search !== '' ||
			sessionCookies.some((name) => event.cookies.get(name))
		) {
			return resolve(event);
		}
		const slug = match[1];
		const key = await publishedKey(slug);
		if (!key) return resolve(event);
		const copy = copies.get(slug);
		if (copy && copy.key === key) return serve(copy);
		const response = await resolve(event);
		if (response.status !== 200 || !response.headers.get('content-type')?.includes('text/html')) {
			return response;
		}
		const body = await response.text();
		const headers = [...response.headers.entries()].filter(([name]) => name !== 'set-cookie');
		copies.delete(slug);
		copies.set(slug, {
			key,
			body,
			nonce: nonceOf(response.headers.get('content-security-policy')),
			headers
		});
		while (copies.size > SIZE) copies.delete(copies.keys().next().value as string);
		return new Response(body, { status: response.status, headers: response.headers });
	};
}
