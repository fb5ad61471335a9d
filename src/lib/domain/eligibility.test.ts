import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { formatIsoDate } from './dates';
import {
	FAILURE_CODES,
	OPEN_CLASS_RULES,
	SINGLE_CROWN_MAX_CROWNS,
	SIZE_LIMITS_IN,
	TRAILER_MIN_CROWNS,
	checkEligibility,
	classesThatFit,
	measuredSizeClass,
	sizeClassForDiameter,
	sizeLimitIn,
	type CheckPhase,
	type ClassRules,
	type ExhibitorContext,
	type FailureCode,
	type PlantFacts,
	type ShowContext,
	type SizeClass
} from './eligibility';
import { toInches } from './units';

function buildRules(overrides: Partial<ClassRules> = {}): ClassRules {
	return { ...OPEN_CLASS_RULES, ...overrides };
}

function buildPlant(overrides: Partial<PlantFacts> = {}): PlantFacts {
	return {
		varietyId: 'v-pink-lace',
		varietyName: 'Pink Lace Morning',
		isSpecies: false,
		habit: 'single_crown',
		sizeClass: 'standard',
		blossomType: 'semidouble',
		blossomColours: ['pink'],
		foliage: 'plain',
		acquiredOn: '2024-06-01',
		...overrides
	};
}

function buildShow(overrides: Partial<ShowContext> = {}): ShowContext {
	return {
		showDate: '2025-05-17',
		today: '2025-05-05',
		entriesOpen: '2025-04-01',
		entriesClose: '2025-05-10',
		possessionMonths: 3, // possession period 3 months: state council show rules 2018 (DOMAIN.md)
		maxEntriesPerClass: 2,
		maxEntriesPerVariety: 1,
		requireGoodStanding: true,
		...overrides
	};
}

function buildExhibitor(overrides: Partial<ExhibitorContext> = {}): ExhibitorContext {
	return {
		inGoodStanding: true,
		entriesInClass: 0,
		entriesOfVariety: 0,
		varietyAlreadyInClass: false,
		...overrides
	};
}

/** What differs from the builders' defaults in one check. */
interface Setup {
	rules?: Partial<ClassRules>;
	plant?: Partial<PlantFacts>;
	show?: Partial<ShowContext>;
	exhibitor?: Partial<ExhibitorContext>;
	phase?: CheckPhase;
}

interface Case extends Setup {
	name: string;
	codes: FailureCode[];
}

function codesOf(c: Setup): FailureCode[] {
	return checkEligibility({
		rules: buildRules(c.rules),
		plant: buildPlant(c.plant),
		show: buildShow(c.show),
		exhibitor: buildExhibitor(c.exhibitor),
		phase: c.phase ?? 'entry'
	}).failures.map((f) => f.code);
}

const trailer: Partial<PlantFacts> = {
	varietyId: 'v-trail',
	varietyName: "Rob's Trailing Example",
	habit: 'trailer',
	sizeClass: 'semiminiature'
};
const miniature: Partial<PlantFacts> = { sizeClass: 'miniature' };
const semiminiature: Partial<PlantFacts> = { sizeClass: 'semiminiature' };
const species: Partial<PlantFacts> = {
	varietyId: 'v-ionantha',
	varietyName: 'Saintpaulia ionantha',
	isSpecies: true
};

describe('sizeLimitIn', () => {
	it.each<[SizeClass, number | null]>([
		['miniature', 6], // size classes: growers' references (DOMAIN.md)
		['semiminiature', 8], // size classes: growers' references (DOMAIN.md)
		['standard', null], // size classes: growers' references (DOMAIN.md); standard is over 8 in, no upper limit
		['large', null] // size classes: growers' references (DOMAIN.md); large is 16 in and over
	])('%s -> %s', (sizeClass, expected) => {
		expect(sizeLimitIn(sizeClass)).toBe(expected);
		expect(SIZE_LIMITS_IN[sizeClass]).toBe(expected);
	});

	it('rejects an unknown size class', () => {
		expect(() => sizeLimitIn('giant' as SizeClass)).toThrow(RangeError);
		expect(() => sizeLimitIn('toString' as SizeClass)).toThrow(RangeError);
	});

	it('names the crown defaults', () => {
		expect(TRAILER_MIN_CROWNS).toBe(3); // trailer: at least 3 crowns, provincial society show schedule 2014 (DOMAIN.md)
		expect(SINGLE_CROWN_MAX_CROWNS).toBe(1); // single crown: state council show rules 2018 (DOMAIN.md)
	});
});

describe('checkEligibility: the plant against the class', () => {
	it.each<Case>([
		{ name: 'a plain entry in an open class fits', codes: [] },
		{
			name: 'a trailer in a single-crown class',
			rules: { habit: 'single_crown' },
			plant: trailer,
			codes: ['habit_not_allowed']
		},
		{
			name: 'a single-crown plant in a trailer class',
			rules: { habit: 'trailer' },
			codes: ['habit_not_allowed']
		},
		{ name: 'a trailer in a class open to any habit', plant: trailer, codes: [] },
		{
			// size classes: growers' references (DOMAIN.md)
			name: 'a standard in a miniature class',
			rules: { sizeClasses: ['miniature'] },
			codes: ['size_class_not_allowed']
		},
		{
			// size classes: growers' references (DOMAIN.md)
			name: 'a semiminiature in a miniature and semiminiature class',
			rules: { sizeClasses: ['miniature', 'semiminiature'] },
			plant: semiminiature,
			codes: []
		},
		{
			name: 'double blossoms in a single and semidouble class',
			rules: { blossomTypes: ['single', 'semidouble'] },
			plant: { blossomType: 'double' },
			codes: ['blossom_type_not_allowed']
		},
		{
			name: 'blossom types match whatever the case, spaces or hyphens',
			rules: { blossomTypes: ['Semi-double'] },
			plant: { blossomType: 'semidouble' },
			codes: []
		},
		{
			name: 'no recorded blossom type in a class that names types',
			rules: { blossomTypes: ['star'] },
			plant: { blossomType: '' },
			codes: ['blossom_type_not_allowed']
		},
		{
			name: 'blue and white blossoms in a pink class',
			rules: { blossomColours: ['pink', 'coral'] },
			plant: { blossomColours: ['blue', 'white'] },
			codes: ['blossom_colour_not_allowed']
		},
		{
			name: 'one listed color is enough',
			rules: { blossomColours: ['pink'] },
			plant: { blossomColours: ['blue', 'Pink'] },
			codes: []
		},
		{
			name: 'no recorded color in a color class',
			rules: { blossomColours: ['pink'] },
			plant: { blossomColours: [] },
			codes: ['blossom_colour_not_allowed']
		},
		{
			name: 'plain foliage in a variegated class',
			rules: { foliage: 'variegated' },
			codes: ['foliage_not_allowed']
		},
		{
			name: 'variegated foliage in a variegated class',
			rules: { foliage: 'variegated' },
			plant: { foliage: 'variegated' },
			codes: []
		},
		{ name: 'a hybrid in a species class', rules: { speciesOnly: true }, codes: ['not_a_species'] },
		{
			name: 'a species in a species class',
			rules: { speciesOnly: true },
			plant: species,
			codes: []
		}
	])('$name', (c) => {
		expect(codesOf(c)).toEqual(c.codes);
	});
});

describe('checkEligibility: measurements at the desk', () => {
	it.each<Case>([
		{
			// size limit at a show: growers' reference (DOMAIN.md); miniature up to 6 in: growers' references (DOMAIN.md)
			name: 'a miniature of exactly 6.0 in fits',
			plant: { ...miniature, measured: { diameterIn: 6.0 } },
			phase: 'desk',
			codes: []
		},
		{
			// size limit at a show: growers' reference (DOMAIN.md); miniature up to 6 in: growers' references (DOMAIN.md)
			name: 'a miniature of 6.1 in is over its limit',
			plant: { ...miniature, measured: { diameterIn: 6.1 } },
			phase: 'desk',
			codes: ['diameter_over_limit']
		},
		{
			// miniature up to 6 in: growers' references (DOMAIN.md); 1 in = 2.54 cm: NIST SP 811
			name: 'a miniature measured at 15.24 cm fits',
			plant: { ...miniature, measured: { diameterIn: toInches(15.24, 'cm') } },
			phase: 'desk',
			codes: []
		},
		{
			// 1 in = 2.54 cm: NIST SP 811; 33.02 cm / 2.54 comes out a hair over 13 in floating point
			name: 'a plant measured at 33.02 cm fits a 13 in class limit',
			rules: { maxDiameterIn: 13 },
			plant: { measured: { diameterIn: toInches(33.02, 'cm') } },
			phase: 'desk',
			codes: []
		},
		{
			// semiminiature up to 8 in: growers' references (DOMAIN.md)
			name: 'a semiminiature of exactly 8.0 in fits',
			plant: { ...semiminiature, measured: { diameterIn: 8.0 } },
			phase: 'desk',
			codes: []
		},
		{
			// size limit at a show: growers' reference (DOMAIN.md); semiminiature up to 8 in: growers' references (DOMAIN.md)
			name: 'a semiminiature of 8.1 in is over its limit',
			plant: { ...semiminiature, measured: { diameterIn: 8.1 } },
			phase: 'desk',
			codes: ['diameter_over_limit']
		},
		{
			// size classes: growers' references (DOMAIN.md); standard has no upper limit
			name: 'a standard of 14 in has no limit of its own',
			plant: { measured: { diameterIn: 14 } },
			phase: 'desk',
			codes: []
		},
		{
			name: 'a class limit of 12 in stops a 12.5 in standard',
			rules: { maxDiameterIn: 12 },
			plant: { measured: { diameterIn: 12.5 } },
			phase: 'desk',
			codes: ['diameter_over_limit']
		},
		{
			// size limit at a show: growers' reference (DOMAIN.md); miniature up to 6 in: growers' references (DOMAIN.md)
			name: 'a looser class limit does not lift the miniature limit',
			rules: { maxDiameterIn: 7 },
			plant: { ...miniature, measured: { diameterIn: 6.5 } },
			phase: 'desk',
			codes: ['diameter_over_limit']
		},
		{
			name: 'measurements wait for the desk',
			plant: { ...miniature, measured: { diameterIn: 7, crowns: 2 } },
			phase: 'entry',
			codes: []
		},
		{
			// single crown: state council show rules 2018 (DOMAIN.md)
			name: 'a single-crown plant with one crown fits',
			plant: { measured: { crowns: 1 } },
			phase: 'desk',
			codes: []
		},
		{
			// single crown: state council show rules 2018 (DOMAIN.md)
			name: 'a single-crown plant with a sucker',
			rules: { habit: 'single_crown' },
			plant: { measured: { crowns: 2 } },
			phase: 'desk',
			codes: ['too_many_crowns']
		},
		{
			// single crown: state council show rules 2018 (DOMAIN.md); species are excepted
			name: 'a species with two crowns',
			rules: { speciesOnly: true },
			plant: { ...species, measured: { crowns: 2 } },
			phase: 'desk',
			codes: []
		},
		{
			name: 'a class that allows two crowns',
			rules: { maxCrowns: 2 },
			plant: { measured: { crowns: 2 } },
			phase: 'desk',
			codes: []
		},
		{
			// trailer: at least 3 crowns, provincial society show schedule 2014 (DOMAIN.md)
			name: 'a 3-crown trailer fits a trailer class',
			rules: { habit: 'trailer' },
			plant: { ...trailer, measured: { crowns: 3 } },
			phase: 'desk',
			codes: []
		},
		{
			// trailer: at least 3 crowns, provincial society show schedule 2014 (DOMAIN.md)
			name: 'a 2-crown trailer is short of crowns',
			rules: { habit: 'trailer' },
			plant: { ...trailer, measured: { crowns: 2 } },
			phase: 'desk',
			codes: ['too_few_crowns']
		},
		{
			// trailer: at least 3 crowns, provincial society show schedule 2014 (DOMAIN.md)
			name: 'a 2-crown trailer is short of crowns in a class open to any habit',
			plant: { ...trailer, measured: { crowns: 2 } },
			phase: 'desk',
			codes: ['too_few_crowns']
		},
		{
			name: 'a class minimum of 5 crowns',
			rules: { habit: 'trailer', minCrowns: 5 },
			plant: { ...trailer, measured: { crowns: 4 } },
			phase: 'desk',
			codes: ['too_few_crowns']
		},
		{
			name: 'a class maximum below the crowns of a trailer',
			rules: { habit: 'trailer', maxCrowns: 6 },
			plant: { ...trailer, measured: { crowns: 7 } },
			phase: 'desk',
			codes: ['too_many_crowns']
		}
	])('$name', (c) => {
		expect(codesOf(c)).toEqual(c.codes);
	});

	it.each([-1, Number.NaN, Number.POSITIVE_INFINITY])('rejects a measured diameter of %s', (d) => {
		const plant = buildPlant({ measured: { diameterIn: d } });
		expect(() =>
			checkEligibility({
				rules: buildRules(),
				plant,
				show: buildShow(),
				exhibitor: buildExhibitor(),
				phase: 'desk'
			})
		).toThrow(RangeError);
	});

	it.each([-1, 1.5])('rejects a crown count of %s', (crowns) => {
		const plant = buildPlant({ measured: { crowns } });
		expect(() =>
			checkEligibility({
				rules: buildRules(),
				plant,
				show: buildShow(),
				exhibitor: buildExhibitor(),
				phase: 'desk'
			})
		).toThrow(RangeError);
	});
});

describe('checkEligibility: collections', () => {
	// collections: three different named varieties of the same type, national convention schedule 2020 (DOMAIN.md)
	const collection: Partial<ClassRules> = { collectionSize: 3 };
	it.each<Case>([
		{
			name: 'three different varieties',
			rules: collection,
			plant: { collectionVarietyIds: ['a', 'b', 'c'] },
			codes: []
		},
		{
			name: 'two varieties',
			rules: collection,
			plant: { collectionVarietyIds: ['a', 'b'] },
			codes: ['collection_wrong_count']
		},
		{
			name: 'no varieties listed',
			rules: collection,
			codes: ['collection_wrong_count']
		},
		{
			name: 'a variety twice among three plants',
			rules: collection,
			plant: { collectionVarietyIds: ['a', 'a', 'b'] },
			codes: ['collection_repeats_variety']
		},
		{
			name: 'four plants, one repeated',
			rules: collection,
			plant: { collectionVarietyIds: ['a', 'b', 'c', 'a'] },
			codes: ['collection_wrong_count', 'collection_repeats_variety']
		},
		{
			name: 'a collection in a single-plant class',
			plant: { collectionVarietyIds: ['a', 'b', 'c'] },
			codes: ['collection_in_single_plant_class']
		}
	])('$name', (c) => {
		expect(codesOf(c)).toEqual(c.codes);
	});
});

describe('checkEligibility: the show and the exhibitor', () => {
	it.each<Case>([
		{
			// possession period 3 months: state council show rules 2018 (DOMAIN.md)
			name: 'grown exactly 3 months on the show day',
			plant: { acquiredOn: '2025-02-17' },
			codes: []
		},
		{
			// possession period 3 months: state council show rules 2018 (DOMAIN.md)
			name: 'one day short of 3 months',
			plant: { acquiredOn: '2025-02-18' },
			codes: ['possession_period_not_reached']
		},
		{
			// possession period 3 months: state council show rules 2018 (DOMAIN.md)
			name: 'no acquired date',
			plant: { acquiredOn: null },
			codes: ['acquired_date_missing']
		},
		{
			name: 'no acquired date when the show has no possession period',
			plant: { acquiredOn: null },
			show: { possessionMonths: 0 },
			codes: []
		},
		{
			name: 'the exhibitor has 1 of 2 allowed entries in the class',
			exhibitor: { entriesInClass: 1 },
			codes: []
		},
		{
			name: 'the exhibitor has 2 of 2 allowed entries in the class',
			exhibitor: { entriesInClass: 2 },
			codes: ['class_entry_limit_reached']
		},
		{
			name: 'the exhibitor already entered this variety once, 1 allowed',
			exhibitor: { entriesOfVariety: 1 },
			codes: ['variety_entry_limit_reached']
		},
		{
			name: 'no limits set',
			show: { maxEntriesPerClass: null, maxEntriesPerVariety: null },
			exhibitor: { entriesInClass: 9, entriesOfVariety: 9 },
			codes: []
		},
		{
			name: 'the same variety again in the class',
			show: { maxEntriesPerVariety: null },
			exhibitor: { varietyAlreadyInClass: true },
			codes: ['variety_already_in_class']
		},
		{
			name: 'not in good standing where the show requires it',
			exhibitor: { inGoodStanding: false },
			codes: ['not_in_good_standing']
		},
		{
			name: 'not in good standing where the show does not ask',
			show: { requireGoodStanding: false },
			exhibitor: { inGoodStanding: false },
			codes: []
		},
		{
			name: 'the day before entries open',
			show: { today: '2025-03-31' },
			codes: ['entries_not_yet_open']
		},
		{ name: 'the day entries open', show: { today: '2025-04-01' }, codes: [] },
		{ name: 'the day entries close', show: { today: '2025-05-10' }, codes: [] },
		{
			name: 'the day after entries close',
			show: { today: '2025-05-11' },
			codes: ['entries_closed']
		},
		{
			name: 'the desk does not look at the entry window',
			show: { today: '2025-05-17' },
			phase: 'desk',
			codes: []
		}
	])('$name', (c) => {
		expect(codesOf(c)).toEqual(c.codes);
	});
});

describe('checkEligibility: everything at once', () => {
	it('reports every failed rule, once each, in a fixed order', () => {
		const result = checkEligibility({
			rules: buildRules({
				habit: 'single_crown',
				sizeClasses: ['miniature'],
				blossomTypes: ['single'],
				blossomColours: ['white'],
				foliage: 'variegated',
				speciesOnly: true,
				collectionSize: 3
			}),
			plant: buildPlant({
				...trailer,
				blossomType: 'double',
				blossomColours: ['purple'],
				acquiredOn: '2025-04-01', // possession period 3 months: state council show rules 2018 (DOMAIN.md)
				measured: { diameterIn: 9, crowns: 2 },
				collectionVarietyIds: ['a', 'a']
			}),
			show: buildShow(),
			exhibitor: buildExhibitor({
				inGoodStanding: false,
				entriesInClass: 2,
				entriesOfVariety: 1,
				varietyAlreadyInClass: true
			}),
			phase: 'desk'
		});
		expect(result.fits).toBe(false);
		expect(result.failures.map((f) => f.code)).toEqual([
			'not_in_good_standing',
			'habit_not_allowed',
			'size_class_not_allowed',
			'diameter_over_limit', // semiminiature up to 8 in: growers' references (DOMAIN.md)
			'too_few_crowns', // trailer: at least 3 crowns, provincial society show schedule 2014 (DOMAIN.md)
			'blossom_type_not_allowed',
			'blossom_colour_not_allowed',
			'foliage_not_allowed',
			'not_a_species',
			'collection_wrong_count', // collections: three different named varieties, national convention schedule 2020 (DOMAIN.md)
			'collection_repeats_variety',
			'possession_period_not_reached', // possession period 3 months: state council show rules 2018 (DOMAIN.md)
			'class_entry_limit_reached',
			'variety_entry_limit_reached',
			'variety_already_in_class'
		]);
	});
});

describe('checkEligibility: messages a grower understands', () => {
	function messageFor(c: Setup): string {
		const result = checkEligibility({
			rules: buildRules(c.rules),
			plant: buildPlant(c.plant),
			show: buildShow(c.show),
			exhibitor: buildExhibitor(c.exhibitor),
			phase: c.phase ?? 'entry'
		});
		expect(result.failures).toHaveLength(1);
		return result.failures[0].message;
	}

	it.each<[string, Setup, string]>([
		[
			// miniature up to 6 in: growers' references (DOMAIN.md)
			'names the measurement and the miniature limit',
			{ plant: { ...miniature, measured: { diameterIn: 6.1 } }, phase: 'desk' },
			'At 6.1 in across, this miniature is over the 6 in limit for a miniature, so it cannot be judged in this class.'
		],
		[
			'names the class limit',
			{ rules: { maxDiameterIn: 12 }, plant: { measured: { diameterIn: 12.5 } }, phase: 'desk' },
			'This class takes plants up to 12 in across, and this plant measures 12.5 in.'
		],
		[
			// miniature up to 6 in (DOMAIN.md); 6 in = 15.24 cm, 6.1 in = 15.494 cm (NIST SP 811)
			'names the lengths in cm first for a society that measures in cm',
			{
				plant: { ...miniature, measured: { diameterIn: 6.1 } },
				show: { lengthUnit: 'cm' },
				phase: 'desk'
			},
			'At 15.5 cm (6.1 in) across, this miniature is over the 15.2 cm (6 in) limit for a miniature, so it cannot be judged in this class.'
		],
		[
			// single crown: state council show rules 2018 (DOMAIN.md)
			'counts the suckers',
			{ plant: { measured: { crowns: 3 } }, phase: 'desk' },
			'A single-crown entry must have only one crown, and this plant has 3, so the 2 suckers must come off before it can be shown in this class.'
		],
		[
			// trailer: at least 3 crowns, provincial society show schedule 2014 (DOMAIN.md)
			'names the trailer minimum',
			{
				rules: { habit: 'trailer' },
				plant: { ...trailer, measured: { crowns: 2 } },
				phase: 'desk'
			},
			'A trailer needs at least 3 crowns to be shown as a trailer, and this plant has 2.'
		],
		[
			'names the habit',
			{ rules: { habit: 'single_crown' }, plant: trailer },
			'This class is for single-crown plants, and "Rob\'s Trailing Example" is a trailer.'
		],
		[
			'names the size classes',
			{ rules: { sizeClasses: ['miniature', 'semiminiature'] } },
			'This class is for miniature or semiminiature plants, and "Pink Lace Morning" is a standard.'
		],
		[
			'names the colors',
			{
				rules: { blossomColours: ['pink', 'coral', 'red'] },
				plant: { blossomColours: ['blue', 'white'] }
			},
			'This class is for pink, coral or red blossoms, and "Pink Lace Morning" has blue and white blossoms.'
		],
		[
			// collections: three different named varieties of the same type, national convention schedule 2020 (DOMAIN.md)
			'names the collection size',
			{ rules: { collectionSize: 3 }, plant: { collectionVarietyIds: ['a', 'b'] } },
			'This collection class takes 3 different named varieties, and this entry has 2 plants.'
		],
		[
			// possession period 3 months: state council show rules 2018 (DOMAIN.md)
			'names the dates of the possession period',
			{ plant: { acquiredOn: '2025-02-18' } },
			'This show asks that you have grown a plant for at least 3 months; you got "Pink Lace Morning" on 18 February 2025, so it qualifies from 18 May 2025, after the show on 17 May 2025.'
		],
		[
			'names the entry limit',
			{ exhibitor: { entriesInClass: 2 } },
			'You already have 2 entries in this class, and the show allows 2 per exhibitor in a class.'
		],
		[
			'names the closing date',
			{ show: { today: '2025-05-11' } },
			'Entries for this show closed on 10 May 2025; today is 11 May 2025.'
		]
	])('%s', (_name, c, expected) => {
		expect(messageFor(c)).toBe(expected);
	});
});

describe('classesThatFit', () => {
	const schedule = [
		{
			id: 'standard',
			rules: buildRules({ habit: 'single_crown', sizeClasses: ['standard', 'large'] })
		},
		{ id: 'semi', rules: buildRules({ habit: 'single_crown', sizeClasses: ['semiminiature'] }) },
		{ id: 'mini', rules: buildRules({ habit: 'single_crown', sizeClasses: ['miniature'] }) },
		{
			id: 'small-trailer',
			rules: buildRules({ habit: 'trailer', sizeClasses: ['miniature', 'semiminiature'] })
		},
		{
			id: 'variegated-mini',
			rules: buildRules({
				habit: 'single_crown',
				sizeClasses: ['miniature'],
				foliage: 'variegated'
			})
		},
		{ id: 'species', rules: buildRules({ speciesOnly: true }) }
	];

	it.each<[string, Partial<PlantFacts>, string[]]>([
		// size classes: growers' references (DOMAIN.md)
		['a miniature of 5.5 in', { ...miniature, measured: { diameterIn: 5.5, crowns: 1 } }, ['mini']],
		// size limit at a show: growers' reference (DOMAIN.md)
		[
			'a miniature of 6.5 in fits none',
			{ ...miniature, measured: { diameterIn: 6.5, crowns: 1 } },
			[]
		],
		[
			'a variegated miniature',
			{ ...miniature, foliage: 'variegated', measured: { diameterIn: 5 } },
			['mini', 'variegated-mini']
		],
		// trailer: at least 3 crowns, provincial society show schedule 2014 (DOMAIN.md)
		['a 4-crown trailer', { ...trailer, measured: { crowns: 4 } }, ['small-trailer']],
		// trailer: at least 3 crowns, provincial society show schedule 2014 (DOMAIN.md)
		['a 2-crown trailer fits none', { ...trailer, measured: { crowns: 2 } }, []],
		['a standard species', { ...species }, ['standard', 'species']]
	])('%s', (_name, plant, expected) => {
		expect(classesThatFit(buildPlant(plant), schedule)).toEqual(expected);
	});

	it('leaves out the classes where the exhibitor already has the variety', () => {
		const plant = buildPlant(miniature);
		const fits = classesThatFit(plant, schedule, {
			show: buildShow(),
			exhibitorIn: (classId) => buildExhibitor({ varietyAlreadyInClass: classId === 'mini' })
		});
		expect(fits).toEqual([]);
	});

	it('checks the entry window only when asked for the entry phase with a show', () => {
		const plant = buildPlant(miniature);
		const late = buildShow({ today: '2025-05-11' });
		expect(classesThatFit(plant, schedule, { show: late })).toEqual(['mini']);
		expect(classesThatFit(plant, schedule, { show: late, phase: 'entry' })).toEqual([]);
	});
});

describe('properties', () => {
	const word = fc.constantFrom('single', 'semidouble', 'double', 'star', 'wasp', 'bell', 'fringed');
	const colour = fc.constantFrom('pink', 'blue', 'white', 'coral', 'purple', 'red');
	const sizeClass = fc.constantFrom<SizeClass>('miniature', 'semiminiature', 'standard', 'large');
	const isoDate = fc
		.date({
			min: new Date('2023-01-01T00:00:00Z'),
			max: new Date('2026-12-31T00:00:00Z'),
			noInvalidDate: true
		})
		.map((d) => formatIsoDate(d));
	const limit = fc.option(fc.integer({ min: 0, max: 5 }), { nil: null });

	const rules: fc.Arbitrary<ClassRules> = fc.record({
		habit: fc.constantFrom('single_crown', 'trailer', 'any'),
		sizeClasses: fc.uniqueArray(sizeClass, { maxLength: 3 }),
		blossomTypes: fc.uniqueArray(word, { maxLength: 3 }),
		blossomColours: fc.uniqueArray(colour, { maxLength: 3 }),
		foliage: fc.constantFrom('plain', 'variegated', 'any'),
		minCrowns: fc.option(fc.integer({ min: 1, max: 6 }), { nil: null }),
		maxCrowns: fc.option(fc.integer({ min: 1, max: 6 }), { nil: null }),
		collectionSize: fc.option(fc.integer({ min: 2, max: 5 }), { nil: null }),
		speciesOnly: fc.boolean(),
		maxDiameterIn: fc.option(fc.double({ min: 2, max: 20, noNaN: true }), { nil: null }),
		possessionMonths: fc.constant(null),
		maxEntriesPerExhibitor: fc.constant(null),
		maxEntriesPerVariety: fc.constant(null),
		maxPotIn: fc.constant(null)
	});
	const plant: fc.Arbitrary<PlantFacts> = fc.record(
		{
			varietyId: fc.constantFrom('a', 'b', 'c'),
			varietyName: fc.constantFrom('Pink Lace Morning', "Rob's Trailing Example", ' ', ''),
			isSpecies: fc.boolean(),
			habit: fc.constantFrom('single_crown', 'trailer'),
			sizeClass,
			blossomType: word,
			blossomColours: fc.uniqueArray(colour, { maxLength: 3 }),
			foliage: fc.constantFrom('plain', 'variegated'),
			acquiredOn: fc.option(isoDate, { nil: null }),
			measured: fc.record(
				{
					diameterIn: fc.double({ min: 0, max: 20, noNaN: true }),
					crowns: fc.integer({ min: 0, max: 8 })
				},
				{ requiredKeys: [] }
			),
			collectionVarietyIds: fc.array(fc.constantFrom('a', 'b', 'c', 'd', 'e'), { maxLength: 6 })
		},
		{
			requiredKeys: [
				'varietyId',
				'varietyName',
				'isSpecies',
				'habit',
				'sizeClass',
				'blossomType',
				'blossomColours',
				'foliage',
				'acquiredOn'
			]
		}
	);
	const show: fc.Arbitrary<ShowContext> = fc.record({
		showDate: isoDate,
		today: isoDate,
		entriesOpen: isoDate,
		entriesClose: isoDate,
		possessionMonths: fc.integer({ min: 0, max: 6 }),
		maxEntriesPerClass: limit,
		maxEntriesPerVariety: limit,
		requireGoodStanding: fc.boolean()
	});
	const exhibitor: fc.Arbitrary<ExhibitorContext> = fc.record({
		inGoodStanding: fc.boolean(),
		entriesInClass: fc.integer({ min: 0, max: 5 }),
		entriesOfVariety: fc.integer({ min: 0, max: 5 }),
		varietyAlreadyInClass: fc.boolean()
	});
	const phase = fc.constantFrom<CheckPhase>('entry', 'desk');
	const input = fc.record({ rules, plant, show, exhibitor, phase });

	it('fits exactly when nothing failed; codes are unique, known and in order', () => {
		fc.assert(
			fc.property(input, (i) => {
				const { fits, failures } = checkEligibility(i);
				const codes = failures.map((f) => f.code);
				expect(fits).toBe(failures.length === 0);
				expect(new Set(codes).size).toBe(codes.length);
				const positions = codes.map((c) => FAILURE_CODES.indexOf(c));
				expect(positions.every((p) => p >= 0)).toBe(true);
				expect(positions).toEqual([...positions].sort((a, b) => a - b));
			})
		);
	});

	it('every message is one plain sentence', () => {
		fc.assert(
			fc.property(input, (i) => {
				for (const { message } of checkEligibility(i).failures) {
					expect(message).toMatch(/^[A-Z].*\.$/s);
					expect(message).not.toMatch(/[\n\r]|undefined|null|NaN/);
				}
			})
		);
	});

	it('the desk never looks at the entry window', () => {
		fc.assert(
			fc.property(input, (i) => {
				const codes = checkEligibility({ ...i, phase: 'desk' }).failures.map((f) => f.code);
				expect(codes).not.toContain('entries_not_yet_open');
				expect(codes).not.toContain('entries_closed');
			})
		);
	});

	it('opening a class to any habit, size, blossom and foliage never adds a failure', () => {
		const open = buildRules();
		fc.assert(
			fc.property(input, (i) => {
				const strict = new Set(checkEligibility(i).failures.map((f) => f.code));
				const { collectionSize, minCrowns, maxCrowns } = i.rules;
				const loose = checkEligibility({
					...i,
					rules: { ...open, collectionSize, minCrowns, maxCrowns }
				});
				for (const { code } of loose.failures) expect(strict).toContain(code);
			})
		);
	});

	it('classesThatFit agrees with checkEligibility', () => {
		fc.assert(
			fc.property(input, (i) => {
				const ids = classesThatFit(i.plant, [{ id: 'x', rules: i.rules }], {
					phase: i.phase,
					show: i.show,
					exhibitorIn: () => i.exhibitor
				});
				expect(ids.length === 1).toBe(checkEligibility(i).fits);
			})
		);
	});
});

describe('sizeClassForDiameter and measuredSizeClass', () => {
	it.each<[number, SizeClass]>([
		// size classes: miniature up to 6 in, semiminiature up to 8 in, standard over 8 in,
		// large 16 in and over: growers' references (DOMAIN.md)
		[5.5, 'miniature'],
		[6, 'miniature'],
		[6.01, 'semiminiature'],
		[8, 'semiminiature'],
		[8.5, 'standard'],
		[15.9, 'standard'],
		[16, 'large'],
		// 1 in = 2.54 cm exactly, NIST SP 811 (DOMAIN.md): 15.24 cm is 6 in
		[toInches(15.24, 'cm'), 'miniature']
	])('a rosette of %s in measures as a %s', (diameter, expected) => {
		expect(sizeClassForDiameter(diameter)).toBe(expected);
	});

	it('refuses a negative diameter', () => {
		expect(() => sizeClassForDiameter(-1)).toThrow(RangeError);
	});

	it.each<[SizeClass, number | undefined, SizeClass]>([
		// a miniature over its 6 in limit (growers' references, DOMAIN.md) is shown by its size
		['miniature', 7, 'semiminiature'],
		['miniature', 9, 'standard'],
		['miniature', 6, 'miniature'],
		['semiminiature', 8.5, 'standard'],
		// never moved down for measuring small; standards have no upper limit
		['standard', 5, 'standard'],
		['standard', 17, 'standard'],
		['miniature', undefined, 'miniature']
	])('a declared %s measured at %s in is shown as a %s', (sizeClass, diameter, expected) => {
		const plant = buildPlant({
			sizeClass,
			measured: diameter === undefined ? undefined : { diameterIn: diameter }
		});
		expect(measuredSizeClass(plant)).toBe(expected);
	});
});

describe('per-class overrides of the show rules, and the largest pot', () => {
	// Possession period 3 months: state council show rules 2018 (DOMAIN.md). Per-class limits and
	// pot limits are settings a show chair makes (common practice); the numbers are examples.
	const check = (s: {
		rules?: Partial<ClassRules>;
		plant?: Partial<PlantFacts>;
		exhibitor?: Partial<ExhibitorContext>;
		phase?: CheckPhase;
	}) =>
		checkEligibility({
			rules: buildRules(s.rules),
			plant: buildPlant(s.plant),
			show: buildShow(),
			exhibitor: buildExhibitor(s.exhibitor),
			phase: s.phase ?? 'entry'
		}).failures.map((f) => f.code);
	const cases: [string, Parameters<typeof check>[0], string[]][] = [
		// acquired 2025-03-01, show 2025-05-17: 2 months 16 days
		[
			'the show asks 3 months: too short',
			{ plant: { acquiredOn: '2025-03-01' } },
			['possession_period_not_reached']
		],
		[
			'the class asks 2 months: enough',
			{ rules: { possessionMonths: 2 }, plant: { acquiredOn: '2025-03-01' } },
			[]
		],
		['the class asks none', { rules: { possessionMonths: 0 }, plant: { acquiredOn: null } }, []],
		[
			'the class asks 12 months',
			{ rules: { possessionMonths: 12 }, plant: { acquiredOn: '2024-06-01' } },
			['possession_period_not_reached']
		],
		[
			'the show allows 2 per class: third refused',
			{ exhibitor: { entriesInClass: 2 } },
			['class_entry_limit_reached']
		],
		[
			'the class allows 3: third taken',
			{ rules: { maxEntriesPerExhibitor: 3 }, exhibitor: { entriesInClass: 2 } },
			[]
		],
		[
			'the class allows 1: second refused',
			{ rules: { maxEntriesPerExhibitor: 1 }, exhibitor: { entriesInClass: 1 } },
			['class_entry_limit_reached']
		],
		[
			'the show allows 1 per variety: second refused',
			{ exhibitor: { entriesOfVariety: 1 } },
			['variety_entry_limit_reached']
		],
		[
			'the class allows 2 per variety',
			{ rules: { maxEntriesPerVariety: 2 }, exhibitor: { entriesOfVariety: 1 } },
			[]
		],
		[
			'pot over the class limit at the desk',
			{ rules: { maxPotIn: 4 }, plant: { measured: { potIn: 4.5 } }, phase: 'desk' },
			['pot_over_limit']
		],
		[
			'pot at the limit at the desk',
			{ rules: { maxPotIn: 4 }, plant: { measured: { potIn: 4 } }, phase: 'desk' },
			[]
		],
		[
			'pot not checked before the desk',
			{ rules: { maxPotIn: 4 }, plant: { measured: { potIn: 6 } } },
			[]
		]
	];
	it.each(cases)('%s', (_, setup, codes) => {
		expect(check(setup)).toEqual(codes);
	});

	it('says it is the class that asks', () => {
		const [failure] = checkEligibility({
			rules: buildRules({ maxEntriesPerExhibitor: 1 }),
			plant: buildPlant(),
			show: buildShow(),
			exhibitor: buildExhibitor({ entriesInClass: 1 }),
			phase: 'entry'
		}).failures;
		expect(failure.message).toBe(
			'You already have 1 entry in this class, and this class allows 1 per exhibitor.'
		);
	});
});
