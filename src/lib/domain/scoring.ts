/**
 * Scoring on a scale of points.
 *
 * Judges start from each criterion's maximum and deduct for faults, in half points. A scale of
 * points is data that the show chair sets; `DEFAULT_STANDARD_SCALE` is the seed default.
 * All arithmetic on points is done in whole half-points so that sums are exact.
 */

/** One line of a scale of points: what is judged and how many points it can earn. */
export interface ScaleCriterion {
	key: string;
	label: string;
	maxPoints: number;
}

/** A scale of points: the criteria a plant is judged on, each with its maximum. */
export interface ScaleOfPoints {
	id: string;
	name: string;
	criteria: ScaleCriterion[];
}

/**
 * Scale of points for single-crowned standard, semiminiature and miniature plants (total 100).
 * Source: "A Beginner's Guide to Judging", African Violet Magazine, May/June 1993, rev. 2020.
 */
export const DEFAULT_STANDARD_SCALE: ScaleOfPoints = Object.freeze({
	id: 'standard-single-crown',
	name: 'Single-crowned standard, semiminiature and miniature plants',
	criteria: Object.freeze([
		Object.freeze({ key: 'symmetry', label: 'Symmetry or leaf pattern', maxPoints: 25 }),
		Object.freeze({ key: 'condition', label: 'Condition', maxPoints: 25 }),
		Object.freeze({ key: 'quantity_of_bloom', label: 'Quantity of bloom', maxPoints: 25 }),
		Object.freeze({
			key: 'size_and_type_of_blossom',
			label: 'Size and type of blossom',
			maxPoints: 15
		}),
		Object.freeze({ key: 'color_of_blossom', label: 'Color of blossom', maxPoints: 10 })
	]) as ScaleCriterion[]
}) as ScaleOfPoints;

/** Why a plant was not judged. */
export type NotJudgedReason = 'wrong_class' | 'suckers' | 'pests' | 'not_in_bloom' | 'other';

/** Every reason a plant may be left unjudged, in display order. */
export const NOT_JUDGED_REASONS: readonly NotJudgedReason[] = Object.freeze([
	'wrong_class',
	'suckers',
	'pests',
	'not_in_bloom',
	'other'
]);

/** Points deducted per criterion key. A criterion that is absent had nothing deducted. */
export type Deductions = Record<string, number>;

/** A judged sheet: the points one judge (or the clerk, for a consensus panel) deducted. */
export interface JudgedSheet {
	notJudged?: false;
	deductions: Deductions;
}

/** A sheet for a plant the panel did not judge, with the reason. */
export interface NotJudgedSheet {
	notJudged: true;
	reason: NotJudgedReason;
	note?: string;
}

/** A judge's sheet for one entry: deductions, or a reason for not judging. */
export type ScoreSheet = JudgedSheet | NotJudgedSheet;

/** A problem found in a scale or a set of deductions, tied to the criterion it concerns. */
export interface ScoringProblem {
	criterionKey: string;
	message: string;
}

/** The result of scoring one sheet: the total and the points earned per criterion. */
export interface SheetScore {
	total: number;
	byCriterion: Record<string, number>;
}

/** How a panel turns its sheets into one score. */
export type PanelMethod = 'mean' | 'consensus';

/**
 * How the mean of the judges' totals is rounded before the ribbon and place minimums apply:
 * `'tenth'` to one decimal (half up), `'whole'` to whole points (half up).
 */
export type MeanRounding = 'tenth' | 'whole';

/** True when the sheet records a plant the panel did not judge. */
export function isNotJudged(sheet: ScoreSheet): sheet is NotJudgedSheet {
	return sheet.notJudged === true;
}

/** Converts points to whole half-points, or returns null if they are not a finite multiple of 0.5. */
function toHalfPoints(points: unknown): number | null {
	if (typeof points !== 'number' || !Number.isFinite(points)) return null;
	const halves = points * 2;
	return Number.isSafeInteger(halves) ? halves : null;
}

/** Describes points as a plain number for messages (e.g. 12.5). */
function formatPoints(points: number): string {
	return String(points);
}

/**
 * Checks a scale of points: it needs at least one criterion, unique non-empty keys and maxima
 * that are positive multiples of half a point. Returns every problem found (empty when sound).
 */
export function validateScale(scale: ScaleOfPoints): ScoringProblem[] {
	const problems: ScoringProblem[] = [];
	if (scale.criteria.length === 0) {
		problems.push({ criterionKey: '', message: 'A scale of points needs at least one criterion.' });
	}
	const seen = new Set<string>();
	for (const criterion of scale.criteria) {
		if (criterion.key.trim() === '') {
			problems.push({ criterionKey: criterion.key, message: 'A criterion needs a key.' });
		} else if (seen.has(criterion.key)) {
			problems.push({
				criterionKey: criterion.key,
				message: `The criterion key "${criterion.key}" is used more than once.`
			});
		}
		seen.add(criterion.key);
		const halves = toHalfPoints(criterion.maxPoints);
		if (halves === null || halves <= 0) {
			problems.push({
				criterionKey: criterion.key,
				message: `The maximum for ${criterion.label} must be a positive multiple of 0.5.`
			});
		}
	}
	return problems;
}

/** The total of a scale of points (100 for the default scale). */
export function scaleTotal(scale: ScaleOfPoints): number {
	let halves = 0;
	for (const criterion of scale.criteria) halves += toHalfPoints(criterion.maxPoints) ?? 0;
	return halves / 2;
}

/**
 * Checks a judge's deductions against a scale of points. Each deduction must be a finite,
 * non-negative multiple of 0.5 no larger than its criterion's maximum, and name a criterion
 * of the scale. Accepts unknown values so raw form input can be checked. Problems come in the
 * scale's order, then unknown keys in key order; an empty list means the deductions are valid.
 */
export function validateDeductions(
	scale: ScaleOfPoints,
	deductions: Record<string, unknown>
): ScoringProblem[] {
	const problems: ScoringProblem[] = [];
	const known = new Set<string>();
	for (const criterion of scale.criteria) {
		known.add(criterion.key);
		if (!Object.hasOwn(deductions, criterion.key)) continue;
		const value = deductions[criterion.key];
		const label = criterion.label;
		if (typeof value !== 'number' || Number.isNaN(value)) {
			problems.push({ criterionKey: criterion.key, message: `${label}: enter a number.` });
			continue;
		}
		if (!Number.isFinite(value)) {
			problems.push({ criterionKey: criterion.key, message: `${label}: enter a finite number.` });
			continue;
		}
		if (value < 0) {
			problems.push({
				criterionKey: criterion.key,
				message: `${label}: a deduction cannot be negative.`
			});
			continue;
		}
		if (toHalfPoints(value) === null) {
			problems.push({
				criterionKey: criterion.key,
				message: `${label}: deduct in whole or half points.`
			});
			continue;
		}
		if (value > criterion.maxPoints) {
			problems.push({
				criterionKey: criterion.key,
				message: `${label}: cannot deduct more than the ${formatPoints(criterion.maxPoints)} points it carries.`
			});
		}
	}
	const unknown = Object.keys(deductions)
		.filter((key) => !known.has(key))
		.sort(compareStrings);
	for (const key of unknown) {
		problems.push({
			criterionKey: key,
			message: `"${key}" is not a criterion of the scale ${scale.name}.`
		});
	}
	return problems;
}

/**
 * Scores one sheet: each criterion earns its maximum less the deduction (a missing criterion
 * has nothing deducted), and the total is their sum. Sums are exact (half-point integers).
 * Throws a RangeError if the scale or the deductions are invalid; check them first with
 * `validateScale` and `validateDeductions` to show problems to the user.
 */
export function scoreSheet(scale: ScaleOfPoints, deductions: Deductions): SheetScore {
	const problems = [...validateScale(scale), ...validateDeductions(scale, deductions)];
	if (problems.length > 0) throw new RangeError(problems[0].message);
	const byCriterion: Record<string, number> = {};
	let totalHalves = 0;
	for (const criterion of scale.criteria) {
		const maxHalves = toHalfPoints(criterion.maxPoints) as number;
		const deductedHalves = Object.hasOwn(deductions, criterion.key)
			? (toHalfPoints(deductions[criterion.key]) as number)
			: 0;
		const earned = maxHalves - deductedHalves;
		byCriterion[criterion.key] = earned / 2;
		totalHalves += earned;
	}
	return { total: totalHalves / 2, byCriterion };
}

/** Checks that a sheet total is a finite multiple of 0.5 and returns it in half points. */
function requireHalfPoints(total: number, what: string): number {
	const halves = toHalfPoints(total);
	if (halves === null) {
		throw new RangeError(`${what} must be a finite multiple of 0.5 (got ${String(total)}).`);
	}
	return halves;
}

/** Integer division rounding toward minus infinity, for exact rounding of means. */
function floorDiv(dividend: number, divisor: number): number {
	const remainder = dividend % divisor;
	const quotient = (dividend - remainder) / divisor;
	return remainder < 0 ? quotient - 1 : quotient;
}

/**
 * The panel's score for one entry, from its sheet totals.
 *
 * - `'mean'`: the mean of the judges' totals, rounded half up: to one decimal place by default
 *   (`rounding` `'tenth'`), or to whole points (`'whole'`). The mean is computed exactly from
 *   half-point integers, never from a float: 92.5, 93 and 93 give 92.8333… → 92.8 (or 93), and
 *   90 and 90.5 give 90.25 → 90.3 (or 90); a half always goes up, never to even, and a mean of
 *   89.45 becomes 89.5 (or 89: the whole-point rounding starts from the exact mean, not from 89.5).
 * - `'consensus'`: the panel agrees on one sheet kept by the clerk. That sheet's total is the
 *   score as written (`rounding` does not apply): `consensusTotal` when given, otherwise the only
 *   total in `sheetTotals` (more than one total without a `consensusTotal` is an error).
 *
 * Returns null when there is no sheet at all. Throws a RangeError when a total is not a finite
 * multiple of 0.5.
 */
export function panelScore(
	sheetTotals: number[],
	method: PanelMethod,
	consensusTotal?: number,
	rounding: MeanRounding = 'tenth'
): number | null {
	if (method === 'consensus') {
		if (consensusTotal !== undefined) {
			requireHalfPoints(consensusTotal, 'The consensus total');
			return consensusTotal;
		}
		if (sheetTotals.length === 0) return null;
		if (sheetTotals.length > 1) {
			throw new RangeError('A consensus panel keeps a single sheet; pass the clerk’s total.');
		}
		requireHalfPoints(sheetTotals[0], 'A sheet total');
		return sheetTotals[0];
	}
	if (sheetTotals.length === 0) return null;
	let sumHalves = 0;
	for (const total of sheetTotals) sumHalves += requireHalfPoints(total, 'A sheet total');
	const count = sheetTotals.length;
	if (rounding === 'whole') {
		// mean = sumHalves / (2 * count); half-up = floor(mean + 1/2) = floor((sumHalves + count) / (2 * count))
		return floorDiv(sumHalves + count, 2 * count);
	}
	// mean in tenths = (sumHalves / 2 / count) * 10 = 5 * sumHalves / count; half-up = floor(x + 1/2)
	const tenths = floorDiv(10 * sumHalves + count, 2 * count);
	return tenths / 10;
}

/** Compares strings by code unit, independent of the runtime's locale. */
function compareStrings(a: string, b: string): number {
	return a < b ? -1 : a > b ? 1 : 0;
}
