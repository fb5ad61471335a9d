import { compareIsoDates, formatDateLong, type IsoDate } from './dates';
import type { ShowStage } from './show-stage';

/**
 * Until when the entry desk takes new entries (walk-ins, or plants a member brings that were never
 * entered online). The show chair chooses; the desk opens on entry day either way, after the
 * entries made online have closed.
 */
export type DeskEntriesUntil = 'judging_starts' | 'entry_day_ends' | 'never';

export const DESK_ENTRIES_UNTIL: readonly DeskEntriesUntil[] = [
	'judging_starts',
	'entry_day_ends',
	'never'
];

/** Plain words for each choice, for the chair's settings and the desk. */
export const DESK_ENTRIES_UNTIL_WORDS: Record<DeskEntriesUntil, string> = {
	judging_starts: 'Until judging starts (the first score of the show)',
	entry_day_ends: 'Until the end of entry day',
	never: 'The desk takes no new entries'
};

/** What the answer depends on. */
export interface DeskWindowFacts {
	until: DeskEntriesUntil;
	stage: ShowStage;
	today: IsoDate;
	entryDay: IsoDate;
	/** A score of this show has been saved: judging has started. */
	judgingStarted: boolean;
}

/** Whether the desk takes a new entry now, and if not, why in one sentence. */
export function deskTakesEntries(
	facts: DeskWindowFacts
): { open: true } | { open: false; reason: string } {
	const closed = (reason: string) => ({ open: false as const, reason });
	if (facts.until === 'never') return closed('This show takes no entries at the desk.');
	if (facts.stage !== 'show_days') {
		return closed(
			compareIsoDates(facts.today, facts.entryDay) < 0
				? `The desk takes entries from entry day, ${formatDateLong(facts.entryDay)}.`
				: 'Judging is over, so the desk takes no more entries.'
		);
	}
	if (facts.until === 'entry_day_ends' && compareIsoDates(facts.today, facts.entryDay) > 0) {
		return closed(
			`The desk took entries until the end of entry day, ${formatDateLong(facts.entryDay)}.`
		);
	}
	if (facts.until === 'judging_starts' && facts.judgingStarted) {
		return closed('Judging has started, so the desk takes no more entries.');
	}
	return { open: true };
}
