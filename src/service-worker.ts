/// <reference types="@sveltejs/kit" />
/// <reference no-default-lib="true"/>
/// <reference lib="esnext" />
/// <reference lib="webworker" />
/**
 * The tablet's service worker. It keeps the app's built files (per version) and a judge's
 * judging pages (per person, see tablet-names.ts), so a judging page opens and reloads without
 * the network; scoring then goes on through the page's outbox (sheet-outbox.ts). Judging pages
 * come from the network when it answers, and from what was kept when it does not. Signing out
 * (POST /signout) clears the pages and the data kept for the person. Nothing else is touched:
 * APIs, other pages and every write go to the network as usual.
 */
import { build, files, version } from '$service-worker';
import {
	PAGES_CACHE_PREFIX,
	PERSON_CACHE,
	PERSON_HEADER,
	PERSON_KEY,
	TABLET_KEYS,
	TABLET_STORE,
	pagesCacheOf,
	tabletDbOf
} from '$lib/judging/tablet-names';

const sw = globalThis.self as unknown as ServiceWorkerGlobalScope;
const SHELL_CACHE = `crownbench-app-${version}`;
const SHELL = new Set([...build, ...files]);
/**
 * Kept at install: the built files and static files, less the fonts a modern browser never asks
 * for (WOFF beside WOFF2, alphabets other than Latin); those are kept when first fetched.
 */
const PRECACHE = [...SHELL].filter(
	(path) => !path.endsWith('.woff') && !/-(cyrillic|greek|vietnamese)[a-z-]*-\d+-/.test(path)
);
/** How long a judging page waits for a weak network before the kept copy is shown. */
const NETWORK_WAIT_MS = 4000;

sw.addEventListener('install', (event) => {
	event.waitUntil(
		(async () => {
			const cache = await caches.open(SHELL_CACHE);
			await cache.addAll(PRECACHE);
			await sw.skipWaiting();
		})()
	);
});

sw.addEventListener('activate', (event) => {
	event.waitUntil(
		(async () => {
			// Pages kept by an older version name its built files: they are kept again when next online.
			for (const name of await caches.keys()) {
				if (name !== SHELL_CACHE && name !== PERSON_CACHE) await caches.delete(name);
			}
			await sw.clients.claim();
		})()
	);
});

const isJudgingPage = (url: URL) =>
	(url.pathname === '/judging' || url.pathname.startsWith('/judging/')) &&
	!url.pathname.endsWith('/__data.json');

sw.addEventListener('fetch', (event) => {
	const request = event.request;
	const url = new URL(request.url);
	if (url.origin !== sw.location.origin) return;
	if (request.method === 'POST' && url.pathname === '/signout') {
		event.respondWith(signOut(event));
		return;
	}
	if (request.method !== 'GET') return;
	if (SHELL.has(url.pathname)) event.respondWith(fromShell(request));
	else if (isJudgingPage(url) && request.mode === 'navigate') {
		event.respondWith(judgingPage(request, url));
	}
});

sw.addEventListener('message', (event) => {
	const data = event.data as { type?: string; person?: unknown; urls?: unknown };
	if (data?.type !== 'keep' || typeof data.person !== 'string' || !Array.isArray(data.urls)) return;
	const urls = data.urls.filter(
		(u): u is string => typeof u === 'string' && isJudgingPage(new URL(u, sw.location.origin))
	);
	const person = data.person;
	event.waitUntil(keepPages(person, urls).then((kept) => event.ports[0]?.postMessage({ kept })));
});

async function fromShell(request: Request): Promise<Response> {
	const cache = await caches.open(SHELL_CACHE);
	const kept = await cache.match(request);
	if (kept) return kept;
	const response = await fetch(request);
	if (response.ok) await cache.put(request, response.clone());
	return response;
}

/** The person whose judging pages are served offline: the last one a judging page named. */
async function currentPerson(): Promise<string | null> {
	const kept = await (await caches.open(PERSON_CACHE)).match(PERSON_KEY);
	return kept ? kept.text() : null;
}

/**
 * Makes `person` the tablet's current person. Another person's kept pages and sheets go (their
 * session ended without signing out); their waiting changes stay in their own outbox until they
 * sign in again, and nobody else's page ever reads them.
 */
async function becomeCurrent(person: string): Promise<void> {
	const before = await currentPerson();
	if (before === person) return;
	await (await caches.open(PERSON_CACHE)).put(PERSON_KEY, new Response(person));
	for (const name of await caches.keys()) {
		if (name.startsWith(PAGES_CACHE_PREFIX) && name !== pagesCacheOf(person)) {
			await caches.delete(name);
		}
	}
	if (before) {
		await inTabletOf(before, (store) => {
			store.delete(TABLET_KEYS.sheets);
			store.delete(TABLET_KEYS.lastReached);
		});
	}
}

/**
 * Runs `work` on a person's kept data (IndexedDB as sheet-outbox.ts writes it, with idb-keyval)
 * and closes the database again, so that nothing here keeps it open when it is to be deleted.
 * A person with no database gets none made.
 */
function inTabletOf<T>(person: string, work: (store: IDBObjectStore) => T): Promise<T | undefined> {
	return new Promise((resolve) => {
		const open = indexedDB.open(tabletDbOf(person));
		open.onupgradeneeded = () => open.transaction?.abort();
		open.onerror = () => resolve(undefined);
		open.onsuccess = () => {
			const db = open.result;
			if (!db.objectStoreNames.contains(TABLET_STORE)) {
				db.close();
				resolve(undefined);
				return;
			}
			const tx = db.transaction(TABLET_STORE, 'readwrite');
			const result = work(tx.objectStore(TABLET_STORE));
			tx.oncomplete =
				tx.onerror =
				tx.onabort =
					() => {
						db.close();
						resolve(result);
					};
		};
	});
}

/** How many changes of the person wait in their outbox. */
async function waitingChangesOf(person: string): Promise<number> {
	let read: IDBRequest<unknown> | undefined;
	await inTabletOf(person, (store) => (read = store.get(TABLET_KEYS.changes)));
	return Array.isArray(read?.result) ? read.result.length : 0;
}

/** A judging page from the network (kept for its person), or the kept copy when none answers. */
async function judgingPage(request: Request, url: URL): Promise<Response> {
	const network = fetch(request).then(async (response) => {
		const person = response.headers.get(PERSON_HEADER);
		if (response.status === 200 && person) {
			await becomeCurrent(person);
			await (await caches.open(pagesCacheOf(person))).put(url.pathname, response.clone());
		}
		return response;
	});
	const kept = async () => {
		const person = await currentPerson();
		if (!person) return undefined;
		return (await caches.open(pagesCacheOf(person))).match(url.pathname);
	};
	const slow = new Promise<'slow'>((resolve) => setTimeout(() => resolve('slow'), NETWORK_WAIT_MS));
	try {
		const first = await Promise.race([network, slow]);
		// A server in trouble (the database restarting, say) is no reason to stop scoring.
		if (first !== 'slow') return first.status >= 500 ? ((await kept()) ?? first) : first;
		return (await kept()) ?? (await network);
	} catch {
		return (await kept()) ?? notKept();
	}
}

/** Fetches the person's judging pages that are not kept yet; answers how many are kept. */
async function keepPages(person: string, urls: string[]): Promise<number> {
	await becomeCurrent(person);
	const cache = await caches.open(pagesCacheOf(person));
	const missing: string[] = [];
	for (const url of urls) if (!(await cache.match(url))) missing.push(url);
	let networkGone = false;
	// A few at a time: quick on a good network, gentle on the server.
	const fetcher = async () => {
		for (let url = missing.shift(); url && !networkGone; url = missing.shift()) {
			try {
				const response = await fetch(url, { credentials: 'same-origin' });
				if (response.status === 200 && response.headers.get(PERSON_HEADER) === person) {
					await cache.put(url, response);
				}
			} catch {
				networkGone = true; // The rest is kept next time.
			}
		}
	};
	await Promise.all([fetcher(), fetcher(), fetcher()]);
	return (await cache.keys()).length;
}

/**
 * Signing out: with changes still waiting, asks first (they would be lost); then passes the
 * request on and, once the server signed the person out, clears what the tablet kept.
 */
async function signOut(event: FetchEvent): Promise<Response> {
	const person = await currentPerson();
	const waiting = person ? await waitingChangesOf(person) : 0;
	const form = await event.request
		.clone()
		.formData()
		.catch(() => new FormData());
	if (waiting > 0 && form.get('discard') !== 'yes') return askBeforeSigningOut(waiting, form);
	let response: Response;
	try {
		response = await fetch(event.request);
	} catch {
		return page(
			503,
			'Not signed out',
			'<p>Signing out needs the network. Nothing was cleared from this tablet.</p><p><a href="/judging">Back to judging</a></p>'
		);
	}
	if (response.type === 'opaqueredirect' || response.ok) {
		for (const name of await caches.keys()) {
			if (name.startsWith(PAGES_CACHE_PREFIX) || name === PERSON_CACHE) await caches.delete(name);
		}
		if (person) {
			await inTabletOf(person, (store) => store.clear());
			// Finishes once the page that holds the database open has gone.
			event.waitUntil(
				new Promise<void>((resolve) => {
					const request = indexedDB.deleteDatabase(tabletDbOf(person));
					request.onsuccess = request.onerror = () => resolve();
				})
			);
		}
	}
	return response;
}

function askBeforeSigningOut(waiting: number, form: FormData): Response {
	const redirectTo = String(form.get('redirectTo') ?? '/');
	const changes = `${waiting} ${waiting === 1 ? 'change' : 'changes'}`;
	return page(
		409,
		'Changes not yet sent',
		`<p>${changes} to score sheets have not reached the server yet. Signing out now removes them from this tablet for good.</p>
		<p><a href="/judging">Back to judging, to send them first</a></p>
		<form method="POST" action="/signout">
			<input type="hidden" name="redirectTo" value="${escapeHtml(redirectTo)}">
			<input type="hidden" name="discard" value="yes">
			<button type="submit">Sign out and remove the ${changes}</button>
		</form>`
	);
}

function notKept(): Response {
	return page(
		503,
		'Not kept on this tablet',
		'<p>You are offline, and this judging page was not kept on this tablet. Open your judging pages once with the network to keep them.</p><p><a href="/judging">Your judging pages</a></p>'
	);
}

/** A plain page made here (no network): large type and strong contrast, for a tablet in daylight. */
function page(status: number, title: string, body: string): Response {
	const html = `<!doctype html><html lang="en"><head><meta charset="utf-8"><meta name="viewport" content="width=device-width, initial-scale=1">
<title>${title} · Crownbench</title>
<style>body{font:1.125rem/1.6 system-ui,sans-serif;color:#1f2a24;background:#fbfaf6;max-width:40rem;margin:2rem auto;padding:0 1rem}
a,button{display:inline-flex;align-items:center;min-height:44px;font:inherit;font-weight:600;color:#245a40}
button{padding:0 1rem;border:2px solid #8c1d17;border-radius:.5rem;background:#fff;color:#8c1d17}</style>
</head><body><main><h1>${title}</h1>${body}</main></body></html>`;
	return new Response(html, { status, headers: { 'content-type': 'text/html; charset=utf-8' } });
}

function escapeHtml(text: string): string {
	return text.replace(
		/[&<>"']/g,
		(c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[c]!
	);
}
