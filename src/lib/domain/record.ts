/**
 * An exhibitor's (or a society's) record across published shows: ribbons and places by year and
 * by variety, best scores, average scores, and the points a plant lost per criterion of the
 * scale. Pure functions of the entries, so the pages, the charts and the CSV show the same numbers.
 */
import type { AwardLevel } from './awards';
import type { Deductions, ScaleCriterion } from './scoring';

/** Every ribbon and place, in the order they are shown (merit first, then placement). */
export const RECORD_LEVELS: readonly AwardLevel[] = Object.freeze([
	'blue',
	'red',
	'white',
	'first',
	'second',
	'third',
	'honourable'
]);

/** One entry of a published show, as a record reads it. */
export interface RecordEntry {
	showId: string;
	showName: string;
	/** The judging day, YYYY-MM-DD. */
	judgingDay: string;
	entryId: string;
	number: number;
	/** The named variety (or the title of a collection or design). */
	plant: string;
	classLabel: string;
	score: number | null;
	level: AwardLevel | null;
	bestInClass: boolean;
	topAwards: string[];
}

/** How many of each ribbon or place. */
export type LevelCounts = Record<AwardLevel, number>;

/** Figures of a group of entries (a year, a variety). */
export interface RecordFigures {
	entries: number;
	/** Entries judged with a score. */
	scored: number;
	/** Entries that won a ribbon or a place. */
	placed: number;
	counts: LevelCounts;
	bestInClass: number;
	topAwards: number;
	/** Highest score, or null when none was scored. */
	bestScore: number | null;
	/** Mean of the scores to a tenth, or null when none was scored. */
	averageScore: number | null;
}

/** A year's figures. */
export interface YearRecord extends RecordFigures {
	year: string;
	shows: number;
}

/** A variety's figures. */
export interface VarietyRecord extends RecordFigures {
	variety: string;
	shows: number;
}

function emptyCounts(): LevelCounts {
	return Object.fromEntries(RECORD_LEVELS.map((l) => [l, 0])) as LevelCounts;
}

/** Rounds to a tenth without binary noise (95.25 → 95.3). */
export function roundToTenth(value: number): number {
	return Math.round(value * 10 + Number.EPSILON * 10) / 10;
}

/** The figures of a group of entries. */
export function figuresOf(entries: readonly RecordEntry[]): RecordFigures {
	const counts = emptyCounts();
	let placed = 0;
	let bestInClass = 0;
	let topAwards = 0;
	const scores: number[] = [];
	for (const e of entries) {
		if (e.level) {
			counts[e.level] += 1;
			placed += 1;
		}
		if (e.bestInClass) bestInClass += 1;
		topAwards += e.topAwards.length;
		if (e.score !== null) scores.push(e.score);
	}
	return {
		entries: entries.length,
		scored: scores.length,
		placed,
		counts,
		bestInClass,
		topAwards,
		bestScore: scores.length ? Math.max(...scores) : null,
		averageScore: scores.length
			? roundToTenth(scores.reduce((a, b) => a + b, 0) / scores.length)
			: null
	};
}

function groupBy(entries: readonly RecordEntry[], key: (e: RecordEntry) => string) {
	const groups = new Map<string, RecordEntry[]>();
	for (const e of entries) {
		const k = key(e);
		groups.set(k, [...(groups.get(k) ?? []), e]);
	}
	return groups;
}

const showCount = (entries: readonly RecordEntry[]) => new Set(entries.map((e) => e.showId)).size;

/** The figures of each year (of the judging day), newest year first. */
export function recordByYear(entries: readonly RecordEntry[]): YearRecord[] {
	return [...groupBy(entries, (e) => e.judgingDay.slice(0, 4))]
		.map(([year, list]) => ({ year, shows: showCount(list), ...figuresOf(list) }))
		.sort((a, b) => b.year.localeCompare(a.year));
}

/**
 * The figures of each variety: entered most first, then placed most, then by name. With
 * `by: 'placed'`, placed most first, then entered most.
 */
export function recordByVariety(
	entries: readonly RecordEntry[],
	by: 'entered' | 'placed' = 'entered'
): VarietyRecord[] {
	const rows = [...groupBy(entries, (e) => e.plant)].map(([variety, list]) => ({
		variety,
		shows: showCount(list),
		...figuresOf(list)
	}));
	return rows.sort((a, b) => {
		const first = by === 'entered' ? b.entries - a.entries : b.placed - a.placed;
		const second = by === 'entered' ? b.placed - a.placed : b.entries - a.entries;
		return first || second || a.variety.localeCompare(b.variety);
	});
}

/** The highest-scoring entries, best first (newest first among equal scores). */
export function bestScores(entries: readonly RecordEntry[], count = 5): RecordEntry[] {
	return entries
		.filter((e) => e.score !== null)
		.sort((a, b) => b.score! - a.score! || b.judgingDay.localeCompare(a.judgingDay))
		.slice(0, count);
}

/** Ribbon and place counts in a sentence: "2 blue ribbons, 1 red ribbon"; '' for none. */
export function describeCounts(counts: LevelCounts): string {
	const words: Record<AwardLevel, [string, string]> = {
		blue: ['blue ribbon', 'blue ribbons'],
		red: ['red ribbon', 'red ribbons'],
		white: ['white ribbon', 'white ribbons'],
		first: ['first place', 'first places'],
		second: ['second place', 'second places'],
		third: ['third place', 'third places'],
		honourable: ['honorable mention', 'honorable mentions']
	};
	return RECORD_LEVELS.filter((l) => counts[l] > 0)
		.map((l) => `${counts[l]} ${words[l][counts[l] === 1 ? 0 : 1]}`)
		.join(', ');
}

/** Points lost on one criterion of the scale. */
export interface PointsLost {
	key: string;
	label: string;
	maxPoints: number;
	/** Points lost (the mean of the panel's sheets, to a tenth). */
	lost: number;
}

/**
 * The points an entry lost on each criterion of its scale: the mean of the judged sheets given
 * (a panel's judges, or its one consensus sheet), to a tenth, in the scale's order. Empty when
 * no sheet is given.
 */
export function pointsLost(
	criteria: readonly ScaleCriterion[],
	sheets: readonly Deductions[]
): PointsLost[] {
	if (sheets.length === 0) return [];
	return criteria.map((c) => {
		const total = sheets.reduce((sum, s) => sum + (Number(s[c.key]) || 0), 0);
		return {
			key: c.key,
			label: c.label,
			maxPoints: c.maxPoints,
			lost: roundToTenth(total / sheets.length)
		};
	});
}

/** The criteria that lost points, most lost first (the scale's order among equals). */
export function markedDown(lost: readonly PointsLost[]): PointsLost[] {
	return lost
		.map((p, i) => ({ p, i }))
		.filter(({ p }) => p.lost > 0)
		.sort((a, b) => b.p.lost - a.p.lost || a.i - b.i)
		.map(({ p }) => p);
}

/** The ribbons and places that occur among the entries, in RECORD_LEVELS order. */
export function levelsIn(entries: readonly RecordEntry[]): AwardLevel[] {
	const seen = new Set(entries.map((e) => e.level));
	return RECORD_LEVELS.filter((l) => seen.has(l));
}
