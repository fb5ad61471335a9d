/**
 * Judging rules that sit between single sheets (scoring.ts) and awards (awards.ts): when a sheet
 * is complete, how a panel's sheets become the entry's score, and who may not judge a class.
 * Pure functions; no framework or database imports.
 */

import {
	panelScore,
	scoreSheet,
	type Deductions,
	type MeanRounding,
	type NotJudgedReason,
	type PanelMethod,
	type ScaleOfPoints
} from './scoring';

/** A stored sheet as the panel rules need it. */
export interface PanelSheet {
	/** The judge who keeps the sheet, or null for the panel's consensus sheet. */
	judgeId: string | null;
	deductions: Deductions;
	notJudgedReason: NotJudgedReason | null;
	judgesChoiceRank: number | null;
}

/** Where an entry stands in judging. */
export type JudgingState = 'waiting' | 'in_progress' | 'scored' | 'not_judged';

/** The panel's result for one entry. */
export interface PanelResult {
	state: JudgingState;
	/** The panel score (see `panelScore` for the rounding), null until every sheet is complete. */
	score: number | null;
	/** Points earned per criterion, combined like the score (used by the tie-break). */
	criterionScores: Record<string, number> | null;
	/** The judges' choice recorded on the sheets (mean of the recorded ranks), or null. */
	judgesChoiceRank: number | null;
	/** Sheets still missing or incomplete. */
	missing: number;
	notJudgedReason: NotJudgedReason | null;
}

/**
 * True when a sheet is finished: the entry is marked not judged, or every criterion of the scale
 * has a deduction recorded (0 included). A criterion left blank is not yet judged.
 */
export function isSheetComplete(
	scale: ScaleOfPoints,
	sheet: Pick<PanelSheet, 'deductions' | 'notJudgedReason'>
): boolean {
	if (sheet.notJudgedReason !== null) return true;
	return scale.criteria.every((c) => typeof sheet.deductions[c.key] === 'number');
}

/** The total of a sheet so far: every criterion's maximum less what was deducted. */
export function runningTotal(scale: ScaleOfPoints, deductions: Deductions): number {
	return scoreSheet(scale, deductions).total;
}

/**
 * Combines the sheets of one entry into the panel's result.
 *
 * - `'mean'`: every judge now on the panel keeps a sheet; the score is the mean of their totals
 *   once every sheet is complete, rounded half up as the show sets (`rounding`: one decimal by
 *   default, or whole points; see `panelScore`). Sheets of people no longer on the panel are
 *   ignored.
 * - `'consensus'`: the panel's one consensus sheet gives the score once it is complete.
 *
 * An entry that a sheet marks not judged is not judged (the first reason found, in judge order,
 * is reported). Criterion points are combined to one decimal, half up, whatever the score's
 * rounding, so a tie-break on a criterion keeps its precision.
 */
export function combinePanelSheets(
	scale: ScaleOfPoints,
	method: PanelMethod,
	judgeIds: readonly string[],
	sheets: readonly PanelSheet[],
	rounding: MeanRounding = 'tenth'
): PanelResult {
	const counted =
		method === 'consensus'
			? sheets.filter((s) => s.judgeId === null).slice(0, 1)
			: [...judgeIds]
					.sort()
					.map((id) => sheets.find((s) => s.judgeId === id))
					.filter((s): s is PanelSheet => s !== undefined);
	const expected = method === 'consensus' ? 1 : judgeIds.length;
	const notJudged = counted.find((s) => s.notJudgedReason !== null);
	if (notJudged) {
		return {
			state: 'not_judged',
			score: null,
			criterionScores: null,
			judgesChoiceRank: null,
			missing: 0,
			notJudgedReason: notJudged.notJudgedReason
		};
	}
	const complete = counted.filter((s) => isSheetComplete(scale, s));
	const missing = expected - complete.length;
	if (expected === 0 || missing > 0) {
		return {
			state: counted.length > 0 ? 'in_progress' : 'waiting',
			score: null,
			criterionScores: null,
			judgesChoiceRank: null,
			missing,
			notJudgedReason: null
		};
	}
	const scored = complete.map((s) => scoreSheet(scale, s.deductions));
	const score = panelScore(
		scored.map((s) => s.total),
		'mean',
		undefined,
		method === 'mean' ? rounding : 'tenth'
	);
	const criterionScores: Record<string, number> = {};
	for (const c of scale.criteria) {
		criterionScores[c.key] = panelScore(
			scored.map((s) => s.byCriterion[c.key]),
			'mean'
		) as number;
	}
	const ranks = complete
		.map((s) => s.judgesChoiceRank)
		.filter((r): r is number => typeof r === 'number' && Number.isInteger(r) && r > 0);
	return {
		state: 'scored',
		score,
		criterionScores,
		judgesChoiceRank: ranks.length === 0 ? null : panelScore(ranks, 'mean'),
		missing: 0,
		notJudgedReason: null
	};
}

/** A person who would judge (or keep the sheets of) a class. */
export interface JudgingPerson {
	userId: string;
	/** The household recorded on their membership, or null. */
	household: string | null;
}

/** An entry as the conflict rule needs it: its class and its exhibitor's household. */
export interface ConflictEntry {
	classId: string;
	exhibitorId: string;
	exhibitorHousehold: string | null;
}

/** Why a person may not judge a class. */
export interface JudgingConflict {
	userId: string;
	classId: string;
	reason: 'own_entry' | 'household_entry';
}

/** Households compare trimmed and without regard to case; an empty household is none. */
function sameHousehold(a: string | null, b: string | null): boolean {
	const x = a?.trim().toLowerCase() ?? '';
	const y = b?.trim().toLowerCase() ?? '';
	return x !== '' && x === y;
}

/**
 * Finds every (person, class) pair where the person has an entry in the class, or someone of
 * their recorded household does. A judge must never judge such a class. Each pair is reported
 * once, an own entry before a household entry; output is ordered by class id, then user id.
 */
export function findJudgingConflicts(
	people: readonly JudgingPerson[],
	classIds: readonly string[],
	entries: readonly ConflictEntry[]
): JudgingConflict[] {
	const wanted = new Set(classIds);
	const found = new Map<string, JudgingConflict>();
	for (const entry of entries) {
		if (!wanted.has(entry.classId)) continue;
		for (const person of people) {
			const key = `${entry.classId}\u0000${person.userId}`;
			if (entry.exhibitorId === person.userId) {
				found.set(key, { userId: person.userId, classId: entry.classId, reason: 'own_entry' });
			} else if (!found.has(key) && sameHousehold(person.household, entry.exhibitorHousehold)) {
				found.set(key, {
					userId: person.userId,
					classId: entry.classId,
					reason: 'household_entry'
				});
			}
		}
	}
	return [...found.entries()].sort(([a], [b]) => (a < b ? -1 : a > b ? 1 : 0)).map(([, c]) => c);
}
