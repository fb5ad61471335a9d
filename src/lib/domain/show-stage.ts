import { addCalendarDays, compareIsoDates, isIsoDate, type IsoDate } from './dates';

/**
 * The stages a show passes through, in order. Derived, never stored: from the show's dates, the
 * moments its schedule and results were published, and today's date in the society's time zone.
 */
export const SHOW_STAGES = [
	'planning',
	'announced',
	'taking_entries',
	'entries_closed',
	'show_days',
	'awaiting_results',
	'results_out',
	'past'
] as const;
export type ShowStage = (typeof SHOW_STAGES)[number];

/** The four dates of a show, in the order they must come. */
export interface ShowDates {
	entriesOpen: IsoDate;
	entriesClose: IsoDate;
	entryDay: IsoDate;
	judgingDay: IsoDate;
}

/** What the stage is read from. */
export interface StageFacts extends ShowDates {
	schedulePublished: boolean;
	resultsPublished: boolean;
}

/** Our plain words for each stage: a short name and what it means for the people working. */
export const STAGE_WORDS: Record<ShowStage, { label: string; meaning: string }> = {
	planning: {
		label: 'Being planned',
		meaning: 'The schedule is not public yet. Divisions, classes, dates and rules can change.'
	},
	announced: {
		label: 'Schedule public',
		meaning: 'Members can read the schedule; entries have not opened yet.'
	},
	taking_entries: {
		label: 'Taking entries',
		meaning: 'Members can enter plants until entries close.'
	},
	entries_closed: {
		label: 'Entries closed',
		meaning: 'No new entries; the desk prepares for entry day.'
	},
	show_days: {
		label: 'Entry day and judging',
		meaning: 'Plants are checked in at the desk and judged.'
	},
	awaiting_results: {
		label: 'Judged, results not public',
		meaning: 'Judging is over; the chair checks the awards and publishes the results.'
	},
	results_out: {
		label: 'Results public',
		meaning: 'The results are published. Nothing about this show can change any more.'
	},
	past: {
		label: 'Past show',
		meaning: 'The show is over and its results are published. It stays here to read.'
	}
};

/**
 * The stage of a show on a given day. Publishing is what moves a show out of planning and into
 * its end; in between, the dates decide. A show whose schedule is public but whose results are
 * not stays "judged, results not public" however long ago it was, so a late chair can still
 * publish.
 */
export function stageOf(facts: StageFacts, today: IsoDate): ShowStage {
	const before = (day: IsoDate) => compareIsoDates(today, day) < 0;
	const after = (day: IsoDate) => compareIsoDates(today, day) > 0;
	if (facts.resultsPublished) return after(facts.judgingDay) ? 'past' : 'results_out';
	if (!facts.schedulePublished) return 'planning';
	if (before(facts.entriesOpen)) return 'announced';
	if (!after(facts.entriesClose)) return 'taking_entries';
	if (before(facts.entryDay)) return 'entries_closed';
	if (!after(facts.judgingDay)) return 'show_days';
	return 'awaiting_results';
}

/** The kinds of change the stage decides on. */
export type ShowChange =
	'schedule' | 'panels' | 'fees' | 'desk_window' | 'publish_schedule' | 'hide_schedule';

/** The answer to "may this change happen now?": yes, or no with the reason in plain words. */
export type StageVerdict = { allowed: true } | { allowed: false; reason: string };

const YES: StageVerdict = { allowed: true };
const no = (reason: string): StageVerdict => ({ allowed: false, reason });

/** Facts some changes need beyond the stage itself. */
export interface ChangeFacts {
	/** Entries made in the show (withdrawn ones included: they were made). */
	entryCount?: number;
	/** The show's classes, with the name of their scale of points (null when none). */
	classes?: { code: string; scaleId: string | null }[];
}

const LOCKED = 'The results of this show are published: nothing about it can change any more.';

/**
 * The single check of what may change at a stage. The schedule (divisions, classes, dates and
 * rules) changes only while the show is being planned; panels, fees and until when the desk takes
 * entries until the results are out;
 * publishing the schedule needs at least one class and a scale of points for each class (members
 * could otherwise enter where nothing can be judged); hiding a public schedule is possible only
 * while nobody has entered, since entries stand on what the schedule said.
 */
export function checkChange(
	stage: ShowStage,
	change: ShowChange,
	facts: ChangeFacts = {}
): StageVerdict {
	if (stage === 'results_out' || stage === 'past') return no(LOCKED);
	switch (change) {
		case 'schedule':
			return stage === 'planning'
				? YES
				: no(
						'The schedule is public, so divisions, classes, dates and rules are fixed. While nobody has entered, hide the schedule first to change them.'
					);
		case 'panels':
		case 'fees':
		case 'desk_window':
			return YES;
		case 'publish_schedule': {
			if (stage !== 'planning') return no('The schedule is already public.');
			const classes = facts.classes ?? [];
			if (classes.length === 0) {
				return no(
					'The schedule has no class yet: entries would open with nothing to enter. Add at least one class first.'
				);
			}
			const unscored = classes.filter((c) => !c.scaleId).map((c) => c.code);
			if (unscored.length > 0) {
				const list = unscored.join(', ');
				return no(
					`${unscored.length === 1 ? 'Class' : 'Classes'} ${list} ${unscored.length === 1 ? 'has' : 'have'} no scale of points: judges could not score ${unscored.length === 1 ? 'it' : 'them'}. Choose a scale for each class first.`
				);
			}
			return YES;
		}
		case 'hide_schedule':
			if (stage === 'planning') return no('The schedule is not public.');
			if ((facts.entryCount ?? 0) > 0) {
				return no(
					'Members have entered plants on this schedule, so it stays public. Withdrawn entries count too: they were made on what it said.'
				);
			}
			return YES;
	}
}

/** The first problem with the order of a show's dates, with the field it concerns. */
export function datesOutOfOrder(
	dates: ShowDates
): { field: keyof ShowDates; message: string } | null {
	const order: [keyof ShowDates, keyof ShowDates, string][] = [
		['entriesOpen', 'entriesClose', 'Entries must close on or after the day they open.'],
		['entriesClose', 'entryDay', 'Entry day must be on or after the day entries close.'],
		['entryDay', 'judgingDay', 'Judging day must be on or after entry day.']
	];
	for (const [a, b, message] of order) {
		if (compareIsoDates(dates[a], dates[b]) > 0) return { field: b, message };
	}
	return null;
}

/** Whole days from one date to another (negative when `to` comes first). */
function daysBetween(from: IsoDate, to: IsoDate): number {
	return Math.round(compareIsoDates(to, from) / 86_400_000);
}

/**
 * The dates of a copy. The chair gives the new judging day, the day everyone plans around; each
 * other date keeps its distance from judging day in the earlier show (entries that opened six
 * weeks before judging open six weeks before again), unless the chair gives it too.
 */
export function datesForCopy(
	earlier: ShowDates,
	given: { judgingDay: IsoDate } & Partial<ShowDates>
): ShowDates {
	const moved = (key: keyof ShowDates): IsoDate => {
		const own = given[key];
		if (own && isIsoDate(own)) return own;
		return addCalendarDays(given.judgingDay, daysBetween(earlier.judgingDay, earlier[key]));
	};
	return {
		entriesOpen: moved('entriesOpen'),
		entriesClose: moved('entriesClose'),
		entryDay: moved('entryDay'),
		judgingDay: given.judgingDay
	};
}
