/**
 * The tablet's queue of sheet changes, kept in IndexedDB (idb-keyval) so nothing is lost while
 * the network is gone or the page is closed. Changes are sent in order, one at a time; each
 * carries a change id, so a change sent twice (a reply lost on the way back) is applied once.
 */
import { createStore, get, update, type UseStore } from 'idb-keyval';
import type { QueuedChange, SendOutcome, TabletSheet } from './types';

const KEY = 'changes';
const SET_ASIDE_KEY = 'set-aside';
let store: UseStore | undefined;

function db(): UseStore {
	store ??= createStore('crownbench-judging', 'queue');
	return store;
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

/** Changes the server refused for good, oldest first. */
export async function readSetAside(): Promise<QueuedChange[]> {
	return (await get<QueuedChange[]>(SET_ASIDE_KEY, db())) ?? [];
}

/** Answers that may go away on their own: signed out, timed out, too many requests. */
const TRY_AGAIN_LATER = new Set([401, 408, 429]);

/**
 * Sends one change; a network failure, a server error or an answer that may pass (401, 408,
 * 429) leaves it waiting; any other refusal (4xx but a 409 conflict) is final.
 */
export async function send(change: QueuedChange): Promise<SendOutcome> {
	let response: Response;
	try {
		response = await fetch('/api/judging/sheets', {
			method: 'PUT',
			headers: { 'content-type': 'application/json' },
			body: JSON.stringify(change)
		});
	} catch {
		return { kind: 'offline' };
	}
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
