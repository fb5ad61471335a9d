import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import {
	assignEntryNumbers,
	classNumbersOf,
	consecutivePairs,
	nextFreeEntryNumber,
	seededShuffle,
	sequenceDigits,
	type EntryToNumber
} from './entry-numbers';

/** A show's entries in the order they were made: exhibitor by exhibitor, as happens online. */
function entriesOf(perExhibitor: number[], classes = 1): (EntryToNumber & { who: number })[] {
	const out: (EntryToNumber & { who: number })[] = [];
	perExhibitor.forEach((count, who) => {
		for (let i = 0; i < count; i++) {
			out.push({ id: `e${out.length}`, classNumber: 1 + (i % classes), who });
		}
	});
	return out;
}

describe('seededShuffle', () => {
	it('gives every value of the range once, and the same order for the same seed', () => {
		const a = seededShuffle(100, 999, 42);
		expect([...a].sort((x, y) => x - y)).toEqual(Array.from({ length: 900 }, (_, i) => 100 + i));
		expect(seededShuffle(100, 999, 42)).toEqual(a);
		expect(seededShuffle(100, 999, 43)).not.toEqual(a);
	});

	it('refuses a range that is not one', () => {
		expect(() => seededShuffle(5, 4, 1)).toThrow(RangeError);
		expect(() => seededShuffle(1.5, 4, 1)).toThrow(RangeError);
	});
});

describe('assignEntryNumbers', () => {
	it('gives every entry a different number, with room left for later entries', () => {
		const entries = entriesOf([5, 3, 8, 1]);
		const { numbers, digits } = assignEntryNumbers(entries, 'show_sequence', 7);
		expect(digits).toBe(2);
		expect(new Set(numbers.values()).size).toBe(entries.length);
		for (const n of numbers.values()) expect(n).toBeGreaterThanOrEqual(10);
		for (const n of numbers.values()) expect(n).toBeLessThanOrEqual(99);
	});

	it('in the class form, puts the class number first', () => {
		const entries = entriesOf([4, 4], 3);
		const { numbers, digits } = assignEntryNumbers(entries, 'class_prefix', 11);
		expect(digits).toBe(2);
		for (const e of entries) {
			expect(Math.floor(numbers.get(e.id)! / 100)).toBe(e.classNumber);
			expect(numbers.get(e.id)! % 100).toBeGreaterThan(0);
		}
	});

	it('grows the sequence so that it is at most half full', () => {
		expect(sequenceDigits(49)).toBe(2);
		expect(sequenceDigits(50)).toBe(3);
		expect(sequenceDigits(499)).toBe(3);
		expect(sequenceDigits(500)).toBe(4);
	});

	// The point of shuffled numbers (common practice: judges must not tell whose plants are whose).
	// If the numbers an exhibitor gets are a random share of the numbers handed out in a class
	// (or the show), their expected count of consecutive pairs is the pairs among all the numbers
	// there times k(k − 1)/(n(n − 1)). Summed over 300 shows, what comes out must stay near that
	// expectation; numbering entries in the order they were made would give every exhibitor
	// k − 1 pairs, far beyond it. No exhibitor of six or more entries gets an unbroken run.
	it('property: no exhibitor’s entries come out as a run of consecutive numbers beyond chance', () => {
		let observed = 0;
		let expected = 0;
		let runs = 0;
		fc.assert(
			fc.property(
				fc.array(fc.integer({ min: 1, max: 12 }), { minLength: 2, maxLength: 40 }),
				fc.integer({ min: 0, max: 2 ** 31 - 1 }),
				fc.constantFrom('show_sequence' as const, 'class_prefix' as const),
				(counts, seed, form) => {
					const entries = entriesOf(counts, 4);
					const { numbers } = assignEntryNumbers(entries, form, seed);
					expect(new Set(numbers.values()).size).toBe(entries.length);
					const groups = new Map<number, typeof entries>();
					for (const e of entries) {
						const key = form === 'class_prefix' ? e.classNumber : 0;
						groups.set(key, [...(groups.get(key) ?? []), e]);
					}
					for (const group of groups.values()) {
						const n = group.length;
						if (n < 2) continue;
						const all = consecutivePairs(group.map((e) => numbers.get(e.id)!));
						counts.forEach((_, who) => {
							const own = group.filter((e) => e.who === who).map((e) => numbers.get(e.id)!);
							const k = own.length;
							if (k < 2) return;
							const pairs = consecutivePairs(own);
							observed += pairs;
							expected += (all * k * (k - 1)) / (n * (n - 1));
							if (k >= 6 && pairs === k - 1) runs++;
						});
					}
				}
			),
			// A fixed seed: the same 300 shows on every run, so the check never depends on luck.
			{ numRuns: 300, seed: 20261203 }
		);
		expect(runs).toBe(0);
		expect(expected).toBeGreaterThan(10);
		// Well within chance: the count of pairs is near Poisson, so its spread is about √expected.
		expect(observed).toBeLessThan(expected + 5 * Math.sqrt(expected));
	});

	it('does not follow the order of entry: the first entries made do not take the lowest numbers', () => {
		const entries = entriesOf([30, 30]);
		const { numbers } = assignEntryNumbers(entries, 'show_sequence', 3);
		const first = entries.slice(0, 30).map((e) => numbers.get(e.id)!);
		const second = entries.slice(30).map((e) => numbers.get(e.id)!);
		const mean = (xs: number[]) => xs.reduce((a, b) => a + b, 0) / xs.length;
		// With numbers 100..999, the two halves' means differ by far less than a run would (450).
		expect(Math.abs(mean(first) - mean(second))).toBeLessThan(200);
	});
});

describe('nextFreeEntryNumber', () => {
	it('takes the first free number of the shuffled range, skipping those held', () => {
		const order = seededShuffle(10, 99, 5);
		expect(nextFreeEntryNumber('show_sequence', 5, 2, 1, new Set())).toBe(order[0]);
		expect(nextFreeEntryNumber('show_sequence', 5, 2, 1, new Set(order.slice(0, 3)))).toBe(
			order[3]
		);
		expect(nextFreeEntryNumber('show_sequence', 5, 2, 1, new Set(order))).toBeNull();
	});

	it('continues a fixed numbering without giving a number twice', () => {
		const entries = entriesOf([3, 3], 2);
		const { numbers, digits } = assignEntryNumbers(entries, 'class_prefix', 9);
		const taken = new Set(numbers.values());
		const n = nextFreeEntryNumber('class_prefix', 9, digits, 2, taken)!;
		expect(taken.has(n)).toBe(false);
		expect(Math.floor(n / 100)).toBe(2);
	});
});

describe('classNumbersOf', () => {
	it('uses whole-number class codes as they are, else the place in the schedule', () => {
		expect(classNumbersOf(['1', '2', '12'])).toEqual([1, 2, 12]);
		expect(classNumbersOf(['1', 'A2', '3'])).toEqual([1, 2, 3]);
		expect(classNumbersOf(['4', '4'])).toEqual([1, 2]);
		expect(classNumbersOf(['0', '5'])).toEqual([1, 2]);
	});
});
