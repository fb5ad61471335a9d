import type { NotJudgedReason } from '$lib/domain/scoring';

/** A sheet as the tablet holds it (mirrors SheetView of the server's judging service). */
export interface TabletSheet {
	entryId: string;
	kind: 'judge' | 'consensus';
	version: number;
	deductions: Record<string, number>;
	comment: string;
	notJudged: { reason: NotJudgedReason; note: string } | null;
	judgesChoiceRank: number | null;
	total: number;
	complete: boolean;
	changedByOther: boolean;
}

/** One change waiting in the browser: the whole sheet as the judge left it. */
export interface QueuedChange {
	changeId: string;
	entryId: string;
	baseVersion: number;
	deductions: Record<string, number>;
	comment: string;
	notJudged: { reason: NotJudgedReason; note: string } | null;
	judgesChoiceRank: number | null;
}

/** What became of a change sent to the server. */
export type SendOutcome =
	| { kind: 'saved'; sheet: TabletSheet }
	| { kind: 'conflict'; current: TabletSheet; message: string }
	| { kind: 'refused'; message: string }
	| { kind: 'offline' };
