import { describe, expect, it } from 'vitest';
import { defaultScales } from './scales';

// Source of every value below: "A Beginner's Guide to Judging", African Violet Magazine,
// May/June 1993, rev. 2020 (DOMAIN.md): symmetry or leaf pattern 25, condition 25, quantity of
// bloom 25, size and type of blossom 15, color of blossom 10; total 100.
const PUBLISHED: [string, number][] = [
	['symmetry', 25],
	['condition', 25],
	['quantity_of_bloom', 25],
	['size_and_type_of_blossom', 15],
	['color_of_blossom', 10]
];

describe('defaultScales', () => {
	it('gives the published scale for single-crowned standard, semiminiature and miniature plants', () => {
		const [standard] = defaultScales();
		expect(standard.name).toMatch(/single-crowned standard, semiminiature and miniature/i);
		expect(standard.criteria.map((c) => [c.key, c.maxPoints])).toEqual(PUBLISHED);
		expect(standard.criteria.reduce((sum, c) => sum + c.maxPoints, 0)).toBe(100);
	});

	it('hands out fresh copies that a society may change', () => {
		const first = defaultScales();
		first[0].criteria[0].maxPoints = 1;
		expect(defaultScales()[0].criteria[0].maxPoints).toBe(25);
	});
});
