/**
 * Entry numbers that give nothing away: judges know a plant only by its number, so the number must
 * not tell who entered it or when. Numbers are drawn from a seeded shuffle of a range with room to
 * spare (entries made later, at the desk, draw from the numbers left), in one of two forms the
 * show chooses: one sequence for the whole show, or the class number followed by a sequence of the
 * class. Pure functions; the seed is the show's, so the same show always gets the same order.
 */

/** How a show's entry numbers look. */
export type EntryNumberForm = 'show_sequence' | 'class_prefix';

/** An entry to number: its id, and the class number when the form uses it. */
export interface EntryToNumber {
	id: string;
	/** The class's number (a whole number of 1 or more); needed for 'class_prefix'. */
	classNumber: number;
}

/** At most this share of a range is handed out when numbers are fixed, leaving room for later entries. */
const FILL_SHARE = 0.5;

/**
 * A seeded pseudo-random generator (mulberry32): the same seed gives the same sequence, which
 * keeps a show's numbering reproducible. Returns numbers in [0, 1).
 */
export function seededRandom(seed: number): () => number {
	let a = seed >>> 0;
	return () => {
		a = (a + 0x6d2b79f5) >>> 0;
		let t = a;
		t = Math.imul(t ^ (t >>> 15), t | 1);
		t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
		return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
	};
}

/** The values `from..to` (both included) in an order shuffled by the seed (Fisher–Yates). */
export function seededShuffle(from: number, to: number, seed: number): number[] {
	if (!Number.isInteger(from) || !Number.isInteger(to) || to < from) {
		throw new RangeError(
			`A range to shuffle needs whole numbers with from ≤ to, not ${from}..${to}.`
		);
	}
	const values = Array.from({ length: to - from + 1 }, (_, i) => from + i);
	const random = seededRandom(seed);
	for (let i = values.length - 1; i > 0; i--) {
		const j = Math.floor(random() * (i + 1));
		[values[i], values[j]] = [values[j], values[i]];
	}
	return values;
}

/**
 * The digits a sequence needs so that `count` entries fill at most half of it, and never fewer
 * than 2 (so even a small show's numbers do not run 1, 2, 3).
 */
export function sequenceDigits(count: number): number {
	let digits = 2;
	while (count > (10 ** digits - 1) * FILL_SHARE) digits++;
	return digits;
}

/** The numbers a group may take: the whole show's (from 100 up) or one class's. */
function rangeOf(form: EntryNumberForm, digits: number, classNumber: number): [number, number] {
	if (form === 'show_sequence') return [10 ** (digits - 1), 10 ** digits - 1];
	if (!Number.isInteger(classNumber) || classNumber < 1) {
		throw new RangeError(`A class number must be a whole number of 1 or more, not ${classNumber}.`);
	}
	const base = classNumber * 10 ** digits;
	return [base + 1, base + 10 ** digits - 1];
}

function groupSeed(seed: number, form: EntryNumberForm, classNumber: number): number {
	return form === 'show_sequence' ? seed : (seed ^ Math.imul(classNumber, 0x9e3779b1)) >>> 0;
}

/** The digits of the sequence for a numbering: enough for the largest group, at most half full. */
export function digitsFor(form: EntryNumberForm, entries: readonly EntryToNumber[]): number {
	if (form === 'show_sequence') return sequenceDigits(entries.length);
	const perClass = new Map<number, number>();
	for (const e of entries) perClass.set(e.classNumber, (perClass.get(e.classNumber) ?? 0) + 1);
	return sequenceDigits(Math.max(0, ...perClass.values()));
}

/** A numbering: each entry id's number, and the digits of the sequence (kept for later entries). */
export interface Numbering {
	digits: number;
	numbers: Map<string, number>;
}

/**
 * Fixes the numbers of a show's entries. The entries are first put in an order of the seed's own
 * (so the order they were entered in, and by whom, plays no part), then each takes the next number
 * of its group's shuffled range.
 */
export function assignEntryNumbers(
	entries: readonly EntryToNumber[],
	form: EntryNumberForm,
	seed: number
): Numbering {
	const digits = digitsFor(form, entries);
	const order = seededShuffle(0, Math.max(0, entries.length - 1), seed ^ 0x5bd1e995);
	const groups = new Map<number, { shuffled: number[]; taken: number }>();
	const numbers = new Map<string, number>();
	for (const index of entries.length ? order : []) {
		const entry = entries[index];
		const key = form === 'show_sequence' ? 0 : entry.classNumber;
		let group = groups.get(key);
		if (!group) {
			const [from, to] = rangeOf(form, digits, entry.classNumber);
			group = {
				shuffled: seededShuffle(from, to, groupSeed(seed, form, entry.classNumber)),
				taken: 0
			};
			groups.set(key, group);
		}
		numbers.set(entry.id, group.shuffled[group.taken++]);
	}
	return { digits, numbers };
}

/**
 * The number for an entry made after the numbers were fixed (a walk-in at the desk, or an entry
 * moved to another class): the first number of its group's shuffled range that nobody holds.
 * Null when the group's range is full.
 */
export function nextFreeEntryNumber(
	form: EntryNumberForm,
	seed: number,
	digits: number,
	classNumber: number,
	taken: ReadonlySet<number>
): number | null {
	const [from, to] = rangeOf(form, digits, form === 'show_sequence' ? 1 : classNumber);
	for (const n of seededShuffle(from, to, groupSeed(seed, form, classNumber))) {
		if (!taken.has(n)) return n;
	}
	return null;
}

/**
 * The class numbers for the 'class_prefix' form: a class code that is a whole number is used as
 * it is when every class has one and none repeats; otherwise classes are numbered by their place
 * in the schedule (1, 2, 3…).
 */
export function classNumbersOf(codesInScheduleOrder: readonly string[]): number[] {
	const asNumbers = codesInScheduleOrder.map((c) => (/^\s*\d{1,4}\s*$/.test(c) ? Number(c) : NaN));
	const usable =
		asNumbers.every((n) => Number.isInteger(n) && n >= 1) &&
		new Set(asNumbers).size === asNumbers.length;
	return usable ? asNumbers : codesInScheduleOrder.map((_, i) => i + 1);
}

/** Pairs of numbers one apart in a list (a run of k consecutive numbers gives k − 1 pairs). */
export function consecutivePairs(numbers: readonly number[]): number {
	const set = new Set(numbers);
	let pairs = 0;
	for (const n of set) if (set.has(n + 1)) pairs++;
	return pairs;
}
