import { describe, expect, it } from 'vitest';
import {
	DEFAULT_SCALES,
	criterionKey,
	defaultScales,
	totalPoints,
	validateScaleDraft,
	withKeys
} from './scales';

const draft = (criteria: { label: string; maxPoints: number }[], name = 'Our scale') => ({
	name,
	criteria: withKeys(criteria)
});

describe('defaultScales', () => {
	it('starts with the published standard scale, 25/25/25/15/10 = 100', () => {
		// Source: "A Beginner's Guide to Judging", African Violet Magazine, May/June 1993, rev. 2020.
		const [standard] = defaultScales();
		expect(standard.criteria.map((c) => [c.label, c.maxPoints])).toEqual([
			['Symmetry or leaf pattern', 25],
			['Condition', 25],
			['Quantity of bloom', 25],
			['Size and type of blossom', 15],
			['Color of blossom', 10]
		]);
		expect(totalPoints(standard.criteria)).toBe(100);
		expect(DEFAULT_SCALES[0].source).toContain('African Violet Magazine, May/June 1993');
	});

	it('names a source for every default scale, and each is valid', () => {
		for (const scale of DEFAULT_SCALES) {
			expect(scale.source.length).toBeGreaterThan(10);
			expect(validateScaleDraft(scale)).toEqual([]);
		}
		// The other defaults are the demo society's own settings (invented, each totals 100).
		expect(DEFAULT_SCALES.slice(1).every((s) => s.source.includes('not a published scale'))).toBe(
			true
		);
		expect(DEFAULT_SCALES.map((s) => totalPoints(s.criteria))).toEqual([100, 100, 100, 100, 100]);
	});

	it('gives fresh copies with only name and criteria, so editing one changes no other', () => {
		const a = defaultScales();
		a[0].criteria[0].maxPoints = 1;
		const b = defaultScales();
		expect(b[0].criteria[0].maxPoints).toBe(25);
		expect(Object.keys(b[0]).sort()).toEqual(['criteria', 'name']);
		expect(Object.keys(b[0].criteria[0]).sort()).toEqual(['key', 'label', 'maxPoints']);
	});
});

describe('validateScaleDraft', () => {
	// Limits are Crownbench's own rules (common practice: a criterion gives some points, none
	// gives more than a whole 100-point scale, judges deduct in half points).
	const cases: [string, ReturnType<typeof draft>, string | null][] = [
		['a sound scale', draft([{ label: 'Condition', maxPoints: 50 }]), null],
		['half points', draft([{ label: 'Condition', maxPoints: 12.5 }]), null],
		['100 points in one criterion', draft([{ label: 'Everything', maxPoints: 100 }]), null],
		['no criteria', draft([]), 'A scale of points needs at least one criterion.'],
		[
			'a criterion of 0',
			draft([{ label: 'Condition', maxPoints: 0 }]),
			'Criterion 1 must give more than 0 points.'
		],
		[
			'over 100',
			draft([{ label: 'Condition', maxPoints: 101 }]),
			'Criterion 1 may give at most 100 points.'
		],
		[
			'negative',
			draft([{ label: 'Condition', maxPoints: -5 }]),
			'Criterion 1 must give more than 0 points.'
		],
		[
			'not a number',
			draft([{ label: 'Condition', maxPoints: Number.NaN }]),
			'Criterion 1 must give more than 0 points.'
		],
		[
			'a third of a point',
			draft([{ label: 'Condition', maxPoints: 10.3 }]),
			'Criterion 1: give the points in whole or half points, like 15 or 12.5.'
		],
		['a blank name', draft([{ label: '  ', maxPoints: 10 }]), 'Criterion 1 needs a name.'],
		[
			'a repeated name (any case)',
			draft([
				{ label: 'Condition', maxPoints: 10 },
				{ label: 'condition', maxPoints: 10 }
			]),
			'“condition” is already criterion 1; give each criterion its own name.'
		],
		[
			'a blank scale name',
			draft([{ label: 'Condition', maxPoints: 10 }], ' '),
			'Give the scale a name.'
		]
	];
	it.each(cases)('%s', (_, input, message) => {
		const problems = validateScaleDraft(input);
		expect(problems[0]?.message ?? null).toBe(message);
	});
});

describe('withKeys and criterionKey', () => {
	it('keeps a loaded key, makes new ones from the name, never twice the same', () => {
		expect(criterionKey('Size and type of blossom')).toBe('size_and_type_of_blossom');
		const keyed = withKeys([
			{ key: 'symmetry', label: 'Leaf pattern', maxPoints: 25 },
			{ label: 'Symmetry', maxPoints: 25 },
			{ label: 'Condition', maxPoints: 50 }
		]);
		expect(keyed.map((c) => c.key)).toEqual(['symmetry', 'symmetry_2', 'condition']);
	});
});
