/**
 * Keeps a class's sheets in step between the tablet and the server: every edit goes into the
 * person's outbox in IndexedDB first, then is sent; while offline (or signed out) the judge keeps
 * scoring and the outbox waits; a change another panel member saved first is shown (a conflict),
 * never overwritten. The sheets the server acknowledged are kept on the tablet too, so a page
 * opened offline from an older copy shows the newest of them.
 */
import { isSheetComplete, runningTotal } from '$lib/domain/judging';
import type { ScaleOfPoints } from '$lib/domain/scoring';
import {
	acknowledge,
	adoptLegacyChanges,
	drop,
	enqueue,
	keepSheets,
	newChangeId,
	noteReached,
	readKeptSheets,
	readLastReached,
	readQueue,
	send,
	setAside,
	useTabletOf
} from './sheet-outbox';
import type { QueuedChange, TabletSheet } from './types';

export type SyncStatus = 'reading' | 'saved' | 'saving' | 'waiting' | 'signed-out' | 'conflict';

/** The editable parts of a sheet. */
export type SheetEdit = Partial<
	Pick<TabletSheet, 'deductions' | 'comment' | 'notJudged' | 'judgesChoiceRank'>
>;

export class SheetSync {
	sheets: Record<string, TabletSheet> = $state({});
	/** Changes in the browser's queue, not yet acknowledged by the server. */
	private queued = $state(0);
	/** Edits already on screen whose change is still being written to the queue. */
	private pending = $state(0);
	sending = $state(false);
	online = $state(true);
	/** False until the changes kept on the tablet are read: until then nothing can be called saved. */
	private started = $state(false);
	/** The server answered that the session has run out: changes wait until the judge signs in. */
	signedOut = $state(false);
	/** When the last change from this tablet reached the server (milliseconds since 1970). */
	lastReached: number | null = $state(null);
	conflicts: Record<string, { mine: TabletSheet; theirs: TabletSheet; message: string }> = $state(
		{}
	);
	refusal: string | null = $state(null);
	/** The server's version of each sheet as last confirmed; changes are made on it. */
	private known: Record<string, number> = {};
	/** Each sheet as the server last kept it: what a sheet goes back to when a change is refused. */
	private confirmed: Record<string, TabletSheet> = {};
	/** Versions this tablet's own changes moved each sheet through (base → new), to send later changes on. */
	private moved: Record<string, Record<number, number>> = {};
	private flushing: Promise<void> | null = null;
	/** Set when a flush is asked for while one runs: the running one goes round once more. */
	private again = false;

	constructor(
		private scale: ScaleOfPoints,
		initial: Record<string, TabletSheet>,
		private person: string
	) {
		this.sheets = structuredClone(initial);
		this.confirmed = structuredClone(initial);
		for (const [id, s] of Object.entries(initial)) this.known[id] = s.version;
	}

	/** Changes not yet acknowledged by the server, counting those still being queued. */
	get waiting(): number {
		return this.queued + this.pending;
	}

	get status(): SyncStatus {
		if (!this.started) return 'reading';
		if (Object.keys(this.conflicts).length > 0) return 'conflict';
		if (this.waiting > 0 && this.signedOut) return 'signed-out';
		if (this.waiting > 0) return this.sending && this.online ? 'saving' : 'waiting';
		return 'saved';
	}

	/**
	 * Reads what the tablet kept (sheets newer than the page's copy, changes left from before a
	 * reload or a closed browser), shows it, and sends the waiting changes.
	 */
	async start(): Promise<void> {
		this.online = navigator.onLine;
		useTabletOf(this.person);
		await adoptLegacyChanges();
		const kept = await readKeptSheets();
		for (const [id, s] of Object.entries(kept)) {
			if (!this.sheets[id] || s.version <= this.sheets[id].version) continue;
			this.sheets[id] = structuredClone(s);
			this.confirmed[id] = structuredClone(s);
			this.known[id] = s.version;
		}
		await keepSheets(Object.values(this.confirmed));
		this.lastReached = await readLastReached();
		const queued = await readQueue();
		for (const c of queued) {
			if (!this.sheets[c.entryId]) continue;
			if (c.baseVersion < (this.known[c.entryId] ?? 0)) this.known[c.entryId] = c.baseVersion;
			this.apply(c.entryId, c);
		}
		this.queued = queued.length;
		this.started = true;
		await this.flush();
	}

	/**
	 * Starts (see start) and follows the network: sends when it comes back, and tries again now
	 * and then, since not every browser reports that. Returns the function that stops following.
	 */
	connect(): () => void {
		const on = () => this.setOnline(true);
		const off = () => this.setOnline(false);
		window.addEventListener('online', on);
		window.addEventListener('offline', off);
		void this.start();
		const retry = setInterval(() => {
			if (this.waiting > 0) this.setOnline(navigator.onLine);
		}, 4000);
		return () => {
			clearInterval(retry);
			window.removeEventListener('online', on);
			window.removeEventListener('offline', off);
		};
	}

	setOnline(online: boolean): void {
		this.online = online;
		if (online) void this.flush();
	}

	private apply(entryId: string, edit: SheetEdit): TabletSheet {
		const s = { ...this.sheets[entryId], ...structuredClone(edit) };
		s.total = runningTotal(this.scale, s.deductions);
		s.complete = isSheetComplete(this.scale, {
			deductions: s.deductions,
			notJudgedReason: s.notJudged?.reason ?? null
		});
		this.sheets[entryId] = s;
		return s;
	}

	/**
	 * Records an edit: shown at once, queued in the browser, then sent when the network allows. It
	 * counts as waiting from the start, so the status never reads saved before the server says so.
	 */
	async edit(entryId: string, edit: SheetEdit): Promise<void> {
		const s = this.apply(entryId, edit);
		const change: QueuedChange = {
			changeId: newChangeId(),
			entryId,
			baseVersion: this.known[entryId] ?? 0,
			deductions: $state.snapshot(s.deductions),
			comment: s.comment,
			notJudged: $state.snapshot(s.notJudged),
			judgesChoiceRank: s.judgesChoiceRank
		};
		this.pending++;
		try {
			await enqueue(change);
			this.queued = (await readQueue()).length;
		} finally {
			this.pending--;
		}
		await this.flush();
	}

	/** Sends waiting changes in order until the queue is empty or the network is gone. */
	flush(): Promise<void> {
		if (this.flushing) {
			// A change queued just as the running flush found the queue empty is not left behind.
			this.again = true;
			return this.flushing;
		}
		this.flushing = (async () => {
			do {
				this.again = false;
				await this.run();
			} while (this.again && this.online);
		})().finally(() => (this.flushing = null));
		return this.flushing;
	}

	private async run(): Promise<void> {
		this.sending = true;
		try {
			for (;;) {
				const queue = await readQueue();
				this.queued = queue.length;
				const next = queue.find((c) => !this.conflicts[c.entryId]);
				if (!next || !this.online) return;
				const baseVersion = this.rebased(next);
				const outcome = await send({ ...next, baseVersion });
				if (outcome.kind === 'offline') {
					this.online = navigator.onLine;
					return;
				}
				if (outcome.kind === 'signed-out') {
					this.signedOut = true;
					return;
				}
				this.signedOut = false;
				if (outcome.kind === 'saved') {
					if (outcome.sheet.version !== baseVersion) {
						(this.moved[next.entryId] ??= {})[baseVersion] = outcome.sheet.version;
					}
					await acknowledge({ ...next, baseVersion }, outcome.sheet.version);
					this.known[next.entryId] = outcome.sheet.version;
					this.confirmed[next.entryId] = outcome.sheet;
					const at = Date.now();
					await keepSheets([outcome.sheet]);
					await noteReached(at);
					this.lastReached = at;
					const local = this.sheets[next.entryId];
					if (local) local.version = outcome.sheet.version;
				} else if (outcome.kind === 'conflict') {
					await drop({ entryId: next.entryId });
					delete this.moved[next.entryId];
					this.conflicts[next.entryId] = {
						mine: $state.snapshot(this.sheets[next.entryId]) as TabletSheet,
						theirs: outcome.current,
						message: outcome.message
					};
					this.known[next.entryId] = outcome.current.version;
					this.confirmed[next.entryId] = outcome.current;
					this.sheets[next.entryId] = outcome.current;
					await keepSheets([outcome.current]);
				} else {
					// Refused for good: set aside (kept, never resent) so later saves go on.
					await setAside(next);
					// Each change carries the whole sheet: while the sheet on screen still held the
					// refused text, every later change would carry it and be refused too. The sheet
					// goes back to what the server kept, with the changes still waiting on top.
					await this.showKept(next.entryId);
					this.refusal = `${outcome.message} This change was set aside and the sheet shows what was saved; the later ones are sent.`;
				}
			}
		} finally {
			this.sending = false;
			this.queued = (await readQueue()).length;
		}
	}

	/** Shows a sheet as the server last kept it, with this tablet's waiting changes of it on top. */
	private async showKept(entryId: string): Promise<void> {
		const kept = this.confirmed[entryId];
		if (!kept) return;
		this.sheets[entryId] = {
			...structuredClone(kept),
			version: this.sheets[entryId]?.version ?? kept.version
		};
		for (const c of await readQueue()) {
			if (c.entryId !== entryId) continue;
			const { deductions, comment, notJudged, judgesChoiceRank } = c;
			this.apply(entryId, { deductions, comment, notJudged, judgesChoiceRank });
		}
	}

	/**
	 * The version a waiting change is sent on: a change queued on version V after this tablet's own
	 * earlier change moved the sheet from V to W was made on top of that change, so it goes on W.
	 */
	private rebased(change: QueuedChange): number {
		let base = change.baseVersion;
		const moves = this.moved[change.entryId];
		for (let guard = 0; moves && base in moves && guard < 10_000; guard++) base = moves[base];
		return base;
	}

	/**
	 * Settles a conflict: keep the other person's sheet, or put this judge's scores on top of it
	 * (the put-back waits, shown as waiting, until the server acknowledges it).
	 */
	async resolve(entryId: string, keep: 'theirs' | 'mine'): Promise<void> {
		const conflict = $state.snapshot(this.conflicts[entryId]);
		if (!conflict) return;
		delete this.conflicts[entryId];
		if (keep === 'mine') {
			const { deductions, comment, notJudged, judgesChoiceRank } = conflict.mine;
			await this.edit(entryId, { deductions, comment, notJudged, judgesChoiceRank });
		}
	}
}
