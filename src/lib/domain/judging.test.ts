import { describe, expect, it } from 'vitest';
import { computeAwards, DEFAULT_AWARD_RULES, type AwardRules } from './awards';
import {
	combinePanelSheets,
	findJudgingConflicts,
	isSheetComplete,
	runningTotal,
	type PanelSheet
} from './judging';
import { DEFAULT_STANDARD_SCALE } from './scoring';

// The published scale: symmetry 25, condition 25, quantity of bloom 25, size and type of
// blossom 15, color of blossom 10 = 100 ("A Beginner's Guide to Judging", African Violet
// Magazine, May/June 1993, rev. 2020 (DOMAIN.md)).
const scale = DEFAULT_STANDARD_SCALE;

/** A complete sheet from five deductions in the scale's order. */
function sheet(judgeId: string | null, d: [number, number, number, number, number]): PanelSheet {
	const [symmetry, condition, quantity_of_bloom, size_and_type_of_blossom, color_of_blossom] = d;
	return {
		judgeId,
		deductions: {
			symmetry,
			condition,
			quantity_of_bloom,
			size_and_type_of_blossom,
			color_of_blossom
		},
		notJudgedReason: null,
		judgesChoiceRank: null
	};
}

describe('isSheetComplete and runningTotal', () => {
	it('needs a deduction (0 included) for every criterion, or a reason for not judging', () => {
		expect(isSheetComplete(scale, sheet('j', [0, 0, 0, 0, 0]))).toBe(true);
		expect(isSheetComplete(scale, { deductions: { symmetry: 1 }, notJudgedReason: null })).toBe(
			false
		);
		expect(isSheetComplete(scale, { deductions: {}, notJudgedReason: 'suckers' })).toBe(true);
	});

	it('deducts from each maximum (judging by deduction, DOMAIN.md)', () => {
		// 100 - 2 - 1.5 - 3 = 93.5 (arithmetic on the published scale)
		expect(runningTotal(scale, { symmetry: 2, condition: 1.5, quantity_of_bloom: 3 })).toBe(93.5);
		expect(runningTotal(scale, {})).toBe(100);
	});
});

describe('combinePanelSheets, mean of the judges', () => {
	const judges = ['j1', 'j2', 'j3'];

	it('waits until every judge of the panel has a complete sheet', () => {
		expect(combinePanelSheets(scale, 'mean', judges, [])).toMatchObject({
			state: 'waiting',
			missing: 3,
			score: null
		});
		const two = [sheet('j1', [1, 1, 1, 1, 1]), sheet('j2', [0, 0, 0, 0, 0])];
		expect(combinePanelSheets(scale, 'mean', judges, two)).toMatchObject({
			state: 'in_progress',
			missing: 1,
			score: null
		});
	});

	it('averages the totals, rounded half up to one decimal (worked case)', () => {
		// Totals 92.5, 93 and 93: mean 92.8333… → 92.8 (the rounding stated in scoring.ts)
		const result = combinePanelSheets(scale, 'mean', judges, [
			sheet('j1', [2, 2, 2, 1, 0.5]),
			sheet('j2', [2, 2, 2, 1, 0]),
			sheet('j3', [2, 2, 2, 0.5, 0.5])
		]);
		expect(result.state).toBe('scored');
		expect(result.score).toBe(92.8);
		// condition: 23, 23, 23 → 23; color of blossom: 9.5, 10, 9.5 → 9.666… → 9.7
		expect(result.criterionScores?.condition).toBe(23);
		expect(result.criterionScores?.color_of_blossom).toBe(9.7);
	});

	it('rounds an exact half up, not to even: 90 and 90.5 give 90.3 (worked case)', () => {
		const result = combinePanelSheets(
			scale,
			'mean',
			['j1', 'j2'],
			[sheet('j1', [5, 5, 0, 0, 0]), sheet('j2', [5, 4.5, 0, 0, 0])]
		);
		expect(result.score).toBe(90.3);
	});

	it('ignores sheets of people no longer on the panel', () => {
		const result = combinePanelSheets(
			scale,
			'mean',
			['j1'],
			[sheet('j1', [0, 0, 0, 0, 10]), sheet('gone', [25, 25, 25, 15, 10])]
		);
		expect(result).toMatchObject({ state: 'scored', score: 90 });
	});

	it('marks the entry not judged when a sheet says so, with the reason', () => {
		const result = combinePanelSheets(scale, 'mean', judges, [
			sheet('j1', [0, 0, 0, 0, 0]),
			{ judgeId: 'j2', deductions: {}, notJudgedReason: 'pests', judgesChoiceRank: null }
		]);
		expect(result).toMatchObject({ state: 'not_judged', notJudgedReason: 'pests', score: null });
	});

	it('records the judges’ choice as the mean of the ranks given', () => {
		const a = { ...sheet('j1', [0, 0, 0, 0, 0]), judgesChoiceRank: 1 };
		const b = { ...sheet('j2', [0, 0, 0, 0, 0]), judgesChoiceRank: 2 };
		expect(combinePanelSheets(scale, 'mean', ['j1', 'j2'], [a, b]).judgesChoiceRank).toBe(1.5);
	});
});

describe('combinePanelSheets, rounding the mean to whole points', () => {
	// Half up to whole points: a show setting (common practice, no published rule found).
	const judges = ['j1', 'j2'];
	// 100 - 2 - 2 - 2 - 1 - 3 = 90 and 100 - 2 - 2 - 2 - 1 - 4 = 89: mean 89.5
	const sheets = [sheet('j1', [2, 2, 2, 1, 3]), sheet('j2', [2, 2, 2, 1, 4])];

	it('rounds the score, keeps the criterion points to one decimal', () => {
		const tenth = combinePanelSheets(scale, 'mean', judges, sheets);
		const whole = combinePanelSheets(scale, 'mean', judges, sheets, 'whole');
		expect(tenth.score).toBe(89.5);
		expect(whole.score).toBe(90);
		// color of blossom: 10 - 3 = 7 and 10 - 4 = 6, mean 6.5 either way
		expect(whole.criterionScores?.color_of_blossom).toBe(6.5);
	});

	it('turns a red ribbon into a blue one when 89.5 becomes 90', () => {
		// Merit marks blue 90, red 80: national handbook, from memory (DOMAIN.md)
		const ribbon = (score: number | null) =>
			computeAwards({
				classes: [{ id: 'c', divisionId: 'd', code: '1', name: 'Standards' }],
				entries: [{ id: 'e', number: 1, classId: 'c', exhibitorId: 'x', score }],
				rules: DEFAULT_AWARD_RULES
			}).awards.find((a) => a.kind === 'ribbon')?.level;
		expect(ribbon(combinePanelSheets(scale, 'mean', judges, sheets).score)).toBe('red');
		expect(ribbon(combinePanelSheets(scale, 'mean', judges, sheets, 'whole').score)).toBe('blue');
	});

	it('does not round a consensus sheet', () => {
		// 100 - 2 - 2 - 2 - 1 - 3.5 = 89.5, used as written
		const consensus = [sheet(null, [2, 2, 2, 1, 3.5])];
		expect(combinePanelSheets(scale, 'consensus', [], consensus, 'whole').score).toBe(89.5);
	});
});

describe('combinePanelSheets, one consensus sheet', () => {
	it('takes the consensus sheet’s total and ignores judges’ own sheets', () => {
		const result = combinePanelSheets(
			scale,
			'consensus',
			['j1', 'j2'],
			[sheet('j1', [10, 0, 0, 0, 0]), sheet(null, [1, 0.5, 0, 0, 0])]
		);
		expect(result).toMatchObject({ state: 'scored', score: 98.5, missing: 0 });
	});

	it('waits for the consensus sheet', () => {
		expect(
			combinePanelSheets(scale, 'consensus', ['j1'], [sheet('j1', [0, 0, 0, 0, 0])])
		).toMatchObject({ state: 'waiting', missing: 1 });
	});
});

describe('panel scores into the awards engine (worked case, merit judging)', () => {
	it('gives blue to 92.8 and red to 85, best in class to the blue', () => {
		// Thresholds blue 90, red 80, white 70: national handbook, from memory (DOMAIN.md)
		const rules: AwardRules = { ...DEFAULT_AWARD_RULES };
		const high = combinePanelSheets(
			scale,
			'mean',
			['j1', 'j2', 'j3'],
			[
				sheet('j1', [2, 2, 2, 1, 0.5]),
				sheet('j2', [2, 2, 2, 1, 0]),
				sheet('j3', [2, 2, 2, 0.5, 0.5])
			]
		);
		const low = combinePanelSheets(scale, 'consensus', [], [sheet(null, [5, 5, 3, 1, 1])]);
		const result = computeAwards({
			classes: [{ id: 'c1', divisionId: 'd1', code: '1', name: 'Standards' }],
			entries: [
				{ id: 'e1', classId: 'c1', number: 1, exhibitorId: 'x1', score: high.score },
				{ id: 'e2', classId: 'c1', number: 2, exhibitorId: 'x2', score: low.score }
			],
			rules
		});
		expect(low.score).toBe(85);
		const ribbons = result.awards.filter((a) => a.kind === 'ribbon');
		expect(ribbons.map((a) => [a.entryId, a.level])).toEqual([
			['e1', 'blue'],
			['e2', 'red']
		]);
		expect(result.awards.find((a) => a.kind === 'best_in_class')?.entryId).toBe('e1');
	});
});

describe('findJudgingConflicts', () => {
	const entries = [
		{ classId: 'c10', exhibitorId: 'judge3', exhibitorHousehold: 'Birchwood' },
		{ classId: 'c4', exhibitorId: 'milo', exhibitorHousehold: ' birchwood ' },
		{ classId: 'c1', exhibitorId: 'someone', exhibitorHousehold: 'Tallis' },
		{ classId: 'c1', exhibitorId: 'other', exhibitorHousehold: null }
	];
	const people = [
		{ userId: 'judge3', household: 'Birchwood' },
		{ userId: 'judge1', household: null }
	];

	it('refuses a judge’s own class and their household’s (common practice, DOMAIN.md)', () => {
		expect(findJudgingConflicts(people, ['c1', 'c4', 'c10'], entries)).toEqual([
			{ userId: 'judge3', classId: 'c10', reason: 'own_entry' },
			{ userId: 'judge3', classId: 'c4', reason: 'household_entry' }
		]);
	});

	it('does not match people without a household to each other', () => {
		expect(findJudgingConflicts([{ userId: 'judge1', household: null }], ['c1'], entries)).toEqual(
			[]
		);
	});

	it('looks only at the classes asked about', () => {
		expect(findJudgingConflicts(people, ['c1'], entries)).toEqual([]);
	});
});
