import { describe, expect, it } from 'vitest';
import { OPEN_CLASS_RULES, type ClassRules, type ExhibitorContext } from './eligibility';
import {
	RECENT_BLOOM_DAYS,
	assessReadiness,
	currentMeasurements,
	lastBloom,
	type CollectionPlant,
	type LoggedEvent,
	type NeedCode,
	type ReadinessClass,
	type ReadinessShow,
	type ReadinessStatus
} from './readiness';

function rules(overrides: Partial<ClassRules> = {}): ClassRules {
	return { ...OPEN_CLASS_RULES, ...overrides };
}

/** A schedule in the shape of the demo: single-crown standards, semiminiatures, miniatures, trailers. */
const CLASSES: ReadinessClass[] = [
	{ id: 'c1', rules: rules({ habit: 'single_crown', sizeClasses: ['standard'], maxCrowns: 1 }) },
	{
		id: 'c12',
		rules: rules({ habit: 'single_crown', sizeClasses: ['semiminiature'], maxCrowns: 1 })
	},
	{ id: 'c15', rules: rules({ habit: 'single_crown', sizeClasses: ['miniature'], maxCrowns: 1 }) },
	// trailer: at least 3 crowns, provincial society show schedule 2014 (DOMAIN.md)
	{ id: 'c18', rules: rules({ habit: 'trailer', minCrowns: 3 }) },
	{ id: 'c22', rules: rules({ speciesOnly: true }) }
];

function show(overrides: Partial<ReadinessShow> = {}): ReadinessShow {
	return {
		today: '2027-04-01',
		entriesOpen: '2027-03-15',
		entriesClose: '2027-04-30',
		entryDay: '2027-05-14',
		showDate: '2027-05-15',
		possessionMonths: 3, // possession period 3 months: state council show rules 2018 (DOMAIN.md)
		maxEntriesPerClass: 2,
		maxEntriesPerVariety: 1,
		requireGoodStanding: true,
		...overrides
	};
}

function plant(
	overrides: Partial<CollectionPlant['facts']> = {},
	events: LoggedEvent[] = [{ kind: 'in_bloom', on: '2027-03-20' }]
): CollectionPlant {
	return {
		plantId: 'p1',
		facts: {
			varietyId: 'v1',
			varietyName: 'Harbor Dusk',
			isSpecies: false,
			habit: 'single_crown',
			sizeClass: 'standard',
			blossomType: 'double',
			blossomColours: ['purple'],
			foliage: 'plain',
			acquiredOn: '2026-06-01',
			...overrides
		},
		events
	};
}

interface Case {
	name: string;
	plant: CollectionPlant;
	show?: Partial<ReadinessShow>;
	status: ReadinessStatus;
	classes: string[];
	enterable: string[];
	needs: NeedCode[];
	/** The "by" date of the first need, when it has one. */
	by?: string | null;
}

describe('assessReadiness', () => {
	it.each<Case>([
		{
			name: 'a single-crown standard, long held, bloomed lately: ready for the standard class',
			plant: plant(),
			status: 'ready',
			classes: ['c1'],
			enterable: ['c1'],
			needs: []
		},
		{
			// possession period 3 months: state council show rules 2018 (DOMAIN.md), counted in
			// calendar months: 2027-01-31 + 3 months = 2027-04-30 (April has 30 days), before 2027-05-15
			name: 'got on 31 January: the period ends on 30 April, before the show',
			plant: plant({ acquiredOn: '2027-01-31' }),
			status: 'ready',
			classes: ['c1'],
			enterable: ['c1'],
			needs: []
		},
		{
			// possession period 3 months: state council show rules 2018 (DOMAIN.md);
			// 2027-02-16 + 3 months = 2027-05-16, the day after the show
			name: 'got on 16 February: three months end one day after the show',
			plant: plant({ acquiredOn: '2027-02-16' }),
			status: 'cannot_enter',
			classes: ['c1'],
			enterable: [],
			needs: []
		},
		{
			// possession period 3 months: state council show rules 2018 (DOMAIN.md);
			// 2027-02-15 + 3 months = 2027-05-15, the show date itself
			name: 'got on 15 February: three months end on the show date, which counts',
			plant: plant({ acquiredOn: '2027-02-15' }),
			status: 'ready',
			classes: ['c1'],
			enterable: ['c1'],
			needs: []
		},
		{
			// possession period 3 months: state council show rules 2018 (DOMAIN.md);
			// 2027-11-30 + 3 months = 2028-02-29 (leap day), so a show on 29 February 2028 is reached
			name: 'leap year: got on 30 November 2027, show on 29 February 2028',
			plant: plant({ acquiredOn: '2027-11-30' }, [{ kind: 'in_bloom', on: '2028-02-10' }]),
			show: {
				today: '2028-02-01',
				entriesOpen: '2028-01-15',
				entriesClose: '2028-02-20',
				entryDay: '2028-02-28',
				showDate: '2028-02-29'
			},
			status: 'ready',
			classes: ['c1'],
			enterable: ['c1'],
			needs: []
		},
		{
			// possession period 3 months: state council show rules 2018 (DOMAIN.md);
			// 2027-11-30 + 3 months = 2028-02-29, one day after a show on 28 February 2028
			name: 'leap year: got on 30 November 2027, show on 28 February 2028 is a day short',
			plant: plant({ acquiredOn: '2027-11-30' }, [{ kind: 'in_bloom', on: '2028-02-10' }]),
			show: {
				today: '2028-02-01',
				entriesOpen: '2028-01-15',
				entriesClose: '2028-02-20',
				entryDay: '2028-02-27',
				showDate: '2028-02-28'
			},
			status: 'cannot_enter',
			classes: ['c1'],
			enterable: [],
			needs: []
		},
		{
			// possession period 3 months: state council show rules 2018 (DOMAIN.md);
			// 2028-02-29 + 3 months = 2028-05-29: the leap day itself as the start
			name: 'got on the leap day: the period ends on 29 May',
			plant: plant({ acquiredOn: '2028-02-29' }, [{ kind: 'in_bloom', on: '2028-05-10' }]),
			show: {
				today: '2028-05-01',
				entriesOpen: '2028-04-15',
				entriesClose: '2028-05-20',
				entryDay: '2028-05-28',
				showDate: '2028-05-29'
			},
			status: 'ready',
			classes: ['c1'],
			enterable: ['c1'],
			needs: []
		},
		{
			// single crown: state council show rules 2018 (DOMAIN.md): a sucker makes it ineligible
			name: 'a single-crown plant whose last measurement counts 3 crowns: remove 2 suckers by entry day',
			plant: plant({}, [
				{ kind: 'in_bloom', on: '2027-03-20' },
				{ kind: 'measured', on: '2027-03-25', crowns: 3, diameterIn: 12 }
			]),
			status: 'needs_work',
			classes: ['c1'],
			enterable: ['c1'],
			needs: ['remove_suckers'],
			by: '2027-05-14'
		},
		{
			name: 'suckers measured, then a sucker removal logged: ready again',
			plant: plant({}, [
				{ kind: 'measured', on: '2027-03-10', crowns: 2 },
				{ kind: 'sucker_removed', on: '2027-03-12' },
				{ kind: 'in_bloom', on: '2027-03-20' }
			]),
			status: 'ready',
			classes: ['c1'],
			enterable: ['c1'],
			needs: []
		},
		{
			name: 'a sucker potted up counts as removed from the mother plant',
			plant: plant({}, [
				{ kind: 'measured', on: '2027-03-10', crowns: 2 },
				{ kind: 'sucker_potted', on: '2027-03-11' },
				{ kind: 'in_bloom', on: '2027-03-20' }
			]),
			status: 'ready',
			classes: ['c1'],
			enterable: ['c1'],
			needs: []
		},
		{
			// trailer: at least 3 crowns, provincial society show schedule 2014 (DOMAIN.md)
			name: 'a trailer with 2 crowns: needs more crowns by entry day',
			plant: plant({ habit: 'trailer', varietyName: 'Wandering Larkspur' }, [
				{ kind: 'in_bloom', on: '2027-03-20' },
				{ kind: 'measured', on: '2027-03-21', crowns: 2 }
			]),
			status: 'needs_work',
			classes: ['c18'],
			enterable: ['c18'],
			needs: ['too_few_crowns'],
			by: '2027-05-14'
		},
		{
			// trailer: at least 3 crowns, provincial society show schedule 2014 (DOMAIN.md)
			name: 'a trailer with 4 crowns is ready; removing a sucker does not reset its count',
			plant: plant({ habit: 'trailer' }, [
				{ kind: 'measured', on: '2027-03-21', crowns: 4 },
				{ kind: 'sucker_removed', on: '2027-03-22' },
				{ kind: 'in_bloom', on: '2027-03-23' }
			]),
			status: 'ready',
			classes: ['c18'],
			enterable: ['c18'],
			needs: []
		},
		{
			name: 'a trailer never measured: count its crowns',
			plant: plant({ habit: 'trailer' }),
			status: 'needs_work',
			classes: ['c18'],
			enterable: ['c18'],
			needs: ['count_crowns']
		},
		{
			// size classes: semiminiature up to 8 in, growers' references (DOMAIN.md)
			name: 'a semiminiature measured at 8.5 in is over its limit: cannot be judged in its class',
			plant: plant({ sizeClass: 'semiminiature' }, [
				{ kind: 'in_bloom', on: '2027-03-20' },
				{ kind: 'measured', on: '2027-03-22', crowns: 1, diameterIn: 8.5 }
			]),
			status: 'cannot_enter',
			classes: ['c12'],
			enterable: [],
			needs: []
		},
		{
			// size classes: miniature up to 6 in, growers' references (DOMAIN.md)
			name: 'a miniature at exactly 6 in is within its limit',
			plant: plant({ sizeClass: 'miniature' }, [
				{ kind: 'in_bloom', on: '2027-03-20' },
				{ kind: 'measured', on: '2027-03-22', crowns: 1, diameterIn: 6 }
			]),
			status: 'ready',
			classes: ['c15'],
			enterable: ['c15'],
			needs: []
		},
		{
			// entries: in bloom, show rules 2018 (DOMAIN.md); "lately" is our own setting (60 days)
			name: 'last bloom 61 days before today: no bloom logged lately',
			plant: plant({}, [{ kind: 'in_bloom', on: '2027-01-30' }]),
			status: 'needs_work',
			classes: ['c1'],
			enterable: ['c1'],
			needs: ['no_recent_bloom'],
			by: '2027-05-15'
		},
		{
			// "lately" is our own setting (60 days): 2027-01-31 is exactly 60 days before 2027-04-01
			name: 'last bloom exactly 60 days before today still counts',
			plant: plant({}, [{ kind: 'in_bloom', on: '2027-01-31' }]),
			status: 'ready',
			classes: ['c1'],
			enterable: ['c1'],
			needs: []
		},
		{
			name: 'no bloom ever logged',
			plant: plant({}, []),
			status: 'needs_work',
			classes: ['c1'],
			enterable: ['c1'],
			needs: ['no_recent_bloom'],
			by: '2027-05-15'
		},
		{
			name: 'a species fits the species class only',
			plant: plant({ isSpecies: true, varietyName: 'Saintpaulia ionantha' }),
			status: 'ready',
			classes: ['c1', 'c22'],
			enterable: ['c1', 'c22'],
			needs: []
		},
		{
			name: 'a large plant has no class in this schedule',
			plant: plant({ sizeClass: 'large' }),
			status: 'no_class',
			classes: [],
			enterable: [],
			needs: []
		},
		{
			name: 'entries have closed: it fits, but cannot be entered any more',
			plant: plant(),
			show: { today: '2027-05-02' },
			status: 'cannot_enter',
			classes: ['c1'],
			enterable: [],
			needs: []
		}
	])('$name', (c) => {
		const result = assessReadiness(c.plant, show(c.show), CLASSES);
		expect(result.status).toBe(c.status);
		expect(result.matches.map((m) => m.classId)).toEqual(c.classes);
		expect(result.matches.filter((m) => m.canEnter).map((m) => m.classId)).toEqual(c.enterable);
		expect(result.needs.map((n) => n.code)).toEqual(c.needs);
		if (c.by !== undefined) expect(result.needs[0].by).toBe(c.by);
	});

	it('says when the possession period is reached, in words', () => {
		// possession period 3 months: state council show rules 2018 (DOMAIN.md); 2027-02-16 + 3 = 2027-05-16
		const result = assessReadiness(plant({ acquiredOn: '2027-02-16' }), show(), CLASSES);
		expect(result.matches[0].blockers.map((b) => b.code)).toEqual([
			'possession_period_not_reached'
		]);
		expect(result.matches[0].blockers[0].message).toContain('qualifies from 16 May 2027');
	});

	it('names the suckers and the day to remove them by', () => {
		const result = assessReadiness(
			plant({}, [
				{ kind: 'in_bloom', on: '2027-03-20' },
				{ kind: 'measured', on: '2027-03-25', crowns: 2 }
			]),
			show(),
			CLASSES
		);
		expect(result.needs[0].message).toContain('remove the sucker before entry day, 14 May 2027');
	});

	it('uses the exhibitor limits through the same eligibility module', () => {
		const full: ExhibitorContext = {
			inGoodStanding: true,
			entriesInClass: 2,
			entriesOfVariety: 0,
			varietyAlreadyInClass: false
		};
		const result = assessReadiness(plant(), show(), CLASSES, () => full);
		expect(result.status).toBe('cannot_enter');
		expect(result.matches[0].blockers.map((b) => b.code)).toEqual(['class_entry_limit_reached']);
	});

	it('names its bloom window', () => {
		expect(RECENT_BLOOM_DAYS).toBe(60); // our own setting, not a published value
	});
});

describe('currentMeasurements and lastBloom', () => {
	it('reads the log in date order whatever order it is given in', () => {
		const events: LoggedEvent[] = [
			{ kind: 'sucker_removed', on: '2027-03-12' },
			{ kind: 'in_bloom', on: '2027-03-20' },
			{ kind: 'measured', on: '2027-03-10', crowns: 2, diameterIn: 9.5 },
			{ kind: 'in_bloom', on: '2027-02-01' }
		];
		expect(currentMeasurements('single_crown', events)).toEqual({
			on: '2027-03-10',
			crowns: 1,
			diameterIn: 9.5
		});
		expect(lastBloom(events)).toBe('2027-03-20');
	});

	it('a later measurement without a diameter keeps the earlier diameter', () => {
		expect(
			currentMeasurements('single_crown', [
				{ kind: 'measured', on: '2027-03-01', diameterIn: 7 },
				{ kind: 'measured', on: '2027-03-05', crowns: 2 }
			])
		).toEqual({ on: '2027-03-05', crowns: 2, diameterIn: 7 });
	});

	it('a plant never measured has no measurements', () => {
		expect(currentMeasurements('single_crown', [{ kind: 'groomed', on: '2027-03-01' }])).toBe(null);
	});
});
