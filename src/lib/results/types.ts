/**
 * The published results of a show, as one structure: every document (award sheets, cards, ribbon
 * labels), the CSV, the e-mails, the charts and the pages are functions of it. Safe to send to the
 * browser except `comments` (judges' words for the exhibitor), which `publicResults` removes.
 */
import type { AwardLevel } from '$lib/domain/awards';

/** Where an entry stands once results are out. */
export type ResultState = 'scored' | 'not_judged' | 'waiting';

/** One entry with its score and awards. */
export interface ResultEntry {
	id: string;
	/** The anonymous entry number on the tag. */
	number: number;
	/** The named variety (or the title of a collection or design). */
	plant: string;
	exhibitorId: string;
	/** The exhibitor's name as members know it (never an e-mail address). */
	exhibitor: string;
	score: number | null;
	state: ResultState;
	/** The ribbon (merit judging) or place (placement judging), or null. */
	level: AwardLevel | null;
	bestInClass: boolean;
	/** Names of the top awards this entry won. */
	topAwards: string[];
	/** The judges' comments, one per sheet that has one. */
	comments: string[];
}

/** One class with its entries, best first. */
export interface ResultClass {
	id: string;
	code: string;
	name: string;
	entries: ResultEntry[];
}

/** One exhibitor's ribbon counts in a division. */
export interface SweepstakesRow {
	exhibitorId: string;
	exhibitor: string;
	blue: number;
	red: number;
	white: number;
	first: number;
	second: number;
	third: number;
	honourable: number;
	winner: boolean;
}

/** A division with its classes and sweepstakes standings (winners first). */
export interface ResultDivision {
	id: string;
	code: string;
	name: string;
	classes: ResultClass[];
	sweepstakes: SweepstakesRow[];
}

/** A top award and the entry that won it. */
export interface TopAwardResult {
	name: string;
	entryId: string;
	number: number;
	classCode: string;
	className: string;
	plant: string;
	exhibitorId: string;
	exhibitor: string;
	score: number | null;
}

/** A show's results. */
export interface ShowResults {
	show: {
		id: string;
		slug: string;
		name: string;
		societyName: string;
		venue: string | null;
		judgingDay: string;
		system: 'merit' | 'placement';
		/** The award settings the results were decided under, in words (`describeAwardSettings`). */
		awardSettings: string[];
		/** ISO time of publishing; null while results are not public. */
		publishedAt: string | null;
	};
	divisions: ResultDivision[];
	topAwards: TopAwardResult[];
	/** Awards the rules could not decide (ties), in words. */
	undecided: string[];
}
