import { describe, expect, it } from 'vitest';
import { computeAwards, DEFAULT_AWARD_RULES } from '$lib/domain/awards';
import { assembleResults, publicResults, type ResultsSource } from './assemble';
import { ribbonsPerClass, scoreDistribution } from './charts';
import { awardLine } from './labels';

/** Two classes in one division, scores chosen around the merit marks. */
function smallShow(): ResultsSource {
	const classes = [
		{ id: 'c1', code: '1', name: 'Standard, any color', divisionId: 'd1' },
		{ id: 'c2', code: '2', name: 'Miniature, any color', divisionId: 'd1' }
	];
	const entries: ResultsSource['entries'] = [
		{ n: 1, c: 'c1', x: 'ann', score: 94 },
		{ n: 2, c: 'c1', x: 'bob', score: 85 },
		{ n: 3, c: 'c1', x: 'ann', score: 75 },
		{ n: 4, c: 'c1', x: 'bob', score: 65 },
		{ n: 5, c: 'c2', x: 'bob', score: 91.5 },
		{ n: 6, c: 'c2', x: 'ann', score: 90 },
		{ n: 7, c: 'c2', x: 'cy', score: null }
	].map((e) => ({
		id: `e${e.n}`,
		number: e.n,
		classId: e.c,
		plant: `Variety ${e.n}`,
		exhibitorId: e.x,
		exhibitor: e.x.toUpperCase(),
		score: e.score,
		state: e.score === null ? ('not_judged' as const) : ('scored' as const),
		comments: e.n === 1 ? ['Full bloom, even rosette.'] : []
	}));
	const rules = {
		...DEFAULT_AWARD_RULES,
		topAwards: [{ id: 'bis', name: 'Best in show', classIds: ['c1', 'c2'], minScore: 90 }]
	};
	const computed = computeAwards({
		classes,
		entries: entries.map((e) => ({ ...e, notJudged: e.state === 'not_judged' })),
		rules
	});
	return {
		show: {
			id: 's',
			slug: 's',
			name: 'Spring Show',
			societyName: 'Invented Society',
			venue: null,
			judgingDay: '2026-04-18',
			system: 'merit',
			awardSettings: [],
			publishedAt: '2026-04-18T18:00:00Z'
		},
		divisions: [{ id: 'd1', code: 'A', name: 'Horticulture' }],
		classes,
		entries,
		awards: computed.awards.map((a) => ({
			...a,
			topAwardName: a.topAwardId ? 'Best in show' : null
		}))
	};
}

describe('assembleResults', () => {
	const results = assembleResults(smallShow());
	const [division] = results.divisions;
	const byNumber = new Map(division.classes.flatMap((c) => c.entries).map((e) => [e.number, e]));

	// Merit marks blue 90, red 80, white 70: national handbook, from memory (DOMAIN.md).
	it.each([
		[1, 'Best in show, Best in class, Blue ribbon'],
		[2, 'Red ribbon'],
		[3, 'White ribbon'],
		[4, 'No award'],
		[5, 'Best in class, Blue ribbon'],
		[6, 'Blue ribbon'],
		[7, 'Not judged']
	])('entry %i gets %s', (number, line) => {
		expect(awardLine(byNumber.get(number)!)).toBe(line);
	});

	it('orders each class best first', () => {
		expect(division.classes[0].entries.map((e) => e.number)).toEqual([1, 2, 3, 4]);
		expect(division.classes[1].entries.map((e) => e.number)).toEqual([5, 6, 7]);
	});

	// Sweepstakes: the exhibitor with the most blue ribbons in the division (published show
	// results, 2012 joint convention, DOMAIN.md): ann has 2 blues (entries 1 and 6), bob 1.
	it('counts ribbons per exhibitor and marks the sweepstakes winner', () => {
		expect(
			division.sweepstakes.map((s) => [s.exhibitor, s.blue, s.red, s.white, s.winner])
		).toEqual([
			['ANN', 2, 0, 1, true],
			['BOB', 1, 1, 0, false]
		]);
	});

	it('lists the top awards with their entry', () => {
		expect(results.topAwards).toEqual([
			expect.objectContaining({ name: 'Best in show', number: 1, classCode: '1', score: 94 })
		]);
	});

	it('keeps the judges comments out of the public view', () => {
		expect(byNumber.get(1)!.comments).toEqual(['Full bloom, even rosette.']);
		const pub = publicResults(results);
		expect(pub.divisions[0].classes[0].entries[0].comments).toEqual([]);
		expect(JSON.stringify(pub)).not.toContain('even rosette');
	});

	it('gives chart data that matches the table', () => {
		const [dist] = scoreDistribution(results);
		// 94, 91.5 and 90 fall in 90–94.9; 85 in 85–89.9; 75 in 75–79.9; 65 in 65–69.9.
		expect(dist.counts).toEqual([0, 0, 1, 0, 1, 0, 1, 3, 0]);
		const ribbons = ribbonsPerClass(results);
		expect(ribbons.levels.map((l) => l.level)).toEqual(['blue', 'red', 'white']);
		expect(ribbons.divisions[0].classes).toEqual([
			{ label: 'Class 1', counts: [1, 1, 1] },
			{ label: 'Class 2', counts: [2, 0, 0] }
		]);
	});
});
