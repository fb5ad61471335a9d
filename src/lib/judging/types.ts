import type { NotJudgedReason } from '$lib/domain/scoring';

/** A sheet as the tablet holds it and the judging API answers it (the server's SheetView). */
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
	/** True when someone else saved the latest version (another judge or the clerk). */
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
	| { kind: 'offline' }
	| { kind: 'signed-out' };

/** One row of the progress board. */
export interface BoardClass {
	id: string;
	code: string;
	name: string;
	division: string;
	panel: string | null;
	entries: number;
	scored: number;
	notJudged: number;
	left: number;
	missingSheets: number;
	state: 'no_entries' | 'no_panel' | 'waiting' | 'in_progress' | 'judged';
}

/** The progress board: per class and in total. */
export interface Board {
	published: boolean;
	method: 'mean' | 'consensus';
	classesJudged: number;
	classesWithEntries: number;
	entriesLeft: number;
	sheetsMissing: number;
	classes: BoardClass[];
	checkedAt: string;
}

/** An award as the chair reads it. */
export interface AwardLine {
	kind: 'ribbon' | 'placement' | 'best_in_class' | 'top_award' | 'sweepstakes';
	title: string;
	classCode: string | null;
	entryNumber: number | null;
	exhibitor: string | null;
	score: number | null;
	reason: string;
}
