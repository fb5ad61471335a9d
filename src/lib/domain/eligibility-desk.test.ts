import { describe, expect, it } from 'vitest';
import {
	FAILURE_CODES,
	OPEN_CLASS_RULES,
	checkEligibility,
	deskAdvice,
	measuredSizeClass,
	withDeskAdvice,
	type ClassRules,
	type ExhibitorContext,
	type PlantFacts
} from './eligibility';
import { toInches } from './units';

// The desk's own checks (issue 14): what only a clerk with the plant in hand can see, each with its
// reason and what to do. Check values name their source beside them.

const plant = (over: Partial<PlantFacts> = {}): PlantFacts => ({
	varietyId: 'v-desk',
	varietyName: 'Quiet Harbor Dawn',
	isSpecies: false,
	habit: 'single_crown',
	sizeClass: 'standard',
	blossomType: 'single',
	blossomColours: ['blue'],
	foliage: 'plain',
	acquiredOn: '2024-01-10',
	...over
});

const exhibitor = (over: Partial<ExhibitorContext> = {}): ExhibitorContext => ({
	inGoodStanding: true,
	entriesInClass: 0,
	entriesOfVariety: 0,
	varietyAlreadyInClass: false,
	...over
});

function atDesk(
	rules: Partial<ClassRules>,
	p: Partial<PlantFacts>,
	ex: Partial<ExhibitorContext> = {}
) {
	return withDeskAdvice(
		checkEligibility({
			rules: { ...OPEN_CLASS_RULES, ...rules },
			plant: plant(p),
			show: {
				showDate: '2026-04-18',
				// The desk takes entries after entries closed: the window must not count here.
				today: '2026-04-17',
				entriesOpen: '2026-03-01',
				entriesClose: '2026-04-01',
				possessionMonths: 3, // possession period 3 months: state council show rules 2018 (DOMAIN.md)
				maxEntriesPerClass: 2, // show limits are the chair's settings; 2 is an example (common practice)
				maxEntriesPerVariety: 1,
				requireGoodStanding: true
			},
			exhibitor: exhibitor(ex),
			phase: 'desk'
		})
	);
}

describe('the desk’s checks, with reason and what to do', () => {
	it('measured pot against the class’s largest pot', () => {
		// Pot limits are a class setting the chair makes (common practice); 4 in is an example.
		// Small pots of about 2 to 2 1/4 in for rooted suckers: common practice (DOMAIN.md).
		const over = atDesk({ maxPotIn: 4 }, { measured: { potIn: 5 } });
		expect(over.failures.map((f) => f.code)).toEqual(['pot_over_limit']);
		expect(over.failures[0].message).toBe(
			'This class takes pots up to 4 in across, and this pot measures 5 in.'
		);
		expect(over.failures[0].whatToDo).toMatch(/move it to a class without this pot limit/);
		expect(atDesk({ maxPotIn: 2.25 }, { measured: { potIn: 2.25 } }).fits).toBe(true);
		// 1 in = 2.54 cm exactly: NIST SP 811; 5.715 cm = 2.25 in
		expect(atDesk({ maxPotIn: 2.25 }, { measured: { potIn: toInches(5.715, 'cm') } }).fits).toBe(
			true
		);
	});

	it('measured diameter against the class’s limit and the size class’s', () => {
		// Semiminiature up to 8 in, and one larger is not judged in its class: growers' references (DOMAIN.md)
		const semi = atDesk({}, { sizeClass: 'semiminiature', measured: { diameterIn: 8.5 } });
		expect(semi.failures.map((f) => f.code)).toEqual(['diameter_over_limit']);
		expect(semi.failures[0].whatToDo).toMatch(/class for its measured size/);
		// A class limit below the size class's: the stricter one is named (the chair's setting, an example).
		const strict = atDesk({ maxDiameterIn: 12 }, { measured: { diameterIn: 13 } });
		expect(strict.failures[0].message).toBe(
			'This class takes plants up to 12 in across, and this plant measures 13 in.'
		);
		expect(atDesk({ maxDiameterIn: 12 }, { measured: { diameterIn: 12 } }).fits).toBe(true);
	});

	it('a single-crown plant with a sucker: the sucker comes off, or the plant moves', () => {
		// Every entry except trailers and species must be single-crowned: state council show rules 2018 (DOMAIN.md)
		const sucker = atDesk({}, { measured: { crowns: 2 } });
		expect(sucker.failures.map((f) => f.code)).toEqual(['too_many_crowns']);
		expect(sucker.failures[0].message).toMatch(/the 1 sucker must come off/);
		expect(sucker.failures[0].whatToDo).toMatch(/^The sucker must come off before judging/);
		expect(sucker.failures[0].whatToDo).toMatch(
			/move the plant to a class that takes several crowns/
		);
		// A species is not held to one crown (same source).
		expect(atDesk({}, { isSpecies: true, measured: { crowns: 2 } }).fits).toBe(true);
		// A trailer needs at least 3 crowns: provincial society show schedule 2014 (DOMAIN.md)
		const thinTrailer = atDesk({}, { habit: 'trailer', measured: { crowns: 2 } });
		expect(thinTrailer.failures.map((f) => f.code)).toEqual(['too_few_crowns']);
	});

	it('the class’s limits per exhibitor and per variety count at the desk too', () => {
		// Per-class limits are the chair's settings (common practice); the numbers are examples.
		const perClass = atDesk({ maxEntriesPerExhibitor: 1 }, {}, { entriesInClass: 1 });
		expect(perClass.failures.map((f) => f.code)).toEqual(['class_entry_limit_reached']);
		expect(perClass.failures[0].whatToDo).toMatch(/exhibitor chooses which entries stay/);
		const perVariety = atDesk({ maxEntriesPerVariety: 1 }, {}, { entriesOfVariety: 1 });
		expect(perVariety.failures.map((f) => f.code)).toEqual(['variety_entry_limit_reached']);
		expect(perVariety.failures[0].whatToDo).toMatch(/which entry of this variety is shown/);
		expect(atDesk({ maxEntriesPerVariety: 2 }, {}, { entriesOfVariety: 1 }).fits).toBe(true);
	});

	it('reports every desk failure at once, each with something to do', () => {
		const all = atDesk(
			{ maxPotIn: 4, maxDiameterIn: 10, maxEntriesPerExhibitor: 1 },
			{ measured: { potIn: 6, diameterIn: 11, crowns: 3 } },
			{ entriesInClass: 1 }
		);
		expect(all.failures.map((f) => f.code)).toEqual([
			'diameter_over_limit',
			'pot_over_limit',
			'too_many_crowns',
			'class_entry_limit_reached'
		]);
		for (const f of all.failures) expect(f.whatToDo.length).toBeGreaterThan(20);
	});

	it('a miniature Sinningia by its longest leaf blade; over it, proposed as a standard one', () => {
		// Miniature Sinningia: leaf blade at most 2.5 in (The Gesneriad Society convention show
		// schedule 2018; New England chapter schedule 2022), as in plant-groups.ts
		const mini = {
			plantGroup: 'sinningia',
			growthForm: 'rosette',
			sizeClass: 'miniature' as const,
			varietyName: 'Sinningia pusilla',
			isSpecies: true
		};
		const over = atDesk({}, { ...mini, measured: { diameterIn: 4, leafIn: 3 } });
		expect(over.failures.map((f) => f.code)).toEqual(['leaf_over_limit']);
		expect(over.failures[0].whatToDo).toMatch(/class for its measured size/);
		expect(over.failures[0].whatToDo).toMatch(/scratch it/);
		expect(atDesk({}, { ...mini, measured: { diameterIn: 4, leafIn: 2 } }).fits).toBe(true);
		expect(measuredSizeClass(plant({ ...mini, measured: { diameterIn: 4, leafIn: 3 } }))).toBe(
			'standard'
		);
		expect(measuredSizeClass(plant({ ...mini, measured: { diameterIn: 4, leafIn: 2.5 } }))).toBe(
			'miniature'
		);
	});

	it('has advice for every failure code, ending in a full stop', () => {
		for (const code of FAILURE_CODES) expect(deskAdvice(code)).toMatch(/^[A-Z].*\.$/);
	});
});
