import { describe, expect, it } from 'vitest';
import {
	bestScores,
	describeCounts,
	figuresOf,
	levelsIn,
	markedDown,
	pointsLost,
	recordByVariety,
	recordByYear,
	roundToTenth,
	type RecordEntry
} from './record';
import { DEFAULT_STANDARD_SCALE } from './scoring';

// A small hand-worked set: one exhibitor, three shows over two years. Ribbons follow the merit
// thresholds of the national handbook (blue 90 and over, red 80, white 70; from memory); the
// varieties and shows are invented. Every expected figure below was worked out by hand.
let n = 0;
function entry(
	show: string,
	day: string,
	plant: string,
	score: number | null,
	level: RecordEntry['level'],
	extra: Partial<RecordEntry> = {}
): RecordEntry {
	n += 1;
	return {
		showId: show,
		showName: `Show ${show}`,
		judgingDay: day,
		entryId: `e${n}`,
		number: n,
		plant,
		classLabel: '1 Standards',
		score,
		level,
		bestInClass: false,
		topAwards: [],
		...extra
	};
}

const SET: RecordEntry[] = [
	// Spring 2025: Amber Dusk 92 blue and best in class, Lace Moon 84 red, Tin Bell not judged.
	entry('s25', '2025-04-12', 'Amber Dusk', 92, 'blue', { bestInClass: true }),
	entry('s25', '2025-04-12', 'Lace Moon', 84, 'red'),
	entry('s25', '2025-04-12', 'Tin Bell', null, null),
	// Autumn 2025: Amber Dusk 95.5 blue, best in class and best in show; Lace Moon 68, no ribbon.
	entry('a25', '2025-10-04', 'Amber Dusk', 95.5, 'blue', {
		bestInClass: true,
		topAwards: ['Best in show']
	}),
	entry('a25', '2025-10-04', 'Lace Moon', 68, null),
	// Spring 2026: Lace Moon 91 blue; Amber Dusk 79 white.
	entry('s26', '2026-04-11', 'Lace Moon', 91, 'blue'),
	entry('s26', '2026-04-11', 'Amber Dusk', 79, 'white')
];

describe('recordByYear', () => {
	it('counts each year’s ribbons, best and average scores, newest year first', () => {
		const years = recordByYear(SET);
		expect(years.map((y) => y.year)).toEqual(['2026', '2025']);
		const [y2026, y2025] = years;
		// 2026: one show, 2 entries, blue + white, best 91, average (91 + 79) / 2 = 85.
		expect(y2026).toMatchObject({ shows: 1, entries: 2, scored: 2, placed: 2, bestScore: 91 });
		expect(y2026.averageScore).toBe(85);
		expect(y2026.counts).toMatchObject({ blue: 1, red: 0, white: 1 });
		// 2025: two shows, 5 entries (4 scored), 2 blue + 1 red, 2 best in class, 1 top award;
		// average (92 + 84 + 95.5 + 68) / 4 = 339.5 / 4 = 84.875, to a tenth 84.9.
		expect(y2025).toMatchObject({
			shows: 2,
			entries: 5,
			scored: 4,
			placed: 3,
			bestInClass: 2,
			topAwards: 1,
			bestScore: 95.5,
			averageScore: 84.9
		});
		expect(y2025.counts).toMatchObject({ blue: 2, red: 1, white: 0 });
	});
});

describe('recordByVariety', () => {
	it('lists entered most first; placed most first when asked', () => {
		const entered = recordByVariety(SET);
		// Amber Dusk and Lace Moon 3 entries each; Amber Dusk placed 3 times, Lace Moon twice.
		expect(entered.map((v) => [v.variety, v.entries, v.placed])).toEqual([
			['Amber Dusk', 3, 3],
			['Lace Moon', 3, 2],
			['Tin Bell', 1, 0]
		]);
		// Amber Dusk: (92 + 95.5 + 79) / 3 = 266.5 / 3 = 88.83…, 88.8; Lace Moon (84 + 68 + 91) / 3 = 81.
		expect(entered[0]).toMatchObject({ averageScore: 88.8, bestScore: 95.5, shows: 3 });
		expect(entered[1]).toMatchObject({ averageScore: 81, bestScore: 91 });
		expect(entered[2]).toMatchObject({ averageScore: null, bestScore: null, scored: 0 });
		const placed = recordByVariety(SET, 'placed');
		expect(placed.map((v) => v.variety)).toEqual(['Amber Dusk', 'Lace Moon', 'Tin Bell']);
	});

	it('breaks ties by the other count, then by name', () => {
		const set = [
			entry('x', '2026-01-01', 'Zed', 90, 'blue'),
			entry('x', '2026-01-01', 'Ada', 70, null),
			entry('y', '2026-02-01', 'Ada', 75, null)
		];
		expect(recordByVariety(set).map((v) => v.variety)).toEqual(['Ada', 'Zed']);
		expect(recordByVariety(set, 'placed').map((v) => v.variety)).toEqual(['Zed', 'Ada']);
	});
});

describe('bestScores', () => {
	it('gives the highest scores first, leaving out entries with none', () => {
		expect(bestScores(SET, 3).map((e) => [e.plant, e.score])).toEqual([
			['Amber Dusk', 95.5],
			['Amber Dusk', 92],
			['Lace Moon', 91]
		]);
		expect(bestScores(SET, 10)).toHaveLength(6);
	});
});

describe('figuresOf and describeCounts', () => {
	it('gives nothing for no entries', () => {
		const none = figuresOf([]);
		expect(none).toMatchObject({ entries: 0, placed: 0, bestScore: null, averageScore: null });
		expect(describeCounts(none.counts)).toBe('');
	});
	it('says the counts in words, singular and plural', () => {
		expect(describeCounts(figuresOf(SET).counts)).toBe(
			'3 blue ribbons, 1 red ribbon, 1 white ribbon'
		);
	});
	it('names the ribbons that occur, in order', () => {
		expect(levelsIn(SET)).toEqual(['blue', 'red', 'white']);
		expect(levelsIn([])).toEqual([]);
	});
	it.each([
		[84.875, 84.9],
		[88.8333, 88.8],
		[95.25, 95.3],
		[81, 81]
	])('rounds %s to %s', (value, rounded) => expect(roundToTenth(value)).toBe(rounded));
});

// The single-crown standard scale: symmetry 25, condition 25, quantity of bloom 25, size and type
// of blossom 15, color 10 ("A Beginner's Guide to Judging", African Violet Magazine, May/June 1993,
// rev. 2020). Points lost are what the judges deducted, hand-worked below.
describe('pointsLost and markedDown', () => {
	const criteria = DEFAULT_STANDARD_SCALE.criteria;
	it('takes the mean of the panel’s sheets, in the scale’s order', () => {
		const lost = pointsLost(criteria, [
			{ symmetry: 2, condition: 1, color_of_blossom: 0.5 },
			{ symmetry: 3, condition: 1.5 }
		]);
		expect(lost.map((p) => [p.key, p.maxPoints, p.lost])).toEqual([
			['symmetry', 25, 2.5], // (2 + 3) / 2
			['condition', 25, 1.3], // (1 + 1.5) / 2 = 1.25, to a tenth 1.3
			['quantity_of_bloom', 25, 0],
			['size_and_type_of_blossom', 15, 0],
			['color_of_blossom', 10, 0.3] // (0.5 + 0) / 2 = 0.25, to a tenth 0.3
		]);
		expect(markedDown(lost).map((p) => p.key)).toEqual([
			'symmetry',
			'condition',
			'color_of_blossom'
		]);
	});
	it('reads one consensus sheet as written, and nothing without a sheet', () => {
		expect(pointsLost(criteria, [{ symmetry: 4 }])[0].lost).toBe(4);
		expect(pointsLost(criteria, [])).toEqual([]);
		expect(markedDown(pointsLost(criteria, [{}]))).toEqual([]);
	});
});
