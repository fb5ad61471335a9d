import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import {
	awardRulesFrom,
	computeAwards,
	DEFAULT_AWARD_RULES,
	describeAwardSettings,
	markOrderProblems,
	validateAwardRules,
	type Award,
	type AwardClass,
	type AwardEntry,
	type AwardInput,
	type AwardResult,
	type AwardRules
} from './awards';
import { DEFAULT_STANDARD_SCALE } from './scoring';

// Scores below are totals on the published scale of points (25/25/25/15/10 = 100):
// "A Beginner's Guide to Judging", African Violet Magazine, May/June 1993, rev. 2020 (DOMAIN.md).

/** Builds award rules from the defaults. */
function buildRules(overrides: Partial<AwardRules> = {}): AwardRules {
	return {
		...DEFAULT_AWARD_RULES,
		tieBreak: { criterionKey: null, useJudgesChoice: false },
		...overrides
	};
}

/** Builds a class in division d1. */
function buildClass(id: string, overrides: Partial<AwardClass> = {}): AwardClass {
	return { id, divisionId: 'd1', code: id.toUpperCase(), name: `Class ${id}`, ...overrides };
}

let nextNumber = 1;
/** Builds a scored entry in class a. */
function buildEntry(
	id: string,
	score: number | null,
	overrides: Partial<AwardEntry> = {}
): AwardEntry {
	return {
		id,
		number: nextNumber++,
		classId: 'a',
		exhibitorId: `x-${id}`,
		score,
		...overrides
	};
}

/** Compact view of the entry awards: "entryId:kind:level". */
function summary(
	result: AwardResult,
	kinds: Award['kind'][] = ['ribbon', 'placement', 'best_in_class']
): string[] {
	return result.awards
		.filter((a) => kinds.includes(a.kind))
		.map((a) => [a.entryId, a.kind, a.level ?? a.topAwardId ?? ''].join(':'));
}

/** Ties other than sweepstakes ties (single-entry tests tie every exhibitor on one blue). */
function entryTies(result: AwardResult): AwardResult['ties'] {
	return result.ties.filter((t) => t.kind !== 'sweepstakes');
}

describe('merit judging', () => {
	// thresholds blue 90, red 80, white 70: national handbook, from memory (DOMAIN.md)
	const rules = buildRules();
	it.each<[number, string | null]>([
		[100, 'blue'],
		[95, 'blue'],
		[90, 'blue'],
		[89.5, 'red'],
		[85, 'red'],
		[80, 'red'],
		[79.5, 'white'],
		[70, 'white'],
		[69.5, null],
		[0, null]
	])('a plant scoring %d gets %s', (score, level) => {
		const result = computeAwards({
			classes: [buildClass('a')],
			entries: [buildEntry('e', score)],
			rules
		});
		const ribbons = result.awards.filter((a) => a.kind === 'ribbon');
		expect(ribbons.map((a) => a.level ?? null)).toEqual(level ? [level] : []);
	});

	it('gives as many ribbons of each color as deserved, and best in class to the top blue', () => {
		// thresholds: national handbook, from memory (DOMAIN.md)
		const result = computeAwards({
			classes: [buildClass('a')],
			entries: [
				buildEntry('e1', 92.5),
				buildEntry('e2', 95),
				buildEntry('e3', 90),
				buildEntry('e4', 89.5),
				buildEntry('e5', 80),
				buildEntry('e6', 75),
				buildEntry('e7', 70),
				buildEntry('e8', 69.5),
				buildEntry('e9', null),
				buildEntry('e10', 99, { notJudged: true })
			],
			rules
		});
		expect(summary(result)).toEqual([
			'e2:ribbon:blue',
			'e1:ribbon:blue',
			'e3:ribbon:blue',
			'e4:ribbon:red',
			'e5:ribbon:red',
			'e6:ribbon:white',
			'e7:ribbon:white',
			'e2:best_in_class:'
		]);
		expect(entryTies(result)).toEqual([]);
	});

	it('writes plain reasons', () => {
		// thresholds: national handbook, from memory (DOMAIN.md)
		const result = computeAwards({
			classes: [buildClass('a', { code: '12' })],
			entries: [buildEntry('e1', 92.5), buildEntry('e2', 85), buildEntry('e3', 91)],
			rules
		});
		expect(result.awards.filter((a) => a.kind !== 'sweepstakes').map((a) => a.reason)).toEqual([
			'Scored 92.5, at or above the blue ribbon mark of 90.',
			'Scored 91, at or above the blue ribbon mark of 90.',
			'Scored 85, at or above the red ribbon mark of 80 and below the blue ribbon mark of 90.',
			'The highest score (92.5) among the 2 blue-ribbon entries in class 12.'
		]);
	});

	it('chooses best in class only among blue-ribbon plants', () => {
		// society judging pages (DOMAIN.md); blue mark 90: national handbook, from memory (DOMAIN.md)
		const result = computeAwards({
			classes: [buildClass('a')],
			entries: [buildEntry('e1', 89.5), buildEntry('e2', 85)],
			rules
		});
		expect(result.awards.filter((a) => a.kind === 'best_in_class')).toEqual([]);
		expect(entryTies(result)).toEqual([]);
	});

	it('uses the show’s own ribbon marks', () => {
		// a secondary source gives red 70–89 (DOMAIN.md), so marks are a per-show setting
		const own = buildRules({ merit: { blue: 90, red: 70, white: 60 } });
		const result = computeAwards({
			classes: [buildClass('a')],
			entries: [buildEntry('e1', 75), buildEntry('e2', 65)],
			rules: own
		});
		expect(summary(result)).toEqual(['e1:ribbon:red', 'e2:ribbon:white']);
	});

	it('applies an extra best-in-class minimum', () => {
		const result = computeAwards({
			classes: [buildClass('a')],
			entries: [buildEntry('e1', 93)],
			rules: buildRules({ bestInClassMin: 95 })
		});
		expect(summary(result)).toEqual(['e1:ribbon:blue']);
	});
});

describe('tie-breaks for best in class', () => {
	const classes = [buildClass('a', { code: '4' })];
	it.each<
		[string, AwardRules['tieBreak'], Partial<AwardEntry>, Partial<AwardEntry>, string | null]
	>([
		['no tie-break: tie reported', { criterionKey: null, useJudgesChoice: false }, {}, {}, null],
		[
			'named criterion decides',
			{ criterionKey: 'condition', useJudgesChoice: true },
			{ criterionScores: { condition: 24 }, judgesChoiceRank: 1 },
			{ criterionScores: { condition: 24.5 }, judgesChoiceRank: 2 },
			't2'
		],
		[
			'criterion equal, judges’ choice decides (lower rank preferred)',
			{ criterionKey: 'condition', useJudgesChoice: true },
			{ criterionScores: { condition: 24 }, judgesChoiceRank: 1 },
			{ criterionScores: { condition: 24 }, judgesChoiceRank: 2 },
			't1'
		],
		[
			'judges’ choice not used by the show: tie reported',
			{ criterionKey: 'condition', useJudgesChoice: false },
			{ criterionScores: { condition: 24 }, judgesChoiceRank: 1 },
			{ criterionScores: { condition: 24 }, judgesChoiceRank: 2 },
			null
		],
		[
			'an entry without the criterion ranks below one with it',
			{ criterionKey: 'condition', useJudgesChoice: false },
			{},
			{ criterionScores: { condition: 20 } },
			't2'
		],
		[
			'a ranked entry ranks above an unranked one',
			{ criterionKey: null, useJudgesChoice: true },
			{ judgesChoiceRank: null },
			{ judgesChoiceRank: 3 },
			't2'
		],
		[
			'equal judges’ choice: tie reported',
			{ criterionKey: null, useJudgesChoice: true },
			{ judgesChoiceRank: 1 },
			{ judgesChoiceRank: 1 },
			null
		]
	])('%s', (_name, tieBreak, first, second, winner) => {
		const result = computeAwards({
			classes,
			entries: [buildEntry('t1', 93, first), buildEntry('t2', 93, second), buildEntry('t3', 91)],
			rules: buildRules({ tieBreak }),
			scale: DEFAULT_STANDARD_SCALE
		});
		const best = result.awards.filter((a) => a.kind === 'best_in_class');
		if (winner) {
			expect(best.map((a) => a.entryId)).toEqual([winner]);
			expect(entryTies(result)).toEqual([]);
		} else {
			expect(best).toEqual([]);
			expect(entryTies(result)).toHaveLength(1);
			expect(entryTies(result)[0]).toMatchObject({
				kind: 'best_in_class',
				classId: 'a',
				entryIds: ['t1', 't2']
			});
		}
		// ribbons do not depend on ties
		expect(result.awards.filter((a) => a.kind === 'ribbon')).toHaveLength(3);
	});

	it('says how a tie was broken', () => {
		const result = computeAwards({
			classes,
			entries: [
				buildEntry('t1', 93, { number: 101, criterionScores: { condition: 24.5 } }),
				buildEntry('t2', 93, { number: 102, criterionScores: { condition: 24 } })
			],
			rules: buildRules({ tieBreak: { criterionKey: 'condition', useJudgesChoice: true } }),
			scale: DEFAULT_STANDARD_SCALE
		});
		expect(result.awards.find((a) => a.kind === 'best_in_class')?.reason).toBe(
			'The highest score (93) among the 2 blue-ribbon entries in class 4. It ranks ahead of entry 102, also on 93, on condition points (24.5 to 24).'
		);
	});

	it('explains an unbroken tie', () => {
		const result = computeAwards({
			classes,
			entries: [buildEntry('t1', 93, { number: 7 }), buildEntry('t2', 93, { number: 3 })],
			rules: buildRules({ tieBreak: { criterionKey: null, useJudgesChoice: true } })
		});
		expect(entryTies(result)[0].reason).toBe(
			"Entries 3 and 7 in class 4 are tied for best in class on 93, and the tie-break (the judges' choice) does not separate them; best in class is not given until the judges decide."
		);
	});
});

describe('placement judging', () => {
	const placement = { first: 90, second: 85, third: 80, honourable: 75 };
	const rules = buildRules({ system: 'placement', placement });
	const classes = [buildClass('a')];

	it.each<[string, [string, number][], string[], string[][]]>([
		[
			'one of each place, in score order',
			[
				['p1', 91],
				['p2', 96],
				['p3', 88],
				['p4', 93],
				['p5', 85]
			],
			[
				'p2:placement:first',
				'p4:placement:second',
				'p1:placement:third',
				'p3:placement:honourable',
				'p2:best_in_class:'
			],
			[]
		],
		[
			'best below the first-place minimum: no first, no best in class',
			[
				['p1', 87],
				['p2', 86],
				['p3', 70]
			],
			['p1:placement:second', 'p2:placement:third'],
			[]
		],
		[
			'a place nobody reaches is skipped, lower places still given',
			[
				['p1', 95],
				['p2', 82],
				['p3', 81]
			],
			['p1:placement:first', 'p2:placement:third', 'p3:placement:honourable', 'p1:best_in_class:'],
			[]
		],
		[
			'tie for first holds first and second open; the next plant is third',
			[
				['p1', 94],
				['p2', 94],
				['p3', 90]
			],
			['p3:placement:third'],
			[
				['placement', 'p1,p2', 'first,second'],
				['best_in_class', 'p1,p2', '']
			]
		],
		[
			'tie for the last place',
			[
				['p1', 95],
				['p2', 92],
				['p3', 88],
				['p4', 80],
				['p5', 80]
			],
			['p1:placement:first', 'p2:placement:second', 'p3:placement:third', 'p1:best_in_class:'],
			[['placement', 'p4,p5', 'honourable']]
		]
	])('%s', (_name, scores, expected, expectedTies) => {
		const result = computeAwards({
			classes,
			entries: scores.map(([id, score]) => buildEntry(id, score)),
			rules
		});
		expect(summary(result)).toEqual(expected);
		expect(
			entryTies(result).map((t) => [
				t.kind,
				(t.entryIds ?? []).join(','),
				(t.levels ?? []).join(',')
			])
		).toEqual(expectedTies);
	});

	it('breaks a tie for first with the judges’ choice', () => {
		const result = computeAwards({
			classes,
			entries: [
				buildEntry('p1', 94, { judgesChoiceRank: 2 }),
				buildEntry('p2', 94, { judgesChoiceRank: 1 })
			],
			rules: buildRules({
				system: 'placement',
				placement,
				tieBreak: { criterionKey: null, useJudgesChoice: true }
			})
		});
		expect(summary(result)).toEqual([
			'p2:placement:first',
			'p1:placement:second',
			'p2:best_in_class:'
		]);
		expect(entryTies(result)).toEqual([]);
	});

	it('writes plain reasons', () => {
		const result = computeAwards({
			classes: [buildClass('a', { code: '7' })],
			entries: [buildEntry('p1', 87), buildEntry('p2', 86)],
			rules
		});
		expect(result.awards.filter((a) => a.kind !== 'sweepstakes').map((a) => a.reason)).toEqual([
			'Scored 87, ranked 1st of 2 judged entries in class 7, and at or above the second place minimum of 85 (below the first place minimum of 90).',
			'Scored 86, ranked 2nd of 2 judged entries in class 7, and at or above the third place minimum of 80.'
		]);
	});
});

describe('honorable mentions under placement judging', () => {
	// Place minimums 90/85/80/75 are this file's placement values (our own, not published).
	// Sources for the choices: one mention per class is common practice (and today's default);
	// several, growing with the entries, are given in the "Awards Table" of the Cranbury Digital
	// Camera Club's "Results" page (2 honorable mentions for 10-12 entries); mentions "at the
	// judges' discretion" to any entry worth one are described on the "Awards" page of the
	// Garden Club of Houston's "Graffiti" flower show, 2021.
	const placement = { first: 90, second: 85, third: 80, honourable: 75 };
	const classes = [buildClass('a')];
	const scores: [string, number][] = [
		['p1', 95],
		['p2', 92],
		['p3', 88],
		['p4', 86],
		['p5', 84],
		['p6', 80],
		['p7', 78],
		['p8', 70]
	];
	const mentions = (
		honorableMentions: AwardRules['honorableMentions'],
		list: [string, number][] = scores
	) => {
		const result = computeAwards({
			classes,
			entries: list.map(([id, score]) => buildEntry(id, score)),
			rules: buildRules({ system: 'placement', placement, honorableMentions })
		});
		return {
			given: result.awards
				.filter((a) => a.level === 'honourable')
				.map((a) => a.entryId)
				.join(','),
			ties: entryTies(result).map((t) => `${(t.entryIds ?? []).join(',')}:${t.levels}`),
			result
		};
	};

	it.each<[string, AwardRules['honorableMentions'], string]>([
		// p1-p3 take first to third; p4 (86), p5 (84), p6 (80), p7 (78) reach 75; p8 (70) does not
		['one: the next entry only', { rule: 'one', count: 1 }, 'p4'],
		['up to 3: the next three', { rule: 'number', count: 3 }, 'p4,p5,p6'],
		['up to 10: only the four that reach 75', { rule: 'number', count: 10 }, 'p4,p5,p6,p7'],
		['every entry reaching the minimum', { rule: 'all', count: 1 }, 'p4,p5,p6,p7']
	])('%s', (_name, rule, expected) => {
		const { given, ties, result } = mentions(rule);
		expect(given).toBe(expected);
		expect(ties).toEqual([]);
		// first, second and third stay one each
		expect(
			result.awards.filter((a) => a.kind === 'placement' && a.level !== 'honourable')
		).toHaveLength(3);
	});

	it('gives every tied entry a mention when enough are left, and holds them open when not', () => {
		const tied: [string, number][] = [
			['p1', 95],
			['p2', 92],
			['p3', 88],
			['p4', 86],
			['p5', 84],
			['p6', 84]
		];
		// up to 2: p4 takes one, p5 and p6 tie on 84 for the last one
		expect(mentions({ rule: 'number', count: 2 }, tied)).toMatchObject({
			given: 'p4',
			ties: ['p5,p6:honourable']
		});
		// up to 3, or every entry: mentions are equal, so both tied entries get one
		expect(mentions({ rule: 'number', count: 3 }, tied)).toMatchObject({
			given: 'p4,p5,p6',
			ties: []
		});
		expect(mentions({ rule: 'all', count: 1 }, tied)).toMatchObject({
			given: 'p4,p5,p6',
			ties: []
		});
	});

	it('explains a mention shared by tied entries', () => {
		const entries = [
			buildEntry('q1', 95),
			buildEntry('q2', 84, { number: 12 }),
			buildEntry('q3', 84, { number: 15 })
		];
		const result = computeAwards({
			classes: [buildClass('a', { code: '7' })],
			entries,
			rules: buildRules({
				system: 'placement',
				placement,
				honorableMentions: { rule: 'all', count: 1 }
			})
		});
		// q1 first; q2 and q3 (84) below second's 85, so one would be third: a tie holds open
		// third place and one honorable mention
		expect(entryTies(result).map((t) => t.reason)).toEqual([
			'Entries 12 and 15 in class 7 are tied on 84, and the show sets no tie-break; third place and honorable mention are held open until the judges decide.'
		]);
		const four = computeAwards({
			classes: [buildClass('a', { code: '7' })],
			entries: [
				buildEntry('r1', 95),
				buildEntry('r2', 92),
				buildEntry('r3', 88),
				buildEntry('r4', 84, { number: 12 }),
				buildEntry('r5', 84, { number: 15 })
			],
			rules: buildRules({
				system: 'placement',
				placement,
				honorableMentions: { rule: 'all', count: 1 }
			})
		});
		expect(four.awards.find((a) => a.entryId === 'r4')?.reason).toBe(
			'Scored 84, ranked 4th of 5 judged entries in class 7 (level with entry 15), and at or above the honorable mention minimum of 75; each of them gets one.'
		);
	});

	it('counts every mention in the sweepstakes', () => {
		const result = computeAwards({
			classes,
			entries: scores.slice(0, 5).map(([id, score]) => buildEntry(id, score, { exhibitorId: 'x' })),
			rules: buildRules({
				system: 'placement',
				placement,
				honorableMentions: { rule: 'all', count: 1 }
			})
		});
		// 95 first, 92 second, 88 third, 86 and 84 honorable mentions
		expect(result.sweepstakes[0].standings[0]).toMatchObject({
			first: 1,
			second: 1,
			third: 1,
			honourable: 2
		});
	});
});

describe('top awards', () => {
	const classes = [buildClass('a'), buildClass('b'), buildClass('c'), buildClass('t')];
	const bestInShow = { id: 'bis', name: 'Best in show', classIds: ['a', 'b', 'c'], minScore: 94 };
	const bestTrailer = { id: 'trl', name: 'Best trailer', classIds: ['t'], minScore: 90 };

	it.each<[string, AwardEntry[], string[], string[]]>([
		[
			'highest best-in-class entry wins; a higher non-best plant does not compete',
			[
				buildEntry('a1', 95, { classId: 'a' }),
				buildEntry('a2', 94.5, { classId: 'a' }),
				buildEntry('b1', 97, { classId: 'b' }),
				buildEntry('c1', 93, { classId: 'c' }),
				buildEntry('t1', 91, { classId: 't' })
			],
			['b1:top_award:bis', 't1:top_award:trl'],
			[]
		],
		[
			'below the minimum: not given',
			[buildEntry('a1', 93.5, { classId: 'a' }), buildEntry('t1', 89, { classId: 't' })],
			[],
			[]
		],
		[
			'tie between best-in-class entries of two classes',
			[buildEntry('a1', 96, { classId: 'a' }), buildEntry('b1', 96, { classId: 'b' })],
			[],
			['top_award:bis:a1,b1']
		],
		[
			'waits while a best-in-class tie could win it',
			[
				buildEntry('a1', 97, { classId: 'a' }),
				buildEntry('a2', 97, { classId: 'a' }),
				buildEntry('b1', 96, { classId: 'b' })
			],
			[],
			['best_in_class:a:a1,a2', 'top_award:bis:a1,a2']
		],
		[
			'a best-in-class tie below the leader does not hold it up',
			[
				buildEntry('a1', 95, { classId: 'a' }),
				buildEntry('a2', 95, { classId: 'a' }),
				buildEntry('b1', 96, { classId: 'b' })
			],
			['b1:top_award:bis'],
			['best_in_class:a:a1,a2']
		]
	])('%s', (_name, entries, expected, expectedTies) => {
		const result = computeAwards({
			classes,
			entries,
			rules: buildRules({ topAwards: [bestTrailer, bestInShow] })
		});
		expect(summary(result, ['top_award'])).toEqual(expected);
		expect(
			entryTies(result).map((t) =>
				[t.kind, t.topAwardId ?? t.classId, (t.entryIds ?? []).join(',')].join(':')
			)
		).toEqual(expectedTies);
	});

	it('lets one plant win several top awards and explains the choice', () => {
		const result = computeAwards({
			classes,
			entries: [buildEntry('a1', 96, { classId: 'a' }), buildEntry('b1', 95, { classId: 'b' })],
			rules: buildRules({
				topAwards: [bestInShow, { id: 'std', name: 'Best standard', classIds: ['a'], minScore: 90 }]
			})
		});
		const tops = result.awards.filter((a) => a.kind === 'top_award');
		expect(tops.map((a) => `${a.entryId}:${a.topAwardId}`)).toEqual(['a1:bis', 'a1:std']);
		expect(tops[0].reason).toBe(
			'Best in show: the highest score (96) among the 2 eligible best-in-class entries, at or above the minimum of 94.'
		);
	});
});

describe('one top award per plant', () => {
	// "A plant takes only one top award" is a show rule some societies set: common practice
	// (from memory; no published schedule found stating it). The scores are invented totals on
	// the published scale; the top award minimums are this file's values.
	const classes = [buildClass('a'), buildClass('b'), buildClass('c')];
	const bestInShow = { id: 'bis', name: 'Best in show', classIds: ['a', 'b', 'c'], minScore: 94 };
	const bestStandard = { id: 'std', name: 'Best standard', classIds: ['a', 'b'], minScore: 90 };
	const run = (
		entries: AwardEntry[],
		topAwardsPerPlant: AwardRules['topAwardsPerPlant'],
		topAwards = [bestInShow, bestStandard]
	) => {
		const result = computeAwards({
			classes,
			entries,
			rules: buildRules({ topAwards, topAwardsPerPlant })
		});
		return {
			result,
			won: summary(result, ['top_award']),
			ties: entryTies(result)
				.filter((t) => t.kind === 'top_award')
				.map((t) => `${t.topAwardId}:${(t.entryIds ?? []).join(',')}`)
		};
	};

	it('several (today): a1 on 96 takes both; one per plant: b1 on 95 takes best standard', () => {
		const entries = () => [
			buildEntry('a1', 96, { classId: 'a' }),
			buildEntry('b1', 95, { classId: 'b', number: 41 })
		];
		expect(run(entries(), 'several').won).toEqual(['a1:top_award:bis', 'a1:top_award:std']);
		const one = run(entries(), 'one');
		expect(one.won).toEqual(['a1:top_award:bis', 'b1:top_award:std']);
		expect(one.result.awards.find((a) => a.topAwardId === 'std')?.reason).toMatch(
			/^Best standard: the only eligible best-in-class entry, with 95, .* Entry \d+ scores higher but already holds a top award \(Best in show\), and a plant takes only one at this show\.$/
		);
	});

	it('decides in the listed order: listed first, best standard goes to a1 and best in show to b1', () => {
		const entries = [
			buildEntry('a1', 96, { classId: 'a' }),
			buildEntry('b1', 95, { classId: 'b' })
		];
		expect(run(entries, 'one', [bestStandard, bestInShow]).won).toEqual([
			'a1:top_award:std',
			'b1:top_award:bis'
		]);
	});

	it('gives nothing when the only eligible plant already holds one', () => {
		const onlyA = { id: 'bsa', name: 'Best in class A group', classIds: ['a'], minScore: 90 };
		const entries = [
			buildEntry('a1', 96, { classId: 'a' }),
			buildEntry('a2', 95, { classId: 'a' })
		];
		// a2 is not best in class, so it cannot compete
		expect(run(entries, 'one', [bestInShow, onlyA])).toMatchObject({
			won: ['a1:top_award:bis'],
			ties: []
		});
	});

	it('waits while the leader may still win an earlier top award that is tied', () => {
		const entries = [
			buildEntry('a1', 96, { classId: 'a' }),
			buildEntry('b1', 96, { classId: 'b' }),
			buildEntry('c1', 91, { classId: 'c' })
		];
		// best in show: a1 and b1 tied; best standard (a, b) cannot be given before that is decided
		expect(run(entries, 'one')).toMatchObject({
			won: [],
			ties: ['bis:a1,b1', 'std:a1,b1']
		});
		expect(
			entryTies(
				computeAwards({
					classes,
					entries: [
						buildEntry('a1', 96, { classId: 'a', number: 21 }),
						buildEntry('b1', 96, { classId: 'b', number: 22 })
					],
					rules: buildRules({ topAwards: [bestInShow, bestStandard], topAwardsPerPlant: 'one' })
				})
			).find((t) => t.topAwardId === 'std')?.reason
		).toBe(
			'Best standard is not given yet: entry 21 leads it but may still win Best in show, and a plant takes only one top award at this show.'
		);
		// with several per plant best standard is tied the same way, independently
		expect(run(entries, 'several').ties).toEqual(['bis:a1,b1', 'std:a1,b1']);
		const third = { id: 'bc', name: 'Best of class C', classIds: ['c'], minScore: 90 };
		// a top award none of the undecided plants can lead is still given
		expect(run(entries, 'one', [bestInShow, bestStandard, third]).won).toEqual(['c1:top_award:bc']);
	});
});

describe('sweepstakes', () => {
	/** Makes `count` entries for an exhibitor at a score, spread over classes c0..c4. */
	function entriesFor(
		exhibitorId: string,
		count: number,
		score: number,
		divisionId = 'd1'
	): AwardEntry[] {
		return Array.from({ length: count }, (_, i) =>
			buildEntry(`${exhibitorId}-${score}-${i}`, score, {
				exhibitorId,
				classId: `${divisionId}-c${i % 5}`
			})
		);
	}
	const classesOf = (divisionId: string): AwardClass[] =>
		Array.from({ length: 5 }, (_, i) => buildClass(`${divisionId}-c${i}`, { divisionId }));
	const classes = [...classesOf('d1'), ...classesOf('d2')];

	it('goes to the exhibitor with the most blue ribbons', () => {
		// published show results, 2012 joint convention: 49 vs 27 blue ribbons (DOMAIN.md)
		const result = computeAwards({
			classes,
			entries: [
				...entriesFor('ann', 49, 92),
				...entriesFor('bob', 27, 95),
				...entriesFor('bob', 30, 85)
			],
			rules: buildRules()
		});
		const d1 = result.sweepstakes.find((s) => s.divisionId === 'd1');
		expect(d1?.winners).toEqual(['ann']);
		expect(d1?.standings.map((s) => [s.exhibitorId, s.blue, s.red, s.white])).toEqual([
			['ann', 49, 0, 0],
			['bob', 27, 30, 0]
		]);
		expect(result.awards.filter((a) => a.kind === 'sweepstakes')).toEqual([
			{
				kind: 'sweepstakes',
				divisionId: 'd1',
				exhibitorId: 'ann',
				reason: 'The most blue ribbons in the division (49).'
			}
		]);
		expect(result.sweepstakes.find((s) => s.divisionId === 'd2')).toEqual({
			divisionId: 'd2',
			standings: [],
			winners: []
		});
	});

	it('reports a tie as a tie and shares it', () => {
		// published show results, 2012 joint convention: a tie at 8 blue ribbons (DOMAIN.md)
		const result = computeAwards({
			classes,
			entries: [
				...entriesFor('cat', 8, 91),
				...entriesFor('dan', 8, 93),
				...entriesFor('dan', 2, 82),
				...entriesFor('eve', 5, 96)
			],
			rules: buildRules()
		});
		expect(result.sweepstakes[0].winners).toEqual(['cat', 'dan']);
		expect(result.ties.filter((t) => t.kind === 'sweepstakes')).toEqual([
			{
				kind: 'sweepstakes',
				divisionId: 'd1',
				exhibitorIds: ['cat', 'dan'],
				reason:
					'2 exhibitors are tied for the sweepstakes in this division with 8 blue ribbons each, and the show sets no tie-break; the sweepstakes is shared.'
			}
		]);
		expect(result.awards.filter((a) => a.kind === 'sweepstakes').map((a) => a.exhibitorId)).toEqual(
			['cat', 'dan']
		);
	});

	it.each<[AwardRules['sweepstakesTieBreak'], string[]]>([
		['none', ['cat', 'dan']],
		['most_red', ['dan']],
		['highest_total', ['cat']]
	])('tie-break %s', (sweepstakesTieBreak, winners) => {
		// a tie at 8 blue ribbons, as in the 2012 joint convention results (DOMAIN.md)
		const result = computeAwards({
			classes,
			entries: [
				...entriesFor('cat', 8, 100),
				...entriesFor('cat', 1, 70),
				...entriesFor('dan', 8, 90),
				...entriesFor('dan', 1, 80)
			],
			rules: buildRules({ sweepstakesTieBreak })
		});
		expect(result.sweepstakes[0].winners).toEqual(winners);
		expect(result.ties.filter((t) => t.kind === 'sweepstakes')).toHaveLength(
			winners.length > 1 ? 1 : 0
		);
	});

	it('counts first places under placement judging, per division', () => {
		const result = computeAwards({
			classes,
			entries: [
				...entriesFor('fay', 3, 95, 'd2'),
				...entriesFor('gus', 3, 91, 'd2'),
				...entriesFor('gus', 1, 97, 'd2').map((e) => ({ ...e, classId: 'd2-c4' }))
			],
			rules: buildRules({
				system: 'placement',
				placement: { first: 90, second: 85, third: 80, honourable: 75 }
			})
		});
		const d2 = result.sweepstakes.find((s) => s.divisionId === 'd2');
		expect(d2?.standings.map((s) => [s.exhibitorId, s.first, s.second])).toEqual([
			['fay', 3, 0],
			['gus', 1, 3]
		]);
		expect(d2?.winners).toEqual(['fay']);
		expect(result.awards.find((a) => a.kind === 'sweepstakes')?.reason).toBe(
			'The most first places in the division (3).'
		);
	});

	it('has no winner when nobody won a blue ribbon', () => {
		const result = computeAwards({
			classes,
			entries: entriesFor('hal', 3, 85),
			rules: buildRules()
		});
		expect(result.sweepstakes[0].winners).toEqual([]);
		expect(result.awards.filter((a) => a.kind === 'sweepstakes')).toEqual([]);
	});
});

describe('input', () => {
	it.each<[string, AwardInput]>([
		[
			'duplicate entry ids',
			{
				classes: [buildClass('a')],
				entries: [buildEntry('e', 90), buildEntry('e', 91)],
				rules: buildRules()
			}
		],
		[
			'an entry in an unknown class',
			{
				classes: [buildClass('a')],
				entries: [buildEntry('e', 90, { classId: 'z' })],
				rules: buildRules()
			}
		],
		[
			'duplicate class ids',
			{ classes: [buildClass('a'), buildClass('a')], entries: [], rules: buildRules() }
		],
		[
			'a NaN score',
			{ classes: [buildClass('a')], entries: [buildEntry('e', Number.NaN)], rules: buildRules() }
		]
	])('rejects %s', (_name, input) => {
		expect(() => computeAwards(input)).toThrow();
	});

	it('fills settings missing from stored rules with today’s behavior', () => {
		const old = { system: 'placement', merit: { blue: 92 } };
		const read = awardRulesFrom(old);
		expect(read).toMatchObject({
			system: 'placement',
			merit: { blue: 92, red: 80, white: 70 },
			honorableMentions: { rule: 'one', count: 1 },
			meanRounding: 'tenth',
			topAwardsPerPlant: 'several'
		});
		expect(awardRulesFrom(null)).toEqual({ ...DEFAULT_AWARD_RULES, topAwards: [] });
		expect(
			awardRulesFrom({ honorableMentions: { rule: 'number', count: 4 } }).honorableMentions
		).toEqual({ rule: 'number', count: 4 });
	});

	it('describes the settings in use', () => {
		expect(describeAwardSettings(DEFAULT_AWARD_RULES, 'mean')).toEqual([
			'Panel score: mean of the judges, half up to one decimal',
			'Top awards: a plant may take several'
		]);
		const set = buildRules({
			system: 'placement',
			honorableMentions: { rule: 'number', count: 3 },
			meanRounding: 'whole',
			topAwardsPerPlant: 'one'
		});
		expect(describeAwardSettings(set, 'mean')).toEqual([
			'Honorable mentions: up to 3 per class',
			'Panel score: mean of the judges, half up to whole points',
			'Top awards: one per plant, in the order listed'
		]);
		expect(describeAwardSettings(set, 'consensus')[1]).toBe(
			'Panel score: one consensus sheet, as written'
		);
	});

	it.each<[string, Partial<AwardRules>, string[]]>([
		[
			'an unknown mention rule',
			{ honorableMentions: { rule: 'many' as 'one', count: 1 } },
			['honorableMentions.rule']
		],
		[
			'no mentions',
			{ honorableMentions: { rule: 'number', count: 0 } },
			['honorableMentions.count']
		],
		[
			'a negative count',
			{ honorableMentions: { rule: 'number', count: -2 } },
			['honorableMentions.count']
		],
		[
			'a part count',
			{ honorableMentions: { rule: 'number', count: 2.5 } },
			['honorableMentions.count']
		],
		[
			'a huge count',
			{ honorableMentions: { rule: 'number', count: 1e9 } },
			['honorableMentions.count']
		],
		['an unknown rounding', { meanRounding: 'even' as 'tenth' }, ['meanRounding']],
		['an unknown top award rule', { topAwardsPerPlant: 'two' as 'one' }, ['topAwardsPerPlant']]
	])('refuses %s', (_name, overrides, fields) => {
		expect(validateAwardRules(buildRules(overrides)).map((p) => p.field)).toEqual(fields);
	});

	it('validates award rules', () => {
		// defaults: national handbook, from memory (DOMAIN.md)
		expect(validateAwardRules(DEFAULT_AWARD_RULES)).toEqual([]);
		const bad = buildRules({
			merit: { blue: 80, red: 85, white: 70 },
			placement: { first: 90, second: 85, third: Number.NaN, honourable: 75 },
			bestInClassMin: Number.POSITIVE_INFINITY,
			topAwards: [
				{ id: 'x', name: 'Best in show', classIds: [], minScore: 90 },
				{ id: 'x', name: 'Best trailer', classIds: ['t'], minScore: 90 }
			]
		});
		expect(validateAwardRules(bad).map((p) => p.field)).toEqual([
			'merit.red',
			'placement.third',
			'bestInClassMin',
			'topAwards.0.classIds',
			'topAwards.1.id'
		]);
	});
});

describe('the order of the marks', () => {
	// Merit ribbons 90 / 80 / 70 and place minimums: national handbook, from memory (DOMAIN.md).
	const marks = (merit: number[], placement: number[]) => ({
		merit: { blue: merit[0], red: merit[1], white: merit[2] },
		placement: {
			first: placement[0],
			second: placement[1],
			third: placement[2],
			honourable: placement[3]
		}
	});
	it.each([
		['the usual marks', [90, 80, 70], [90, 85, 80, 75], []],
		['equal place minimums', [90, 80, 70], [80, 80, 80, 80], []],
		['a red mark above blue', [90, 95, 70], [90, 85, 80, 75], ['merit.red']],
		[
			'a red mark equal to blue (red could never be given)',
			[90, 90, 70],
			[90, 85, 80, 75],
			['merit.red']
		],
		['a white mark above red', [90, 80, 85], [90, 85, 80, 75], ['merit.white']],
		['a third place minimum above second', [90, 80, 70], [90, 80, 85, 75], ['placement.third']],
		['a mark that is no number', [90, Number.NaN, 70], [90, 85, 80, 75], ['merit.red']]
	])('%s', (_name, merit, placement, fields) => {
		expect(markOrderProblems(marks(merit, placement)).map((p) => p.field)).toEqual(fields);
	});
	it('says the same words on every page', () => {
		expect(markOrderProblems(marks([90, 95, 70], [90, 95, 80, 75])).map((p) => p.message)).toEqual([
			'The ribbon marks must fall from blue to red to white.',
			'The place minimums must not rise from first place down.'
		]);
	});
});

/** A random show: few score values so that ties are common. */
const showArbitrary = fc
	.record({
		system: fc.constantFrom<AwardRules['system']>('merit', 'placement'),
		criterionKey: fc.constantFrom<string | null>(null, 'condition'),
		useJudgesChoice: fc.boolean(),
		sweepstakesTieBreak: fc.constantFrom<AwardRules['sweepstakesTieBreak']>(
			'none',
			'most_red',
			'highest_total'
		),
		honorableMentions: fc.record({
			rule: fc.constantFrom<AwardRules['honorableMentions']['rule']>('one', 'number', 'all'),
			count: fc.integer({ min: 1, max: 4 })
		}),
		topAwardsPerPlant: fc.constantFrom<AwardRules['topAwardsPerPlant']>('several', 'one'),
		entries: fc.array(
			fc.record({
				classIndex: fc.nat(5),
				exhibitor: fc.nat(4),
				score: fc.option(fc.constantFrom(75, 85, 90, 92.5, 95, 96), { nil: null }),
				notJudged: fc.boolean(),
				condition: fc.option(fc.constantFrom(23, 24, 25), { nil: undefined }),
				choice: fc.option(fc.constantFrom(1, 2), { nil: null })
			}),
			{ maxLength: 40 }
		)
	})
	.map((show): AwardInput => {
		const classes = Array.from({ length: 6 }, (_, i) =>
			buildClass(`k${i}`, { divisionId: i < 3 ? 'd1' : 'd2', code: String(i + 1) })
		);
		return {
			classes,
			entries: show.entries.map((e, i) => ({
				id: `e${i}`,
				number: 100 + i,
				classId: `k${e.classIndex}`,
				exhibitorId: `x${e.exhibitor}`,
				score: e.score,
				notJudged: e.notJudged && e.score !== null && e.classIndex === 0,
				criterionScores: e.condition === undefined ? undefined : { condition: e.condition },
				judgesChoiceRank: e.choice
			})),
			rules: {
				...DEFAULT_AWARD_RULES,
				system: show.system,
				placement: { first: 90, second: 85, third: 80, honourable: 75 },
				tieBreak: { criterionKey: show.criterionKey, useJudgesChoice: show.useJudgesChoice },
				sweepstakesTieBreak: show.sweepstakesTieBreak,
				honorableMentions: show.honorableMentions,
				topAwardsPerPlant: show.topAwardsPerPlant,
				topAwards: [
					{
						id: 'bis',
						name: 'Best in show',
						classIds: ['k0', 'k1', 'k2', 'k3', 'k4', 'k5'],
						minScore: 90
					},
					{ id: 'b2', name: 'Best in division 2', classIds: ['k5', 'k4', 'k3'], minScore: 95 }
				]
			}
		};
	});

describe('determinism and invariants', () => {
	it('gives the same result whatever the order of the input arrays (top awards: when several per plant)', () => {
		fc.assert(
			fc.property(
				showArbitrary.chain((input) =>
					fc.tuple(
						fc.constant(input),
						fc.shuffledSubarray(input.classes, { minLength: input.classes.length }),
						fc.shuffledSubarray(input.entries, { minLength: input.entries.length }),
						fc.shuffledSubarray(input.rules.topAwards, { minLength: input.rules.topAwards.length })
					)
				),
				([input, classes, entries, topAwards]) => {
					// Under one top award per plant the listed order is the order of precedence.
					const shuffled: AwardInput = {
						classes,
						entries,
						rules: {
							...input.rules,
							topAwards: input.rules.topAwardsPerPlant === 'one' ? input.rules.topAwards : topAwards
						}
					};
					expect(computeAwards(shuffled)).toEqual(computeAwards(input));
				}
			),
			{ numRuns: 300 }
		);
	});

	it('gives nothing to unjudged or unscored entries, and best in class only to a top ribbon', () => {
		fc.assert(
			fc.property(showArbitrary, (input) => {
				const result = computeAwards(input);
				const byId = new Map(input.entries.map((e) => [e.id, e]));
				const topLevel = input.rules.system === 'merit' ? 'blue' : 'first';
				const topIds = new Set(
					result.awards.filter((a) => a.level === topLevel).map((a) => a.entryId)
				);
				for (const award of result.awards) {
					if (award.entryId === undefined) continue;
					const entry = byId.get(award.entryId) as AwardEntry;
					expect(entry.notJudged).toBeFalsy();
					expect(entry.score).not.toBeNull();
					if (award.kind === 'best_in_class') expect(topIds.has(award.entryId)).toBe(true);
				}
				if (input.rules.system === 'merit') {
					const judged = input.entries.filter(
						(e) => !e.notJudged && e.score !== null && e.score >= input.rules.merit.white
					);
					expect(result.awards.filter((a) => a.kind === 'ribbon')).toHaveLength(judged.length);
				} else {
					const seen = new Map<string, number>();
					const hm = input.rules.honorableMentions;
					const mentionLimit = hm.rule === 'one' ? 1 : hm.rule === 'number' ? hm.count : Infinity;
					for (const a of result.awards.filter((x) => x.kind === 'placement')) {
						const key = `${a.classId}:${a.level}`;
						seen.set(key, (seen.get(key) ?? 0) + 1);
						expect(seen.get(key)).toBeLessThanOrEqual(a.level === 'honourable' ? mentionLimit : 1);
						if (a.level === 'honourable') {
							expect(a.score).toBeGreaterThanOrEqual(input.rules.placement.honourable);
						}
					}
				}
				if (input.rules.topAwardsPerPlant === 'one') {
					const tops = result.awards.filter((a) => a.kind === 'top_award').map((a) => a.entryId);
					expect(new Set(tops).size).toBe(tops.length);
				}
			}),
			{ numRuns: 300 }
		);
	});
});

describe('size', () => {
	it('computes 2,000 entries in 60 classes', () => {
		const classes = Array.from({ length: 60 }, (_, i) =>
			buildClass(`c${i}`, { divisionId: `d${i % 4}`, code: String(i + 1) })
		);
		const entries = Array.from({ length: 2000 }, (_, i) => ({
			id: `e${i}`,
			number: i + 1,
			classId: `c${(i * 7) % 60}`,
			exhibitorId: `x${(i * 13) % 150}`,
			score: 60 + ((i * 37) % 81) / 2,
			criterionScores: { condition: 20 + ((i * 11) % 11) / 2 },
			judgesChoiceRank: i % 3 === 0 ? 1 : null
		}));
		const rules = buildRules({
			tieBreak: { criterionKey: 'condition', useJudgesChoice: true },
			topAwards: [
				{ id: 'bis', name: 'Best in show', classIds: classes.map((c) => c.id), minScore: 90 }
			]
		});
		for (const system of ['merit', 'placement'] as const) {
			const result = computeAwards({ classes, entries, rules: { ...rules, system } });
			expect(result.awards.length).toBeGreaterThan(60);
			expect(result.sweepstakes).toHaveLength(4);
		}
	});
});
