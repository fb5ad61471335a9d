/**
 * The awards engine: one pure function, `computeAwards`, that turns a show's judged entries into
 * every award, each with a plain-sentence reason.
 *
 * Inputs (`AwardInput`):
 * - `classes`: the show's classes, each in a division.
 * - `entries`: the entries, each in a class, with its panel score (null until judged), optional
 *   per-criterion points (points earned, not deducted) and an optional judges' choice rank.
 * - `rules`: the show's award rules (`AwardRules`): merit or placement judging, the minimum
 *   scores, the tie-break, the sweepstakes tie-break and the top awards.
 * - `scale` (optional): the scale of points, used only to name criteria in reasons.
 *
 * Output (`AwardResult`):
 * - `awards`: ribbons (merit judging) or places (placement judging), best in class, top awards
 *   and sweepstakes, each with a reason.
 * - `ties`: ties the rules could not break. The award at stake is not given (best in class, top
 *   award, place) until the show decides; sweepstakes ties are shared and reported.
 * - `sweepstakes`: per division, every exhibitor's ribbon counts and the winner(s).
 *
 * Rules applied:
 * - Entries that were not judged or have no score get nothing.
 * - Merit judging: every judged entry gets the highest ribbon whose mark it reaches, as many
 *   of each color as deserved. Best in class is chosen only among blue-ribbon entries.
 * - Placement judging: one first, second and third per class, in order of score, then honorable
 *   mentions as the show sets (`honorableMentions`: one, up to a number, or every entry reaching
 *   the minimum). An entry takes the highest open place whose minimum it reaches; a place nobody
 *   reaches is not given. Entries tied where only honorable mentions are left, and enough of them,
 *   all get one (the mentions are equal, so there is nothing to decide). Best in class is the
 *   first-place entry.
 * - Scores arrive already rounded (`meanRounding` is applied where the panel's sheets are
 *   combined, `combinePanelSheets`); the engine compares them as they are.
 * - Ranking: score, highest first; then, if the show names one, that criterion's points, highest
 *   first (an entry without them ranks below one with them); then, if the show uses it, the
 *   judges' choice rank, lowest first (an unranked entry ranks below a ranked one). Entries still
 *   equal are tied.
 * - Top awards: chosen among the best-in-class entries of their classes, each needing its
 *   minimum score. One entry may win several top awards (`topAwardsPerPlant` `'several'`), or
 *   only one (`'one'`): then the top awards are decided in the order the show lists them and a
 *   plant that already won one is passed over for the later ones. A top award waits while a class
 *   it covers has an unresolved best-in-class tie at or above the leading score; under `'one'` it
 *   also waits while its leader is a contender for an earlier top award that is not decided.
 * - Sweepstakes: per division, the exhibitor with the most blue ribbons (placement judging: most
 *   first places); ties are shared unless the show sets a sweepstakes tie-break.
 *
 * Determinism: the result depends only on the content of the input, not on the order of its
 * arrays, except the order of `rules.topAwards` under `topAwardsPerPlant: 'one'`, which is the
 * show's order of precedence. Classes, divisions, top awards and exhibitors are ordered by id (code-unit order);
 * entries within a class by rank, then entry number, then id. Throws an Error on inconsistent
 * input (duplicate ids, an entry in an unknown class, a score that is not a finite number).
 * Work is O(n log n) in the number of entries: entries are grouped with Maps and sorted per class.
 */

import type { MeanRounding, PanelMethod, ScaleOfPoints } from './scoring';

/** A merit ribbon. */
export type MeritLevel = 'blue' | 'red' | 'white';

/** A place under placement judging. */
export type PlacementLevel = 'first' | 'second' | 'third' | 'honourable';

/** Any ribbon or place an entry can receive in its class. */
export type AwardLevel = MeritLevel | PlacementLevel;

/** The show's award rules; every value is a per-show setting. */
export interface AwardRules {
	/** Merit judging (as many ribbons as deserved) or placement judging (one per place). */
	system: 'merit' | 'placement';
	/** The lowest score for each merit ribbon. */
	merit: { blue: number; red: number; white: number };
	/** The lowest score for each place under placement judging. */
	placement: { first: number; second: number; third: number; honourable: number };
	/** An extra minimum score for best in class, or null for none. */
	bestInClassMin: number | null;
	/** How equal scores are separated: a named criterion first, then the judges' choice. */
	tieBreak: { criterionKey: string | null; useJudgesChoice: boolean };
	/** How a sweepstakes tie is separated; 'none' shares it. */
	sweepstakesTieBreak: 'none' | 'most_red' | 'highest_total';
	/** Top awards (best in show, best trailer, …), each chosen among best-in-class entries. */
	topAwards: TopAwardRule[];
	/** How many honorable mentions a class may give under placement judging. */
	honorableMentions: HonorableMentions;
	/** How a panel's mean is rounded before the minimums apply (see `panelScore`). */
	meanRounding: MeanRounding;
	/** Whether one plant may take several top awards, or only one. */
	topAwardsPerPlant: 'several' | 'one';
}

/**
 * Honorable mentions per class under placement judging: `'one'`, `'number'` (up to `count`), or
 * `'all'` (every entry reaching the minimum that took no higher place). `count` is read only
 * for `'number'`.
 */
export interface HonorableMentions {
	rule: 'one' | 'number' | 'all';
	count: number;
}

/** The largest number of honorable mentions a show may set per class. */
export const MAX_HONORABLE_MENTIONS = 99;

/** One top award: its name, the classes whose best-in-class entries compete, and a minimum. */
export interface TopAwardRule {
	id: string;
	name: string;
	classIds: string[];
	minScore: number;
}

/** A class of the show schedule, as the engine needs it. */
export interface AwardClass {
	id: string;
	divisionId: string;
	code: string;
	name: string;
}

/** An entry, as the engine needs it. */
export interface AwardEntry {
	id: string;
	/** The anonymous entry number on the tag. */
	number: number;
	classId: string;
	exhibitorId: string;
	/** The panel score, or null when not yet scored. */
	score: number | null;
	notJudged?: boolean;
	/** Points earned per criterion (the panel's), used by the tie-break. */
	criterionScores?: Record<string, number>;
	/** The judges' preference recorded on the sheet: 1 is preferred over 2; null when none. */
	judgesChoiceRank?: number | null;
}

/** One award, with the reason it was given. */
export interface Award {
	kind: 'ribbon' | 'placement' | 'best_in_class' | 'top_award' | 'sweepstakes';
	entryId?: string;
	exhibitorId?: string;
	classId?: string;
	divisionId?: string;
	topAwardId?: string;
	level?: AwardLevel;
	score?: number;
	reason: string;
}

/** A tie the rules could not break, reported so the show can decide. */
export interface AwardTie {
	kind: 'placement' | 'best_in_class' | 'top_award' | 'sweepstakes';
	classId?: string;
	divisionId?: string;
	topAwardId?: string;
	/** The places held open by a placement tie. */
	levels?: PlacementLevel[];
	entryIds?: string[];
	exhibitorIds?: string[];
	reason: string;
}

/** One exhibitor's counts in a division; the other system's counts stay 0. */
export interface SweepstakesStanding {
	exhibitorId: string;
	blue: number;
	red: number;
	white: number;
	first: number;
	second: number;
	third: number;
	honourable: number;
	/** Sum of the scores of the exhibitor's entries that won a ribbon or place here. */
	totalScore: number;
}

/** Sweepstakes for one division: standings (best first) and the winner(s). */
export interface SweepstakesResult {
	divisionId: string;
	standings: SweepstakesStanding[];
	/** One winner, several when a tie is shared, none when nobody won a top ribbon. */
	winners: string[];
}

/** Everything the engine decides for a show. */
export interface AwardResult {
	awards: Award[];
	ties: AwardTie[];
	sweepstakes: SweepstakesResult[];
}

/** The input of `computeAwards`. */
export interface AwardInput {
	classes: AwardClass[];
	entries: AwardEntry[];
	rules: AwardRules;
	/** Used only to name criteria in reasons. */
	scale?: ScaleOfPoints;
}

/** A problem in a show's award rules, tied to the field it concerns. */
export interface AwardRulesProblem {
	field: string;
	message: string;
}

/**
 * Seed award rules. Merit marks: blue 90, red 80, white 70 (national handbook, from memory; a
 * secondary source differs, so they are per-show settings). The placement minimums are our own
 * starting values, not published. Frozen: copy it (`{ ...DEFAULT_AWARD_RULES }`) to change it.
 */
export const DEFAULT_AWARD_RULES: AwardRules = Object.freeze({
	system: 'merit',
	merit: Object.freeze({ blue: 90, red: 80, white: 70 }),
	placement: Object.freeze({ first: 90, second: 80, third: 70, honourable: 60 }),
	bestInClassMin: null,
	tieBreak: Object.freeze({ criterionKey: null, useJudgesChoice: true }),
	sweepstakesTieBreak: 'none',
	topAwards: Object.freeze([]) as unknown as TopAwardRule[],
	honorableMentions: Object.freeze({ rule: 'one', count: 1 }),
	meanRounding: 'tenth',
	topAwardsPerPlant: 'several'
}) as AwardRules;

/**
 * The one reader of stored award rules (shows.award_rules): every part that is missing takes
 * its default from `DEFAULT_AWARD_RULES`, so rules stored before a setting existed keep
 * today's behavior. It does not judge the values; check them with `validateAwardRules` (or the
 * zod schema in `$lib/schemas/award-rules`).
 */
export function awardRulesFrom(stored: unknown): AwardRules {
	const s = (stored && typeof stored === 'object' ? stored : {}) as Partial<AwardRules>;
	const d = DEFAULT_AWARD_RULES;
	return {
		system: s.system ?? d.system,
		merit: { ...d.merit, ...s.merit },
		placement: { ...d.placement, ...s.placement },
		bestInClassMin: s.bestInClassMin === undefined ? d.bestInClassMin : s.bestInClassMin,
		tieBreak: { ...d.tieBreak, ...s.tieBreak },
		sweepstakesTieBreak: s.sweepstakesTieBreak ?? d.sweepstakesTieBreak,
		topAwards: s.topAwards ?? [],
		honorableMentions: { ...d.honorableMentions, ...s.honorableMentions },
		meanRounding: s.meanRounding ?? d.meanRounding,
		topAwardsPerPlant: s.topAwardsPerPlant ?? d.topAwardsPerPlant
	};
}

/**
 * The award settings a show used, in plain words, for the award rules page and the award
 * sheets: honorable mentions (placement judging only), how the panel's score is rounded, and
 * whether a plant may take several top awards.
 */
export function describeAwardSettings(rules: AwardRules, method: PanelMethod): string[] {
	const lines: string[] = [];
	if (rules.system === 'placement') {
		const hm = rules.honorableMentions;
		lines.push(
			hm.rule === 'all'
				? 'Honorable mentions: every entry reaching the minimum'
				: hm.rule === 'number'
					? `Honorable mentions: up to ${hm.count} per class`
					: 'Honorable mentions: one per class'
		);
	}
	lines.push(
		method === 'consensus'
			? 'Panel score: one consensus sheet, as written'
			: rules.meanRounding === 'whole'
				? 'Panel score: mean of the judges, half up to whole points'
				: 'Panel score: mean of the judges, half up to one decimal'
	);
	lines.push(
		rules.topAwardsPerPlant === 'one'
			? 'Top awards: one per plant, in the order listed'
			: 'Top awards: a plant may take several'
	);
	return lines;
}

const MERIT_LEVELS: readonly MeritLevel[] = ['blue', 'red', 'white'];
const PLACEMENT_LEVELS: readonly PlacementLevel[] = ['first', 'second', 'third', 'honourable'];

const LEVEL_WORDS: Record<AwardLevel, string> = {
	blue: 'blue ribbon',
	red: 'red ribbon',
	white: 'white ribbon',
	first: 'first place',
	second: 'second place',
	third: 'third place',
	honourable: 'honorable mention'
};

/** What a chair reads when a ladder of marks is out of order (the show page and the rules page). */
export const MARK_ORDER_MESSAGES = {
	merit: 'The ribbon marks must fall from blue to red to white.',
	placement: 'The place minimums must not rise from first place down.'
} as const;

/**
 * The one rule for the order of a show's marks: the ribbon marks fall from blue to red to white
 * (a mark equal to the one above could never be given), and the place minimums never rise from
 * first place down (equal minimums are allowed). A mark that is not a number is a problem of its
 * own; each ladder gives at most one order problem, at the first level out of order.
 */
export function markOrderProblems(
	marks: Pick<AwardRules, 'merit' | 'placement'>
): AwardRulesProblem[] {
	const problems: AwardRulesProblem[] = [];
	const checkLadder = (
		group: 'merit' | 'placement',
		names: readonly string[],
		values: number[],
		strict: boolean
	): void => {
		let ordered = true;
		values.forEach((value, i) => {
			const field = `${group}.${names[i]}`;
			if (!Number.isFinite(value)) {
				problems.push({ field, message: 'Enter a number.' });
				return;
			}
			const above = values[i - 1];
			if (!ordered || i === 0 || !Number.isFinite(above)) return;
			if (strict ? value >= above : value > above) {
				ordered = false;
				problems.push({ field, message: MARK_ORDER_MESSAGES[group] });
			}
		});
	};
	checkLadder('merit', MERIT_LEVELS, [marks.merit.blue, marks.merit.red, marks.merit.white], true);
	checkLadder(
		'placement',
		PLACEMENT_LEVELS,
		[
			marks.placement.first,
			marks.placement.second,
			marks.placement.third,
			marks.placement.honourable
		],
		false
	);
	return problems;
}

/**
 * Checks a show's award rules: the order of the marks (`markOrderProblems`), a known sweepstakes
 * tie-break, and top awards with unique ids and at least one class. Returns every problem found
 * (empty when sound).
 */
export function validateAwardRules(rules: AwardRules): AwardRulesProblem[] {
	const problems: AwardRulesProblem[] = markOrderProblems(rules);
	if (rules.bestInClassMin !== null && !Number.isFinite(rules.bestInClassMin)) {
		problems.push({ field: 'bestInClassMin', message: 'Enter a number or leave it empty.' });
	}
	if (!['none', 'most_red', 'highest_total'].includes(rules.sweepstakesTieBreak)) {
		problems.push({ field: 'sweepstakesTieBreak', message: 'Choose a sweepstakes tie-break.' });
	}
	if (!['one', 'number', 'all'].includes(rules.honorableMentions.rule)) {
		problems.push({
			field: 'honorableMentions.rule',
			message: 'Choose how many honorable mentions a class may give.'
		});
	}
	const hmCount = rules.honorableMentions.count;
	if (!Number.isInteger(hmCount) || hmCount < 1 || hmCount > MAX_HONORABLE_MENTIONS) {
		problems.push({
			field: 'honorableMentions.count',
			message: `Honorable mentions: enter a whole number from 1 to ${MAX_HONORABLE_MENTIONS}.`
		});
	}
	if (!['tenth', 'whole'].includes(rules.meanRounding)) {
		problems.push({ field: 'meanRounding', message: 'Choose how a panel’s mean is rounded.' });
	}
	if (!['several', 'one'].includes(rules.topAwardsPerPlant)) {
		problems.push({
			field: 'topAwardsPerPlant',
			message: 'Choose whether a plant may take several top awards.'
		});
	}
	const ids = new Set<string>();
	rules.topAwards.forEach((top, i) => {
		if (ids.has(top.id)) {
			problems.push({ field: `topAwards.${i}.id`, message: 'Each top award needs its own id.' });
		}
		ids.add(top.id);
		if (top.classIds.length === 0) {
			problems.push({
				field: `topAwards.${i}.classIds`,
				message: `${top.name} needs at least one class.`
			});
		}
		if (!Number.isFinite(top.minScore)) {
			problems.push({ field: `topAwards.${i}.minScore`, message: 'Enter a number.' });
		}
	});
	return problems;
}

/** An entry that can receive awards: judged and scored. */
interface Scored {
	entry: AwardEntry;
	score: number;
	criterion: number | null;
	choice: number | null;
}

/** A best-in-class tie left open in a class, which may hold up top awards. */
interface OpenBest {
	score: number;
	entryIds: string[];
}

/** Compares strings by code unit, independent of the runtime's locale. */
function compareStrings(a: string, b: string): number {
	return a < b ? -1 : a > b ? 1 : 0;
}

/** The ranking step that separates two entries, or 'none' when they are tied. */
type Separation = 'score' | 'criterion' | 'choice' | 'none';

/** Compares two entries by rank under the show's tie-break; negative when `a` ranks higher. */
function compareRank(a: Scored, b: Scored, rules: AwardRules): number {
	return rankStep(a, b, rules).order;
}

/** Finds which ranking step separates two entries, and their order. */
function rankStep(a: Scored, b: Scored, rules: AwardRules): { order: number; by: Separation } {
	if (a.score !== b.score) return { order: b.score - a.score, by: 'score' };
	if (rules.tieBreak.criterionKey !== null && a.criterion !== b.criterion) {
		if (a.criterion === null) return { order: 1, by: 'criterion' };
		if (b.criterion === null) return { order: -1, by: 'criterion' };
		return { order: b.criterion - a.criterion, by: 'criterion' };
	}
	if (rules.tieBreak.useJudgesChoice && a.choice !== b.choice) {
		if (a.choice === null) return { order: 1, by: 'choice' };
		if (b.choice === null) return { order: -1, by: 'choice' };
		return { order: a.choice - b.choice, by: 'choice' };
	}
	return { order: 0, by: 'none' };
}

/** Sorts entries best first (rank, then entry number, then id) and splits them into tied groups. */
function rankGroups(scored: Scored[], rules: AwardRules): Scored[][] {
	const sorted = [...scored].sort(
		(a, b) =>
			compareRank(a, b, rules) ||
			a.entry.number - b.entry.number ||
			compareStrings(a.entry.id, b.entry.id)
	);
	const groups: Scored[][] = [];
	for (const item of sorted) {
		const last = groups[groups.length - 1];
		if (last && compareRank(last[0], item, rules) === 0) last.push(item);
		else groups.push([item]);
	}
	return groups;
}

/** Formats a score for a sentence (92.5, 93). */
function formatScore(score: number): string {
	return String(score);
}

/** "1 blue ribbon", but "2 blue ribbons" (the count itself is not included). */
function plural(count: number, word: string): string {
	return count === 1 ? word : `${word}s`;
}

/** Joins words as "a", "a and b", "a, b and c". */
function joinWords(words: string[]): string {
	if (words.length <= 1) return words.join('');
	return `${words.slice(0, -1).join(', ')} and ${words[words.length - 1]}`;
}

/** "entry 12", "entries 12 and 15". */
function entryWords(group: Scored[]): string {
	const numbers = group.map((s) => String(s.entry.number));
	return `${group.length === 1 ? 'entry' : 'entries'} ${joinWords(numbers)}`;
}

/** An English ordinal: 1st, 2nd, 3rd, 11th, 22nd. */
function ordinal(n: number): string {
	const tens = n % 100;
	if (tens >= 11 && tens <= 13) return `${n}th`;
	const suffix = ['th', 'st', 'nd', 'rd'][n % 10] ?? 'th';
	return `${n}${suffix}`;
}

/** Capitalizes the first letter of a sentence. */
function sentence(text: string): string {
	return text.charAt(0).toUpperCase() + text.slice(1);
}

/** Describes how the tie-break separated a winner from the next entry on the same score. */
function tieBreakClause(
	winner: Scored,
	next: Scored | undefined,
	rules: AwardRules,
	criterionName: string
): string {
	if (!next) return '';
	const step = rankStep(winner, next, rules);
	if (step.by === 'criterion') {
		const theirs = next.criterion === null ? 'none recorded' : formatScore(next.criterion);
		return ` It ranks ahead of entry ${next.entry.number}, also on ${formatScore(winner.score)}, on ${criterionName} points (${formatScore(winner.criterion as number)} to ${theirs}).`;
	}
	if (step.by === 'choice') {
		return ` It ranks ahead of entry ${next.entry.number}, also on ${formatScore(winner.score)}, by the judges' choice.`;
	}
	return '';
}

/** Describes the show's tie-break in words, for tie reasons. */
function tieBreakWords(rules: AwardRules, criterionName: string): string {
	const steps: string[] = [];
	if (rules.tieBreak.criterionKey !== null) steps.push(`${criterionName} points`);
	if (rules.tieBreak.useJudgesChoice) steps.push("the judges' choice");
	if (steps.length === 0) return 'the show sets no tie-break';
	return `the tie-break (${steps.join(', then ')}) does not separate them`;
}

/** Computes every award for a show. See the module comment for the rules and guarantees. */
export function computeAwards(input: AwardInput): AwardResult {
	const { rules } = input;
	const criterionKey = rules.tieBreak.criterionKey;
	const criterionName =
		criterionKey === null
			? ''
			: (input.scale?.criteria.find((c) => c.key === criterionKey)?.label.toLowerCase() ??
				criterionKey.replace(/_/g, ' '));

	const classes = [...input.classes].sort((a, b) => compareStrings(a.id, b.id));
	const classById = new Map<string, AwardClass>();
	for (const cls of classes) {
		if (classById.has(cls.id)) throw new Error(`Duplicate class id ${cls.id}.`);
		classById.set(cls.id, cls);
	}

	const byClass = new Map<string, Scored[]>();
	const entryIds = new Set<string>();
	for (const entry of input.entries) {
		if (entryIds.has(entry.id)) throw new Error(`Duplicate entry id ${entry.id}.`);
		entryIds.add(entry.id);
		if (!classById.has(entry.classId)) {
			throw new Error(`Entry ${entry.id} is in unknown class ${entry.classId}.`);
		}
		if (entry.notJudged || entry.score === null || entry.score === undefined) continue;
		if (typeof entry.score !== 'number' || !Number.isFinite(entry.score)) {
			throw new Error(`Entry ${entry.id} has a score that is not a finite number.`);
		}
		const rawCriterion = criterionKey === null ? undefined : entry.criterionScores?.[criterionKey];
		const rawChoice = entry.judgesChoiceRank;
		const scored: Scored = {
			entry,
			score: entry.score,
			criterion:
				typeof rawCriterion === 'number' && Number.isFinite(rawCriterion) ? rawCriterion : null,
			choice: typeof rawChoice === 'number' && Number.isFinite(rawChoice) ? rawChoice : null
		};
		const list = byClass.get(entry.classId);
		if (list) list.push(scored);
		else byClass.set(entry.classId, [scored]);
	}

	const awards: Award[] = [];
	const ties: AwardTie[] = [];
	const bestByClass = new Map<string, Scored>();
	const openBestByClass = new Map<string, OpenBest>();
	/** Level won by each entry in its class, for the sweepstakes. */
	const classAwards: { scored: Scored; level: AwardLevel; divisionId: string }[] = [];

	for (const cls of classes) {
		const scored = byClass.get(cls.id) ?? [];
		if (scored.length === 0) continue;
		const groups = rankGroups(scored, rules);
		const where = `class ${cls.code}`;
		const base = { classId: cls.id, divisionId: cls.divisionId };

		/** Candidates for best in class, best first, grouped by tie. */
		let bestGroups: Scored[][];
		let bestContext: string;

		if (rules.system === 'merit') {
			const blues: Scored[][] = [];
			for (const group of groups) {
				for (const item of group) {
					const level = MERIT_LEVELS.find((l) => item.score >= rules.merit[l]);
					if (!level) continue;
					classAwards.push({ scored: item, level, divisionId: cls.divisionId });
					awards.push({
						kind: 'ribbon',
						...base,
						entryId: item.entry.id,
						exhibitorId: item.entry.exhibitorId,
						level,
						score: item.score,
						reason: meritReason(item.score, level, rules)
					});
				}
				const blueGroup = group.filter((item) => item.score >= rules.merit.blue);
				if (blueGroup.length > 0) blues.push(blueGroup);
			}
			bestGroups = blues;
			bestContext = 'blue-ribbon';
		} else {
			const firsts = assignPlaces(groups, rules, cls, criterionName, awards, ties, classAwards);
			bestGroups = firsts;
			bestContext = 'first-place';
		}

		const top = bestGroups[0];
		if (!top) continue;
		const min = rules.bestInClassMin;
		if (min !== null && top[0].score < min) continue;
		if (top.length > 1) {
			openBestByClass.set(cls.id, { score: top[0].score, entryIds: top.map((s) => s.entry.id) });
			ties.push({
				kind: 'best_in_class',
				...base,
				entryIds: top.map((s) => s.entry.id),
				reason: `${sentence(entryWords(top))} in ${where} are tied for best in class on ${formatScore(top[0].score)}, and ${tieBreakWords(rules, criterionName)}; best in class is not given until the judges decide.`
			});
			continue;
		}
		const winner = top[0];
		bestByClass.set(cls.id, winner);
		const count = bestGroups.reduce((n, g) => n + g.length, 0);
		const among =
			rules.system === 'merit'
				? count === 1
					? `the only ${bestContext} entry in ${where}, with ${formatScore(winner.score)}`
					: `the highest score (${formatScore(winner.score)}) among the ${count} ${bestContext} entries in ${where}`
				: `first place in ${where}, with ${formatScore(winner.score)}`;
		const minClause =
			min === null ? '' : `, at or above the best-in-class minimum of ${formatScore(min)}`;
		awards.push({
			kind: 'best_in_class',
			...base,
			entryId: winner.entry.id,
			exhibitorId: winner.entry.exhibitorId,
			score: winner.score,
			reason:
				sentence(`${among}${minClause}.`) +
				(rules.system === 'merit'
					? tieBreakClause(winner, bestGroups[1]?.[0], rules, criterionName)
					: '')
		});
	}

	computeTopAwards(rules, classById, bestByClass, openBestByClass, criterionName, awards, ties);
	const sweepstakes = computeSweepstakes(classes, byClass, classAwards, rules, awards, ties);
	return { awards, ties, sweepstakes };
}

/** The reason for a merit ribbon. */
function meritReason(score: number, level: MeritLevel, rules: AwardRules): string {
	const mark = formatScore(rules.merit[level]);
	const reason = `Scored ${formatScore(score)}, at or above the ${LEVEL_WORDS[level]} mark of ${mark}`;
	if (level === 'blue') return `${reason}.`;
	const above = level === 'red' ? 'blue' : 'red';
	return `${reason} and below the ${LEVEL_WORDS[above]} mark of ${formatScore(rules.merit[above])}.`;
}

/** The places a class can give, in order: first, second, third, then the honorable mentions. */
function placeSlots(rules: AwardRules, judged: number): PlacementLevel[] {
	const hm = rules.honorableMentions;
	const mentions = hm.rule === 'all' ? judged : hm.rule === 'number' ? hm.count : 1;
	return [
		...PLACEMENT_LEVELS.slice(0, 3),
		...Array.from({ length: Math.max(0, mentions) }, () => 'honourable' as const)
	];
}

/** "honorable mention", or "2 honorable mentions" when several are held open. */
function levelListWords(levels: PlacementLevel[]): string {
	const words: string[] = [];
	for (const level of [...new Set(levels)]) {
		const n = levels.filter((l) => l === level).length;
		words.push(n === 1 ? LEVEL_WORDS[level] : `${n} ${LEVEL_WORDS[level]}s`);
	}
	return joinWords(words);
}

/**
 * Gives the places of one class under placement judging and reports placement ties. Returns the
 * best-in-class candidates: the first-place entry, or the group tied for first place.
 */
function assignPlaces(
	groups: Scored[][],
	rules: AwardRules,
	cls: AwardClass,
	criterionName: string,
	awards: Award[],
	ties: AwardTie[],
	classAwards: { scored: Scored; level: AwardLevel; divisionId: string }[]
): Scored[][] {
	const where = `class ${cls.code}`;
	const base = { classId: cls.id, divisionId: cls.divisionId };
	let next = 0;
	let rank = 1;
	const judged = groups.reduce((n, group) => n + group.length, 0);
	const slots = placeSlots(rules, judged);
	const firsts: Scored[][] = [];
	const give = (item: Scored, level: PlacementLevel, reason: string): void => {
		classAwards.push({ scored: item, level, divisionId: cls.divisionId });
		awards.push({
			kind: 'placement',
			...base,
			entryId: item.entry.id,
			exhibitorId: item.entry.exhibitorId,
			level,
			score: item.score,
			reason
		});
	};
	for (let g = 0; g < groups.length && next < slots.length; g++) {
		const group = groups[g];
		const score = group[0].score;
		const open: number[] = [];
		for (let p = next; p < slots.length && open.length < group.length; p++) {
			if (score >= rules.placement[slots[p]]) open.push(p);
		}
		const groupRank = rank;
		rank += group.length;
		if (open.length === 0) continue;
		const missed = [...new Set(slots.slice(next, open[0]))].map(
			(l) => `the ${LEVEL_WORDS[l]} minimum of ${formatScore(rules.placement[l])}`
		);
		next = open[open.length - 1] + 1;
		const levels = open.map((p) => slots[p]);
		const below = missed.length === 0 ? '' : ` (below ${joinWords(missed)})`;
		const ranked = `ranked ${ordinal(groupRank)} of ${judged} judged ${judged === 1 ? 'entry' : 'entries'} in ${where}`;
		if (group.length > 1) {
			const allMentions = levels.length === group.length && levels.every((l) => l === 'honourable');
			if (allMentions) {
				for (const item of group) {
					const others = group.filter((o) => o !== item);
					give(
						item,
						'honourable',
						`Scored ${formatScore(score)}, ${ranked} (level with ${entryWords(others)}), and at or above the ${LEVEL_WORDS.honourable} minimum of ${formatScore(rules.placement.honourable)}${below}; each of them gets one.`
					);
				}
				continue;
			}
			ties.push({
				kind: 'placement',
				...base,
				levels: [...new Set(levels)],
				entryIds: group.map((s) => s.entry.id),
				reason: `${sentence(entryWords(group))} in ${where} are tied on ${formatScore(score)}, and ${tieBreakWords(rules, criterionName)}; ${levelListWords(levels)} ${levels.length === 1 ? 'is' : 'are'} held open until the judges decide.`
			});
			if (levels[0] === 'first') firsts.push(group);
			continue;
		}
		const item = group[0];
		const level = levels[0];
		if (level === 'first') firsts.push(group);
		give(
			item,
			level,
			`Scored ${formatScore(score)}, ${ranked}, and at or above the ${LEVEL_WORDS[level]} minimum of ${formatScore(rules.placement[level])}${below}.` +
				tieBreakClause(item, groups[g + 1]?.[0], rules, criterionName)
		);
	}
	return firsts;
}

/** Chooses each top award among the best-in-class entries of its classes. */
function computeTopAwards(
	rules: AwardRules,
	classById: Map<string, AwardClass>,
	bestByClass: Map<string, Scored>,
	openBestByClass: Map<string, OpenBest>,
	criterionName: string,
	awards: Award[],
	ties: AwardTie[]
): void {
	const onePerPlant = rules.topAwardsPerPlant === 'one';
	// Under one top award per plant the show's listed order is the order of precedence.
	const topAwards = onePerPlant
		? [...rules.topAwards]
		: [...rules.topAwards].sort((a, b) => compareStrings(a.id, b.id));
	/** Entries that won a top award (one per plant). */
	const won = new Map<string, string>();
	/** Entries that may yet win an earlier top award that is not decided, with its name. */
	const undecided = new Map<string, string>();
	for (const top of topAwards) {
		const classIds = [...new Set(top.classIds)]
			.filter((id) => classById.has(id))
			.sort(compareStrings);
		const candidates: Scored[] = [];
		const passedOver: Scored[] = [];
		for (const id of classIds) {
			const best = bestByClass.get(id);
			if (!best || best.score < top.minScore) continue;
			if (onePerPlant && won.has(best.entry.id)) passedOver.push(best);
			else candidates.push(best);
		}
		const groups = rankGroups(candidates, rules);
		const lead = groups[0];
		const leadScore = lead ? lead[0].score : -Infinity;
		const markUndecided = (): void => {
			if (!onePerPlant) return;
			const ids = [
				...candidates.map((c) => c.entry.id),
				...classIds.flatMap((id) => openBestByClass.get(id)?.entryIds ?? [])
			];
			// The earliest undecided top award is the one named in the reason.
			for (const id of ids) if (!undecided.has(id)) undecided.set(id, top.name);
		};
		const waiting = classIds.filter((id) => {
			const open = openBestByClass.get(id);
			return open !== undefined && open.score >= top.minScore && open.score >= leadScore;
		});
		if (waiting.length > 0) {
			const codes = waiting.map((id) => `class ${(classById.get(id) as AwardClass).code}`);
			ties.push({
				kind: 'top_award',
				topAwardId: top.id,
				entryIds: waiting.flatMap((id) => (openBestByClass.get(id) as OpenBest).entryIds),
				reason: `${top.name} is not given yet: best in class is tied in ${joinWords(codes)} at a score that could win it.`
			});
			markUndecided();
			continue;
		}
		if (!lead) continue;
		const waitsFor = onePerPlant ? lead.find((s) => undecided.has(s.entry.id)) : undefined;
		if (waitsFor) {
			ties.push({
				kind: 'top_award',
				topAwardId: top.id,
				entryIds: lead.map((s) => s.entry.id),
				reason: `${top.name} is not given yet: entry ${waitsFor.entry.number} leads it but may still win ${undecided.get(waitsFor.entry.id)}, and a plant takes only one top award at this show.`
			});
			markUndecided();
			continue;
		}
		if (lead.length > 1) {
			ties.push({
				kind: 'top_award',
				topAwardId: top.id,
				entryIds: lead.map((s) => s.entry.id),
				reason: `${top.name}: best-in-class ${entryWords(lead)} are tied on ${formatScore(leadScore)}, and ${tieBreakWords(rules, criterionName)}; the award is not given until the judges decide.`
			});
			markUndecided();
			continue;
		}
		const winner = lead[0];
		won.set(winner.entry.id, top.name);
		const passed = passedOver
			.filter((s) => compareRank(s, winner, rules) < 0)
			.sort((a, b) => compareRank(a, b, rules) || a.entry.number - b.entry.number);
		const passedClause =
			passed.length === 0
				? ''
				: ` ${sentence(entryWords(passed))} ${passed.length === 1 ? 'scores' : 'score'} higher but already ${passed.length === 1 ? 'holds' : 'hold'} a top award (${joinWords([...new Set(passed.map((p) => won.get(p.entry.id) as string))])}), and a plant takes only one at this show.`;
		const cls = classById.get(winner.entry.classId) as AwardClass;
		awards.push({
			kind: 'top_award',
			topAwardId: top.id,
			entryId: winner.entry.id,
			exhibitorId: winner.entry.exhibitorId,
			classId: cls.id,
			divisionId: cls.divisionId,
			score: winner.score,
			reason:
				(candidates.length === 1
					? `${top.name}: the only eligible best-in-class entry, with ${formatScore(winner.score)}, at or above the minimum of ${formatScore(top.minScore)}.`
					: `${top.name}: the highest score (${formatScore(winner.score)}) among the ${candidates.length} eligible best-in-class entries, at or above the minimum of ${formatScore(top.minScore)}.`) +
				tieBreakClause(winner, groups[1]?.[0], rules, criterionName) +
				passedClause
		});
	}
}

/** Counts ribbons per exhibitor and division and names the sweepstakes winner(s). */
function computeSweepstakes(
	classes: AwardClass[],
	byClass: Map<string, Scored[]>,
	classAwards: { scored: Scored; level: AwardLevel; divisionId: string }[],
	rules: AwardRules,
	awards: Award[],
	ties: AwardTie[]
): SweepstakesResult[] {
	const divisions = new Map<string, Map<string, SweepstakesStanding>>();
	const blank = (exhibitorId: string): SweepstakesStanding => ({
		exhibitorId,
		blue: 0,
		red: 0,
		white: 0,
		first: 0,
		second: 0,
		third: 0,
		honourable: 0,
		totalScore: 0
	});
	/** Totals in hundredths, so sums of scores with one or two decimals compare exactly. */
	const hundredths = new Map<SweepstakesStanding, number>();
	for (const cls of classes) {
		let standings = divisions.get(cls.divisionId);
		if (!standings) {
			standings = new Map();
			divisions.set(cls.divisionId, standings);
		}
		for (const item of byClass.get(cls.id) ?? []) {
			const id = item.entry.exhibitorId;
			if (!standings.has(id)) standings.set(id, blank(id));
		}
	}
	for (const { scored, level, divisionId } of classAwards) {
		const standing = (divisions.get(divisionId) as Map<string, SweepstakesStanding>).get(
			scored.entry.exhibitorId
		) as SweepstakesStanding;
		standing[level] += 1;
		hundredths.set(standing, (hundredths.get(standing) ?? 0) + Math.round(scored.score * 100));
	}

	const [topLevel, nextLevel, thirdLevel, fourthLevel]: AwardLevel[] =
		rules.system === 'merit' ? [...MERIT_LEVELS] : [...PLACEMENT_LEVELS];
	const results: SweepstakesResult[] = [];
	const divisionIds = [...divisions.keys()].sort(compareStrings);
	for (const divisionId of divisionIds) {
		const list = [...(divisions.get(divisionId) as Map<string, SweepstakesStanding>).values()];
		for (const standing of list) standing.totalScore = (hundredths.get(standing) ?? 0) / 100;
		const levelCount = (s: SweepstakesStanding, l: AwardLevel | undefined): number =>
			l === undefined ? 0 : s[l];
		list.sort(
			(a, b) =>
				levelCount(b, topLevel) - levelCount(a, topLevel) ||
				levelCount(b, nextLevel) - levelCount(a, nextLevel) ||
				levelCount(b, thirdLevel) - levelCount(a, thirdLevel) ||
				levelCount(b, fourthLevel) - levelCount(a, fourthLevel) ||
				(hundredths.get(b) ?? 0) - (hundredths.get(a) ?? 0) ||
				compareStrings(a.exhibitorId, b.exhibitorId)
		);
		const most = list.length > 0 ? list[0][topLevel] : 0;
		const topWords = `${LEVEL_WORDS[topLevel]}s`;
		let winners: SweepstakesStanding[] = most > 0 ? list.filter((s) => s[topLevel] === most) : [];
		let broken = '';
		if (winners.length > 1 && rules.sweepstakesTieBreak !== 'none') {
			const key =
				rules.sweepstakesTieBreak === 'most_red'
					? (s: SweepstakesStanding) => levelCount(s, nextLevel)
					: (s: SweepstakesStanding) => hundredths.get(s) ?? 0;
			const best = Math.max(...winners.map(key));
			const narrowed = winners.filter((s) => key(s) === best);
			if (narrowed.length < winners.length) {
				broken =
					rules.sweepstakesTieBreak === 'most_red'
						? ` The tie on ${most} was broken by the most ${LEVEL_WORDS[nextLevel as AwardLevel]}s (${best}).`
						: ` The tie on ${most} was broken by the highest total score of awarded entries (${formatScore(best / 100)}).`;
			}
			winners = narrowed;
		}
		winners.sort((a, b) => compareStrings(a.exhibitorId, b.exhibitorId));
		const winnerIds = winners.map((s) => s.exhibitorId);
		if (winners.length > 1) {
			ties.push({
				kind: 'sweepstakes',
				divisionId,
				exhibitorIds: winnerIds,
				reason: `${winners.length} exhibitors are tied for the sweepstakes in this division with ${most} ${plural(most, LEVEL_WORDS[topLevel])} each${rules.sweepstakesTieBreak === 'none' ? ', and the show sets no tie-break' : ', and the tie-break does not separate them'}; the sweepstakes is shared.`
			});
		}
		for (const standing of winners) {
			const shared =
				winners.length > 1
					? ` Shared with ${winners.length - 1} other exhibitor${winners.length > 2 ? 's' : ''} on the same count.`
					: '';
			awards.push({
				kind: 'sweepstakes',
				divisionId,
				exhibitorId: standing.exhibitorId,
				reason: `The most ${topWords} in the division (${most}).${broken}${shared}`
			});
		}
		results.push({ divisionId, standings: list, winners: winnerIds });
	}
	return results;
}
