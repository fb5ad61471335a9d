import { describe, expect, it } from 'vitest';
import {
	OPEN_CLASS_RULES,
	SIZE_LIMITS_IN,
	checkEligibility,
	diameterLimitOf,
	measuredSizeClass,
	type ClassRules,
	type FailureCode,
	type PlantFacts
} from './eligibility';
import {
	AFRICAN_VIOLET,
	GROWTH_FORM_CHOICES,
	PLANT_GROUPS,
	checkVarietyGroup,
	describeGroupSize,
	findPlantGroup,
	groupSizeClass,
	habitOfGrowthForm,
	plantGroupOf
} from './plant-groups';

// Sources of the values below:
// [NE2014] The Gesneriad Society New England Chapter show schedule, September 2014
//   (sites.google.com/site/negesneriad): Sinningia species and hybrids "with rosette growth
//   pattern" and "with upright growth pattern"; sections tuberous, rhizomatous (Achimenes,
//   Kohleria, Smithiantha), fibrous-rooted (Columnea, Episcia, Nematanthus); Old World
//   (Aeschynanthus, Petrocosmea, Primulina, Saintpaulia, Streptocarpus).
// [NE2022] the same chapter's 2022 schedule (netgs.org): miniature Sinningia species and
//   cultivars, "leaf blade maximum 2.5 in long"; Saintpaulia miniatures "leaf span maximum
//   6 in", semiminiatures "maximum 8 in".
// [GS2018] The Gesneriad Society convention 2018 flower show schedule: miniature Sinningia
//   "leaf blade maximum 2.5 in long"; Primulina species and Primulina hybrids as classes.

function rules(over: Partial<ClassRules> = {}): ClassRules {
	return { ...OPEN_CLASS_RULES, ...over };
}

/** A species of Sinningia, miniature, rosette: Sinningia pusilla (a real species). */
function sinningia(over: Partial<PlantFacts> = {}): PlantFacts {
	return {
		varietyId: 's-pusilla',
		varietyName: 'Sinningia pusilla',
		isSpecies: true,
		habit: 'single_crown',
		sizeClass: 'miniature',
		blossomType: 'single',
		blossomColours: ['lavender'],
		foliage: 'plain',
		acquiredOn: '2024-01-10',
		plantGroup: 'sinningia',
		growthForm: 'rosette',
		botanicalName: 'Sinningia pusilla',
		...over
	};
}

/** An invented African violet hybrid, miniature single crown. */
function violet(over: Partial<PlantFacts> = {}): PlantFacts {
	return {
		varietyId: 'v-1',
		varietyName: 'Harbor Dawn',
		isSpecies: false,
		habit: 'single_crown',
		sizeClass: 'miniature',
		blossomType: 'double',
		blossomColours: ['pink'],
		foliage: 'plain',
		acquiredOn: '2024-01-10',
		...over
	};
}

function failures(r: ClassRules, plant: PlantFacts, phase: 'entry' | 'desk') {
	return checkEligibility({
		rules: r,
		plant,
		phase,
		show: {
			showDate: '2025-05-17',
			today: '2025-05-05',
			entriesOpen: '2025-04-01',
			entriesClose: '2025-05-10',
			possessionMonths: 0,
			maxEntriesPerClass: null,
			maxEntriesPerVariety: null,
			requireGoodStanding: false
		},
		exhibitor: {
			inGoodStanding: true,
			entriesInClass: 0,
			entriesOfVariety: 0,
			varietyAlreadyInClass: false
		}
	}).failures;
}

function codes(r: ClassRules, plant: PlantFacts, phase: 'entry' | 'desk' = 'entry'): FailureCode[] {
	return failures(r, plant, phase).map((f) => f.code);
}

function messages(r: ClassRules, plant: PlantFacts, phase: 'entry' | 'desk' = 'entry'): string[] {
	return failures(r, plant, phase).map((f) => f.message);
}

describe('the groups as data', () => {
	it('keeps the violet size limits the eligibility module uses', () => {
		const av = plantGroupOf(AFRICAN_VIOLET);
		for (const size of av.sizeClasses) expect(size.maxIn).toBe(SIZE_LIMITS_IN[size.key]);
		// miniature 6 in, semiminiature 8 in [NE2022] and DOMAIN.md growers' references
		expect(groupSizeClass(av, 'miniature')?.maxIn).toBe(6);
		expect(groupSizeClass(av, 'semiminiature')?.maxIn).toBe(8);
	});

	it('measures a miniature Sinningia by its leaf blade, at most 2.5 in [NE2022, GS2018]', () => {
		expect(groupSizeClass(plantGroupOf('sinningia'), 'miniature')).toEqual({
			key: 'miniature',
			measure: 'leaf',
			maxIn: 2.5
		});
		expect(describeGroupSize(groupSizeClass(plantGroupOf('sinningia'), 'miniature')!)).toBe(
			'miniature (leaf blade up to 2.5 in)'
		);
	});

	it('sorts the genera by root type as the schedules do [NE2014]', () => {
		const root = (key: string) => plantGroupOf(key).rootType;
		expect(root('sinningia')).toBe('tuberous');
		for (const g of ['achimenes', 'kohleria', 'smithiantha']) expect(root(g)).toBe('rhizomatous');
		for (const g of ['columnea', 'episcia', 'nematanthus']) expect(root(g)).toBe('fibrous');
		expect(plantGroupOf('sinningia').growthForms).toEqual(['rosette', 'upright']);
	});

	it('gives every group a default size class of its own and distinct keys', () => {
		expect(new Set(PLANT_GROUPS.map((g) => g.key)).size).toBe(PLANT_GROUPS.length);
		for (const g of PLANT_GROUPS) {
			expect(g.growthForms.length).toBeGreaterThan(0);
			expect(g.sizeClasses.some((s) => s.key === 'standard')).toBe(true);
		}
	});

	it('finds a group as people type it', () => {
		expect(findPlantGroup('African violet')?.key).toBe(AFRICAN_VIOLET);
		expect(findPlantGroup('african-violets')?.key).toBe(AFRICAN_VIOLET);
		expect(findPlantGroup(' Sinningia ')?.key).toBe('sinningia');
		expect(findPlantGroup('Begonia')).toBeNull();
		expect(findPlantGroup('')).toBeNull();
	});

	it('maps a growth form to the old habit', () => {
		expect(habitOfGrowthForm('trailer')).toBe('trailer');
		expect(habitOfGrowthForm('trailing')).toBe('trailer');
		expect(habitOfGrowthForm('rosette')).toBe('single_crown');
	});
});

describe('checkVarietyGroup', () => {
	const base = {
		plantGroup: 'sinningia',
		growthForm: 'rosette',
		sizeClass: 'miniature',
		isSpecies: true,
		botanicalName: 'Sinningia pusilla'
	};
	it.each([
		['a fitting species', {}, []],
		['an unknown group', { plantGroup: 'begonia' }, ['plantGroup']],
		['a violet growth form on a Sinningia', { growthForm: 'trailer' }, ['growthForm']],
		['a size class Sinningia has not', { sizeClass: 'semiminiature' }, ['sizeClass']],
		['a species without its botanical name', { botanicalName: null }, ['botanicalName']],
		['a botanical name of another genus', { botanicalName: 'Episcia cupreata' }, ['botanicalName']],
		['a hybrid needs no botanical name', { isSpecies: false, botanicalName: null }, []],
		// African violets are now Streptocarpus sect. Saintpaulia [NE2022, "Sect. Saintpaulia"]
		[
			'a violet species under either name',
			{
				plantGroup: AFRICAN_VIOLET,
				growthForm: 'single_crown',
				sizeClass: 'standard',
				botanicalName: 'Streptocarpus ionanthus'
			},
			[]
		]
	])('%s', (_name, over, fields) => {
		expect(checkVarietyGroup({ ...base, ...over }).map((p) => p.field)).toEqual(fields);
	});
});

describe('checkEligibility: group, genus, growth form and root type', () => {
	it('a class of African violets refuses a Sinningia, and one of other gesneriads a violet', () => {
		expect(codes(rules({ plantKind: 'african_violet' }), sinningia())).toEqual([
			'group_not_allowed'
		]);
		expect(codes(rules({ plantKind: 'other_gesneriad' }), violet())).toEqual(['group_not_allowed']);
		expect(codes(rules({ plantKind: 'other_gesneriad' }), sinningia())).toEqual([]);
		expect(codes(rules({ plantKind: 'african_violet' }), violet())).toEqual([]);
	});

	it('a plant with no group stated is an African violet (older callers)', () => {
		expect(
			codes(rules({ plantKind: 'african_violet' }), violet({ plantGroup: undefined }))
		).toEqual([]);
	});

	it('a genus class takes only its genera, and says what the plant is', () => {
		// "Class 15 Columnea", "Class 16 Episcia, Alsobia" [NE2014]: a class of one genus
		const episcia = sinningia({
			varietyName: 'Copper Meadow',
			isSpecies: false,
			plantGroup: 'episcia',
			growthForm: 'trailing',
			sizeClass: 'standard'
		});
		expect(codes(rules({ genera: ['sinningia'] }), episcia)).toEqual(['genus_not_allowed']);
		expect(messages(rules({ genera: ['sinningia'] }), episcia)).toEqual([
			'This class is for Sinningia, and "Copper Meadow" is an Episcia.'
		]);
		expect(codes(rules({ genera: ['sinningia', 'episcia'] }), episcia)).toEqual([]);
		expect(messages(rules({ genera: ['sinningia'] }), violet())[0]).toBe(
			'This class is for Sinningia, and "Harbor Dawn" is an African violet.'
		);
	});

	it('a growth-form class takes the forms it lists [NE2014: rosette or upright Sinningia]', () => {
		const upright = sinningia({ growthForm: 'upright', sizeClass: 'standard' });
		expect(codes(rules({ growthForms: ['rosette'] }), upright)).toEqual([
			'growth_form_not_allowed'
		]);
		expect(messages(rules({ growthForms: ['rosette'] }), upright)[0]).toBe(
			'This class is for rosette plants, and "Sinningia pusilla" grows as an upright.'
		);
		expect(codes(rules({ growthForms: ['rosette', 'upright'] }), upright)).toEqual([]);
		// a violet's growth form is its habit when none is given
		expect(codes(rules({ growthForms: ['trailer'] }), violet({ habit: 'trailer' }))).toEqual([]);
	});

	it('a root-type class takes its section [NE2014: "Other rhizomatous gesneriads"]', () => {
		const kohleria = sinningia({
			varietyName: 'Kohleria hirsuta',
			botanicalName: 'Kohleria hirsuta',
			plantGroup: 'kohleria',
			growthForm: 'upright',
			sizeClass: 'standard'
		});
		expect(codes(rules({ rootTypes: ['rhizomatous'] }), kohleria)).toEqual([]);
		expect(codes(rules({ rootTypes: ['rhizomatous'] }), sinningia())).toEqual([
			'root_type_not_allowed'
		]);
		expect(messages(rules({ rootTypes: ['rhizomatous'] }), sinningia())[0]).toBe(
			'This class is for rhizomatous gesneriads, and "Sinningia pusilla" is tuberous.'
		);
	});

	it('species only refuses a named hybrid of the genus [GS2018: Primulina species / hybrids]', () => {
		const hybrid = sinningia({
			varietyName: 'Little Lantern',
			isSpecies: false,
			botanicalName: null
		});
		const r = rules({ genera: ['sinningia'], speciesOnly: true, sizeClasses: ['miniature'] });
		expect(codes(r, hybrid)).toEqual(['not_a_species']);
		expect(codes(r, sinningia())).toEqual([]);
	});
});

describe('checkEligibility: the size of a gesneriad at the desk', () => {
	it('a miniature Sinningia is held to its leaf blade of 2.5 in, not the violet 6 in span', () => {
		const r = rules({ genera: ['sinningia'], sizeClasses: ['miniature'] });
		// 2.5 in leaf blade: miniature Sinningia limit [NE2022, GS2018]
		expect(codes(r, sinningia({ measured: { leafIn: 2.5 } }), 'desk')).toEqual([]);
		expect(codes(r, sinningia({ measured: { leafIn: 2.75 } }), 'desk')).toEqual([
			'leaf_over_limit'
		]);
		expect(messages(r, sinningia({ measured: { leafIn: 2.75 } }), 'desk')[0]).toBe(
			'A miniature Sinningia has leaf blades up to 2.5 in long, and the longest leaf blade of this plant measures 2.75 in, so it cannot be judged in this class.'
		);
		// A Sinningia pusilla across 7 in is not over a violet's 6 in (its size is its leaf)
		expect(codes(r, sinningia({ measured: { diameterIn: 7 } }), 'desk')).toEqual([]);
		expect(diameterLimitOf(sinningia())).toBeNull();
		expect(measuredSizeClass(sinningia({ measured: { diameterIn: 7 } }))).toBe('miniature');
	});

	it('the leaf is not measured at entry time, only at the desk', () => {
		expect(codes(rules(), sinningia({ measured: { leafIn: 4 } }), 'entry')).toEqual([]);
	});

	it('a miniature violet keeps its 6 in span limit (DOMAIN.md: growers’ references)', () => {
		expect(codes(rules(), violet({ measured: { diameterIn: 6.5 } }), 'desk')).toEqual([
			'diameter_over_limit'
		]);
		expect(diameterLimitOf(violet())).toBe(6);
	});

	it('the violet crown rules do not apply to other gesneriads (common practice)', () => {
		// a single-crown violet with a sucker has 2 crowns (DOMAIN.md: state council show rules 2018)
		expect(codes(rules(), violet({ measured: { crowns: 2 } }), 'desk')).toEqual([
			'too_many_crowns'
		]);
		const streptocarpus = sinningia({
			varietyName: 'Evening Ribbon',
			isSpecies: false,
			plantGroup: 'streptocarpus',
			growthForm: 'rosette',
			sizeClass: 'standard'
		});
		expect(codes(rules(), { ...streptocarpus, measured: { crowns: 4 } }, 'desk')).toEqual([]);
		const columnea = { ...streptocarpus, plantGroup: 'columnea', growthForm: 'trailing' };
		expect(
			codes(rules(), { ...columnea, habit: 'trailer' as const, measured: { crowns: 1 } }, 'desk')
		).toEqual([]);
	});

	it('refuses a negative leaf measurement as input no form lets through', () => {
		expect(() => codes(rules(), sinningia({ measured: { leafIn: -1 } }), 'desk')).toThrow(
			RangeError
		);
	});
});

describe('growth forms as choices', () => {
	it.each([
		// Common practice: African violets are shown as single crowns or trailers.
		['single_crown', 'Single crown'],
		['trailer', 'Trailer'],
		// Common practice: a unifoliate Streptocarpus grows a single leaf.
		['unifoliate', 'Unifoliate (one leaf)'],
		['rosette', 'Rosette']
	])('%s reads "%s"', (form, words) => {
		expect(GROWTH_FORM_CHOICES[form]).toBe(words);
	});
});
