/**
 * The tablet's outbox of sheet changes, kept in IndexedDB (idb-keyval) so nothing is lost while
 * the network is gone, the page is closed or the session has run out. Changes are sent in order,
 * one at a time; each carries a change id, so a change sent twice (a reply lost on the way back)
 * is applied once. Everything is kept per person (tablet-names.ts): `useTabletOf` picks whose.
 */
import { clear, createStore, get, set, update, type UseStore } from 'idb-keyval';
import { LEGACY_DB, LEGACY_STORE, TABLET_KEYS, TABLET_STORE, tabletDbOf } from './tablet-names';
import type { QueuedChange, SendOutcome, TabletSheet } from './types';

const KEY = TABLET_KEYS.changes;
const SET_ASIDE_KEY = TABLET_KEYS.setAside;
let store: UseStore | undefined;
let storePerson: string | undefined;

/** Opens the kept data of one person; every later call reads and writes theirs only. */
export function useTabletOf(person: string): void {
	if (storePerson === person) return;
	store = createStore(tabletDbOf(person), TABLET_STORE);
	storePerson = person;
}

function db(): UseStore {
	if (!store) throw new Error('useTabletOf(person) first: the tablet keeps data per person.');
	return store;
}

/**
 * Moves changes left by the tablet's earlier outbox (one for everybody) into this person's, so
 * an update of the app during a show loses nothing; the old outbox is then emptied.
 */
export async function adoptLegacyChanges(): Promise<void> {
	if (typeof indexedDB.databases === 'function') {
		const names = (await indexedDB.databases()).map((d) => d.name);
		if (!names.includes(LEGACY_DB)) return;
	}
	const legacy = createStore(LEGACY_DB, LEGACY_STORE);
	const left = (await get<QueuedChange[]>(KEY, legacy)) ?? [];
	if (left.length > 0)
		await update<QueuedChange[]>(KEY, (list) => [...left, ...(list ?? [])], db());
	await clear(legacy);
}

/** Each sheet as the server last kept it, by entry id (for opening pages offline). */
export async function readKeptSheets(): Promise<Record<string, TabletSheet>> {
	return (await get<Record<string, TabletSheet>>(TABLET_KEYS.sheets, db())) ?? {};
}

/** Keeps sheets as the server has them; an older version never replaces a newer one. */
export async function keepSheets(sheets: TabletSheet[]): Promise<void> {
	if (sheets.length === 0) return;
	await update<Record<string, TabletSheet>>(
		TABLET_KEYS.sheets,
		(kept) => {
			const next = { ...(kept ?? {}) };
			for (const s of sheets) {
				if (!next[s.entryId] || next[s.entryId].version <= s.version) next[s.entryId] = s;
			}
			return next;
		},
		db()
	);
}

/** Notes the time (milliseconds since 1970) the server acknowledged a change. */
export async function noteReached(at: number): Promise<void> {
	await set(TABLET_KEYS.lastReached, at, db());
}

/** When the last change reached the server, if one did on this tablet. */
export async function readLastReached(): Promise<number | null> {
	return (await get<number>(TABLET_KEYS.lastReached, db())) ?? null;
}

/** Every change still waiting, oldest first. */
export async function readQueue(): Promise<QueuedChange[]> {
	return (await get<QueuedChange[]>(KEY, db())) ?? [];
}

/** Adds a change at the end of the queue. */
export async function enqueue(change: QueuedChange): Promise<void> {
	await update<QueuedChange[]>(KEY, (list) => [...(list ?? []), change], db());
}

/**
 * Removes a sent change, and moves the later changes of the same sheet that were made on the
 * same version onto the version the server just gave (they were made on top of this one).
 */
export async function acknowledge(change: QueuedChange, newVersion: number): Promise<void> {
	await update<QueuedChange[]>(
		KEY,
		(list) =>
			(list ?? [])
				.filter((c) => c.changeId !== change.changeId)
				.map((c) =>
					c.entryId === change.entryId && c.baseVersion === change.baseVersion
						? { ...c, baseVersion: newVersion }
						: c
				),
		db()
	);
}

/** Drops a change the server refused, or every waiting change of one sheet (after a conflict). */
export async function drop(match: { changeId?: string; entryId?: string }): Promise<void> {
	await update<QueuedChange[]>(
		KEY,
		(list) =>
			(list ?? []).filter(
				(c) =>
					!(
						(match.changeId && c.changeId === match.changeId) ||
						(match.entryId && c.entryId === match.entryId)
					)
			),
		db()
	);
}

/**
 * Moves a change the server refused for good out of the queue into a list of its own (kept on
 * the tablet, never sent again), so the changes after it are sent.
 */
export async function setAside(change: QueuedChange): Promise<void> {
	await update<QueuedChange[]>(SET_ASIDE_KEY, (list) => [...(list ?? []), change], db());
	await drop({ changeId: change.changeId });
}

/** Answers that may go away on their own: timed out, too many requests. */
const TRY_AGAIN_LATER = new Set([408, 429]);

/**
 * Sends one change; a network failure, a server error or an answer that may pass (408, 429)
 * leaves it waiting, and so does 401 (the session ran out: sent after signing in again); any
 * other refusal (4xx but a 409 conflict) is final.
 */
export async function send(change: QueuedChange): Promise<SendOutcome> {
	let response: Response;
	try {
		response = await fetch('/api/judging/sheets', {
			method: 'PUT',
			headers: { 'content-type': 'application/json' },
			// A redirect to the sign-in page is not an answer to a save.
			redirect: 'manual',
			body: JSON.stringify(change)
		});
	} catch {
		return { kind: 'offline' };
	}
	if (response.status === 401 || response.type === 'opaqueredirect') return { kind: 'signed-out' };
	if (response.status >= 500 || TRY_AGAIN_LATER.has(response.status)) return { kind: 'offline' };
	const body = (await response.json().catch(() => ({}))) as {
		sheet?: TabletSheet;
		current?: TabletSheet;
		message?: string;
	};
	if (response.ok && body.sheet) return { kind: 'saved', sheet: body.sheet };
	if (response.status === 409 && body.current) {
		return { kind: 'conflict', current: body.current, message: body.message ?? '' };
	}
	return {
		kind: 'refused',
		message: body.message ?? `The server refused the change (${response.status}).`
	};
}

/** A random id for a change (RFC 4122 version 4), also on pages served without TLS. */
export function newChangeId(): string {
	if (typeof crypto.randomUUID === 'function') return crypto.randomUUID();
	const b = crypto.getRandomValues(new Uint8Array(16));
	b[6] = (b[6] & 0x0f) | 0x40;
	b[8] = (b[8] & 0x3f) | 0x80;
	const h = [...b].map((x) => x.toString(16).padStart(2, '0')).join('');
	return `${h.slice(0, 8)}-${h.slice(8, 12)}-${h.slice(12, 16)}-${h.slice(16, 20)}-${h.slice(20)}`;
}
