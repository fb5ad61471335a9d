/**
 * The one results cache: what a show's published results cost to make, kept per show (by its
 * address) in each app process. Two things are kept under one key: the results themselves
 * (`ShowResults`, for the results page of signed-in people and the CSV) and the public results
 * page as anonymous visitors get it (its HTML). The key is the show's publishing time and last
 * change (`resultsKey`), read fresh (one query) on every request: a new publish anywhere is seen
 * by every instance at once, a changed key drops both, and a copy is never the only record of
 * anything. Nothing is kept while results are unpublished.
 *
 * The page's content security policy uses a fresh nonce per response; a page copy is served with
 * a new nonce swapped into both the body and the header, so no two answers share one. Signed-in
 * people (whose page carries their own menu), data requests and pages with a query string go
 * through the app as usual.
 */
import { randomBytes } from 'node:crypto';
import type { Handle } from '@sveltejs/kit';
import { QueryTypes } from 'sequelize';
import type { ShowResults } from '$lib/results/types';
import { sequelize } from '../db';
import { nonceOf, swapNonce } from '../http/nonce';

const PATH = /^\/shows\/([a-z0-9-]{1,80})\/results$/;
/** Shows kept per process; the one used longest ago goes first. */
const SIZE = 16;

interface PageCopy {
	body: string;
	nonce: string | null;
	headers: [string, string][];
}

interface Kept {
	key: string;
	results?: Promise<ShowResults | null>;
	page?: PageCopy;
}

const kept = new Map<string, Kept>();

/** The key of a show's published results: its publishing time and last change. */
export function resultsKey(publishedAt: Date, updatedAt: Date): string {
	return `${publishedAt.toISOString()}|${updatedAt.toISOString()}`;
}

/** What is kept for the show under this key (a new, empty record when the key changed). */
function keptFor(slug: string, key: string): Kept {
	const found = kept.get(slug);
	const current = found && found.key === key ? found : { key };
	kept.delete(slug);
	kept.set(slug, current);
	while (kept.size > SIZE) kept.delete(kept.keys().next().value as string);
	return current;
}

/**
 * The show's results under the key: the kept ones, or `load()` once (parallel requests share one
 * load; a failed or empty load is not kept).
 */
export function cachedResults(
	slug: string,
	key: string,
	load: () => Promise<ShowResults | null>
): Promise<ShowResults | null> {
	const record = keptFor(slug, key);
	if (record.results) return record.results;
	const results = load();
	record.results = results;
	const forget = () => {
		if (record.results === results) delete record.results;
	};
	results.then((r) => r ?? forget(), forget);
	return results;
}

/** The key of the show's published results, read fresh (null while unpublished). */
async function publishedKey(slug: string): Promise<string | null> {
	const [row] = await sequelize.query<{ published: Date | null; updated: Date }>(
		'SELECT results_published_at AS published, updated_at AS updated FROM shows WHERE slug = :slug',
		{ replacements: { slug }, type: QueryTypes.SELECT }
	);
	return row?.published ? resultsKey(row.published, row.updated) : null;
}

function serve(copy: PageCopy): Response {
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
		const copy = kept.get(slug);
		if (copy?.key === key && copy.page) return serve(copy.page);
		const response = await resolve(event);
		if (response.status !== 200 || !response.headers.get('content-type')?.includes('text/html')) {
			return response;
		}
		const body = await response.text();
		const headers = [...response.headers.entries()].filter(([name]) => name !== 'set-cookie');
		keptFor(slug, key).page = {
			body,
			nonce: nonceOf(response.headers.get('content-security-policy')),
			headers
		};
		return new Response(body, { status: response.status, headers: response.headers });
	};
}
