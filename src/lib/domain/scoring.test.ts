import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import {
	DEFAULT_STANDARD_SCALE,
	isNotJudged,
	NOT_JUDGED_REASONS,
	panelScore,
	scaleTotal,
	scoreSheet,
	validateDeductions,
	validateScale,
	type ScaleOfPoints,
	type ScoreSheet
} from './scoring';

const scale = DEFAULT_STANDARD_SCALE;

describe('DEFAULT_STANDARD_SCALE', () => {
	// "A Beginner's Guide to Judging", African Violet Magazine, May/June 1993, rev. 2020 (DOMAIN.md)
	it.each([
		['symmetry', 'Symmetry or leaf pattern', 25],
		['condition', 'Condition', 25],
		['quantity_of_bloom', 'Quantity of bloom', 25],
		['size_and_type_of_blossom', 'Size and type of blossom', 15],
		['color_of_blossom', 'Color of blossom', 10]
	])('%s (%s) carries %d points', (key, label, maxPoints) => {
		expect(scale.criteria.find((c) => c.key === key)).toEqual({ key, label, maxPoints });
	});

	it('has the five published criteria, totalling 100, and is a sound scale', () => {
		// "A Beginner's Guide to Judging", African Violet Magazine, May/June 1993, rev. 2020 (DOMAIN.md)
		expect(scale.criteria).toHaveLength(5);
		expect(scaleTotal(scale)).toBe(100);
		expect(validateScale(scale)).toEqual([]);
	});

	it('cannot be changed by accident', () => {
		expect(Object.isFrozen(scale)).toBe(true);
		expect(Object.isFrozen(scale.criteria)).toBe(true);
		expect(Object.isFrozen(scale.criteria[0])).toBe(true);
	});
});

describe('validateScale', () => {
	it.each<[string, ScaleOfPoints, string[]]>([
		['no criteria', { id: 's', name: 'Empty', criteria: [] }, ['']],
		[
			'duplicate keys',
			{
				id: 's',
				name: 'Dup',
				criteria: [
					{ key: 'a', label: 'A', maxPoints: 10 },
					{ key: 'a', label: 'A again', maxPoints: 10 }
				]
			},
			['a']
		],
		[
			'zero, fractional and missing maxima',
			{
				id: 's',
				name: 'Bad',
				criteria: [
					{ key: 'a', label: 'A', maxPoints: 0 },
					{ key: 'b', label: 'B', maxPoints: 7.25 },
					{ key: 'c', label: 'C', maxPoints: Number.NaN },
					{ key: '', label: 'D', maxPoints: 5 }
				]
			},
			['a', 'b', 'c', '']
		]
	])('reports %s', (_name, bad, keys) => {
		expect(validateScale(bad).map((p) => p.criterionKey)).toEqual(keys);
	});
});

describe('validateDeductions', () => {
	// maxima from "A Beginner's Guide to Judging", African Violet Magazine, May/June 1993, rev. 2020 (DOMAIN.md)
	it.each<[string, Record<string, unknown>, { criterionKey: string; message: string }[]]>([
		['nothing deducted', {}, []],
		[
			'whole and half points within each maximum',
			{ symmetry: 2.5, condition: 0, quantity_of_bloom: 25, color_of_blossom: 10 },
			[]
		],
		[
			'a negative deduction',
			{ condition: -1 },
			[{ criterionKey: 'condition', message: 'Condition: a deduction cannot be negative.' }]
		],
		[
			'a text value',
			{ symmetry: '2' },
			[{ criterionKey: 'symmetry', message: 'Symmetry or leaf pattern: enter a number.' }]
		],
		[
			'NaN',
			{ symmetry: Number.NaN },
			[{ criterionKey: 'symmetry', message: 'Symmetry or leaf pattern: enter a number.' }]
		],
		[
			'Infinity',
			{ condition: Number.POSITIVE_INFINITY },
			[{ criterionKey: 'condition', message: 'Condition: enter a finite number.' }]
		],
		[
			'a quarter point',
			{ color_of_blossom: 0.25 },
			[
				{
					criterionKey: 'color_of_blossom',
					message: 'Color of blossom: deduct in whole or half points.'
				}
			]
		],
		[
			'a tenth of a point',
			{ condition: 0.1 },
			[{ criterionKey: 'condition', message: 'Condition: deduct in whole or half points.' }]
		],
		[
			'more than the size and type maximum of 15',
			{ size_and_type_of_blossom: 15.5 },
			[
				{
					criterionKey: 'size_and_type_of_blossom',
					message: 'Size and type of blossom: cannot deduct more than the 15 points it carries.'
				}
			]
		],
		[
			'an unknown criterion',
			{ fragrance: 1 },
			[
				{
					criterionKey: 'fragrance',
					message:
						'"fragrance" is not a criterion of the scale Single-crowned standard, semiminiature and miniature plants.'
				}
			]
		]
	])('%s', (_name, deductions, problems) => {
		expect(validateDeductions(scale, deductions)).toEqual(problems);
	});

	it('lists problems in scale order, then unknown keys sorted', () => {
		const problems = validateDeductions(scale, {
			zeta: 1,
			color_of_blossom: 11,
			alpha: 1,
			symmetry: -0.5
		});
		expect(problems.map((p) => p.criterionKey)).toEqual([
			'symmetry',
			'color_of_blossom',
			'alpha',
			'zeta'
		]);
	});
});

describe('scoreSheet', () => {
	// scale: "A Beginner's Guide to Judging", African Violet Magazine, May/June 1993, rev. 2020 (DOMAIN.md)
	it.each<[string, Record<string, number>, number, Record<string, number>]>([
		[
			'a perfect plant',
			{},
			100,
			{
				symmetry: 25,
				condition: 25,
				quantity_of_bloom: 25,
				size_and_type_of_blossom: 15,
				color_of_blossom: 10
			}
		],
		[
			'spent blooms and a gap in symmetry',
			{ symmetry: 1.5, condition: 0.5, quantity_of_bloom: 2, color_of_blossom: 0.5 },
			95.5,
			{
				symmetry: 23.5,
				condition: 24.5,
				quantity_of_bloom: 23,
				size_and_type_of_blossom: 15,
				color_of_blossom: 9.5
			}
		],
		[
			'every criterion at zero',
			{
				symmetry: 25,
				condition: 25,
				quantity_of_bloom: 25,
				size_and_type_of_blossom: 15,
				color_of_blossom: 10
			},
			0,
			{
				symmetry: 0,
				condition: 0,
				quantity_of_bloom: 0,
				size_and_type_of_blossom: 0,
				color_of_blossom: 0
			}
		]
	])('%s scores %d', (_name, deductions, total, byCriterion) => {
		expect(scoreSheet(scale, deductions)).toEqual({ total, byCriterion });
	});

	it('throws on invalid deductions', () => {
		expect(() => scoreSheet(scale, { condition: 0.3 })).toThrow(RangeError);
		expect(() => scoreSheet(scale, { fragrance: 1 })).toThrow(RangeError);
	});

	it('sums half points exactly', () => {
		const criterion = fc.constantFrom(...scale.criteria);
		fc.assert(
			fc.property(
				fc.uniqueArray(criterion, { selector: (c) => c.key }),
				fc.array(fc.nat(50), { minLength: 5, maxLength: 5 }),
				(chosen, halves) => {
					const deductions: Record<string, number> = {};
					let expectedHalves = 200;
					chosen.forEach((c, i) => {
						const h = halves[i] % (c.maxPoints * 2 + 1);
						deductions[c.key] = h / 2;
						expectedHalves -= h;
					});
					const { total, byCriterion } = scoreSheet(scale, deductions);
					expect(total).toBe(expectedHalves / 2);
					expect(Number.isInteger(total * 2)).toBe(true);
					expect(Object.values(byCriterion).reduce((a, b) => a + b, 0)).toBe(total);
				}
			)
		);
	});
});

describe('panelScore', () => {
	// Rule: mean of the judges' totals, rounded half-up to one decimal, computed from half points.
	it.each<[number[], number | null]>([
		[[], null],
		[[93], 93],
		[[92.5, 93, 93], 92.8], // 92.8333…
		[[90, 90.5], 90.3], // 90.25: a half rounds up (half-even would give 90.2)
		[[85.5, 86], 85.8], // 85.75
		[[90, 90, 90.5], 90.2], // 90.1666…
		[[90.5, 90.5, 91], 90.7], // 90.6666…
		[[90, 90, 90, 90.5], 90.1], // 90.125
		[[70.5, 71, 71.5], 71], // 71 exactly
		[[0.5, 0, 0, 0], 0.1], // 0.125
		[[99.5, 100, 100], 99.8] // 99.8333…
	])('mean of %j is %s', (totals, expected) => {
		expect(panelScore(totals, 'mean')).toBe(expected);
	});

	it.each<[number[], number | undefined, number | null]>([
		[[], undefined, null],
		[[], 91.5, 91.5],
		[[93], undefined, 93],
		[[92, 94], 93, 93]
	])('consensus of %j with clerk total %s is %s', (totals, clerk, expected) => {
		expect(panelScore(totals, 'consensus', clerk)).toBe(expected);
	});

	it.each<[string, () => unknown]>([
		['a quarter point in a mean', () => panelScore([90.25, 90], 'mean')],
		['NaN in a mean', () => panelScore([Number.NaN], 'mean')],
		['Infinity in a mean', () => panelScore([Number.POSITIVE_INFINITY, 90], 'mean')],
		['a consensus total off the half-point grid', () => panelScore([], 'consensus', 90.1)],
		['several sheets and no clerk total', () => panelScore([90, 91], 'consensus')]
	])('throws on %s', (_name, call) => {
		expect(call).toThrow(RangeError);
	});

	it('is the exact mean rounded half-up to one decimal', () => {
		fc.assert(
			fc.property(
				fc.array(fc.integer({ min: 0, max: 200 }), { minLength: 1, maxLength: 7 }),
				(halves) => {
					const totals = halves.map((h) => h / 2);
					const score = panelScore(totals, 'mean') as number;
					const sum = halves.reduce((a, b) => a + b, 0);
					// exact comparison in integers: |score*10 - 5*sum/n| <= 1/2, and ties go up
					const tenths = Math.round(score * 10);
					const diffTimesN = tenths * halves.length - 5 * sum;
					expect(2 * diffTimesN).toBeGreaterThan(-halves.length);
					expect(2 * diffTimesN).toBeLessThanOrEqual(halves.length);
					expect(score).toBeGreaterThanOrEqual(Math.min(...totals));
					expect(score).toBeLessThanOrEqual(Math.max(...totals));
				}
			)
		);
	});
});

describe('panelScore, the rounding setting', () => {
	// Rounding the mean half up, to one decimal or to whole points, is common practice (no
	// published show rule found that states either); each expected value is the exact mean worked
	// by hand from the totals beside it.
	it.each<[string, number[], number, number]>([
		['89 and 90: 89.5 exactly', [89, 90], 89.5, 90],
		['89.5, 89.5 and 89: 89.333…', [89.5, 89.5, 89], 89.3, 89],
		['89.5, 89.5 and 90: 89.666…', [89.5, 89.5, 90], 89.7, 90],
		['90 and 90.5: 90.25', [90, 90.5], 90.3, 90],
		// ten judges, nine on 89.5 and one on 89: 1,789 half points / 20 = 89.45 exactly; to one
		// decimal 89.5, to whole points 89 (rounding 89.5 again would wrongly give 90)
		['89.45 from ten judges', [...Array<number>(9).fill(89.5), 89], 89.5, 89],
		// nine on 90 and one on 89.5: 1,799 / 20 = 89.95 exactly; both roundings reach 90
		['89.95 from ten judges', [...Array<number>(9).fill(90), 89.5], 90, 90],
		// nine on 80 and one on 80.5: 1,601 / 20 = 80.05 exactly
		['80.05 from ten judges', [...Array<number>(9).fill(80), 80.5], 80.1, 80],
		['79.75: 79.5 and 80', [79.5, 80], 79.8, 80],
		['0 and 0.5: 0.25', [0, 0.5], 0.3, 0]
	])('%s: %s to one decimal, %s to whole points', (_name, totals, tenth, whole) => {
		expect(panelScore(totals, 'mean')).toBe(tenth);
		expect(panelScore(totals, 'mean', undefined, 'tenth')).toBe(tenth);
		expect(panelScore(totals, 'mean', undefined, 'whole')).toBe(whole);
	});

	it('does not trust floating-point rounding, which misses these halves', () => {
		// Why the mean is rounded in integers: the binary double nearest 80.05 lies just below it,
		// so the usual float idioms round it down, while the exact mean of the sheets is 80.05.
		expect((80.05).toFixed(1)).toBe('80.0');
		expect(Math.round(1.005 * 100) / 100).toBe(1);
		expect(panelScore([...Array<number>(9).fill(80), 80.5], 'mean')).toBe(80.1);
	});

	it('leaves a consensus total as written', () => {
		expect(panelScore([], 'consensus', 89.5, 'whole')).toBe(89.5);
		expect(panelScore([89.5], 'consensus', undefined, 'whole')).toBe(89.5);
	});

	it('is the exact mean rounded half up to whole points', () => {
		fc.assert(
			fc.property(
				fc.array(fc.integer({ min: 0, max: 200 }), { minLength: 1, maxLength: 12 }),
				(halves) => {
					const n = halves.length;
					const sum = halves.reduce((a, b) => a + b, 0);
					const score = panelScore(
						halves.map((h) => h / 2),
						'mean',
						undefined,
						'whole'
					) as number;
					expect(Number.isInteger(score)).toBe(true);
					// |score - sum / (2n)| <= 1/2 with halves going up: -n < 2n*score - sum <= n
					const diff = 2 * n * score - sum;
					expect(diff).toBeGreaterThan(-n);
					expect(diff).toBeLessThanOrEqual(n);
				}
			)
		);
	});
});

describe('sheets', () => {
	it('tells a not-judged sheet from a judged one', () => {
		const judged: ScoreSheet = { deductions: { condition: 1 } };
		const skipped: ScoreSheet = { notJudged: true, reason: 'suckers' };
		expect(isNotJudged(judged)).toBe(false);
		expect(isNotJudged(skipped)).toBe(true);
		expect(NOT_JUDGED_REASONS).toEqual([
			'wrong_class',
			'suckers',
			'pests',
			'not_in_bloom',
			'other'
		]);
	});
});
