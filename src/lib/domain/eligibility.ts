/**
 * Whether a plant can be entered in a show class, and if not, why.
 *
 * One module for the entry form, the API and the clerks' entry desk, so that
 * all three say the same thing. Every rule that fails is reported (not only the
 * first), each with a stable code for programs and one plain sentence for the
 * grower. Lengths here are inches; convert measurements with `units.ts` first.
 */

import {
	compareIsoDates,
	formatDateLong,
	hasPossessionPeriod,
	possessionReachedOn,
	type IsoDate
} from './dates';
import { formatLengthBoth, type LengthUnit } from './units';
import {
	AFRICAN_VIOLET,
	GROWTH_FORM_LABELS,
	ROOT_TYPE_LABELS,
	groupSizeClass,
	isPlantGroup,
	plantGroupOf,
	type GroupSizeClass,
	type RootType
} from './plant-groups';

/** How a variety grows: a single rosette, or several crowns from one main stem. */
export type Habit = 'single_crown' | 'trailer';

/** Size class of a variety, by the diameter of a mature single crown. */
export type SizeClass = 'miniature' | 'semiminiature' | 'standard' | 'large';

/** Leaf colouring of a variety. */
export type Foliage = 'plain' | 'variegated';

/**
 * When the check runs: 'entry' when an exhibitor enters a plant before the show
 * (the entry window applies, measurements are not yet trusted), 'desk' when a
 * clerk checks the plant in (the window no longer applies, measurements count).
 */
export type CheckPhase = 'entry' | 'desk';

/** What a show class accepts, in structured form. An empty list or null means "any". */
export interface ClassRules {
	habit: Habit | 'any';
	/** Empty = any size class. */
	sizeClasses: SizeClass[];
	/** Empty = any, e.g. 'single', 'semidouble', 'double', 'star', 'wasp', 'bell', 'fringed'. */
	blossomTypes: string[];
	/** Empty = any; a variety fits when any one of its colors is listed. */
	blossomColours: string[];
	foliage: Foliage | 'any';
	/** Null = no minimum, except that a trailer needs `TRAILER_MIN_CROWNS`. */
	minCrowns: number | null;
	/** Null = no maximum, except that a single-crown hybrid needs exactly one crown. */
	maxCrowns: number | null;
	/** A collection class: this many different named varieties of the same type. Null = one plant. */
	collectionSize: number | null;
	speciesOnly: boolean;
	/** Explicit diameter limit in inches; the plant's own size-class limit applies as well. */
	maxDiameterIn: number | null;
	/** This class's possession period in months; null = the show's. */
	possessionMonths: number | null;
	/** Entries one exhibitor may have in this class; null = the show's limit. */
	maxEntriesPerExhibitor: number | null;
	/** Entries one exhibitor may have of one variety, for an entry in this class; null = the show's. */
	maxEntriesPerVariety: number | null;
	/**
	 * Largest pot, inches across the rim; null = none stated. Checked only at the desk, where a
	 * pot measurement is given (`measured.potIn`).
	 */
	maxPotIn: number | null;
	/** African violets, the other gesneriads, or any (absent: any). */
	plantKind?: PlantKind;
	/** Gesneriad genus groups the class takes (keys of `PLANT_GROUPS`); empty or absent = any. */
	genera?: string[];
	/** Growth forms the class takes (`GROWTH_FORM_LABELS`); empty or absent = any. */
	growthForms?: string[];
	/** Root types the class takes; empty or absent = any. */
	rootTypes?: RootType[];
}

/** Which side of the family a class is for: African violets, or the other gesneriads. */
export type PlantKind = 'any' | 'african_violet' | 'other_gesneriad';

/** A class with no rule of its own: every plant fits it (only the plant's size limit applies). */
export const OPEN_CLASS_RULES: Readonly<ClassRules> = {
	habit: 'any',
	sizeClasses: [],
	blossomTypes: [],
	blossomColours: [],
	foliage: 'any',
	minCrowns: null,
	maxCrowns: null,
	collectionSize: null,
	speciesOnly: false,
	maxDiameterIn: null,
	possessionMonths: null,
	maxEntriesPerExhibitor: null,
	maxEntriesPerVariety: null,
	maxPotIn: null,
	plantKind: 'any',
	genera: [],
	growthForms: [],
	rootTypes: []
};

/** What is known about the plant (or collection) being entered. */
export interface PlantFacts {
	varietyId: string;
	varietyName: string;
	isSpecies: boolean;
	habit: Habit;
	sizeClass: SizeClass;
	blossomType: string;
	blossomColours: string[];
	foliage: Foliage;
	/** The day the exhibitor got the plant; null when not known. */
	acquiredOn: IsoDate | null;
	/**
	 * What the clerks measured at the desk (used in phase 'desk' only).
	 * For a collection, give the largest diameter and crown count among its plants.
	 */
	measured?: { diameterIn?: number; crowns?: number; potIn?: number; leafIn?: number };
	/** For a collection entry: the variety of every plant in it, one id per plant. */
	collectionVarietyIds?: string[];
	/** The variety's group (`PLANT_GROUPS`); absent: an African violet. */
	plantGroup?: string;
	/** The variety's growth form; absent: its habit. */
	growthForm?: string;
	/** A species' botanical name, for messages. */
	botanicalName?: string | null;
}

/** The show's dates and limits, as the show chair set them. */
export interface ShowContext {
	showDate: IsoDate;
	today: IsoDate;
	/**
	 * The unit the society reads lengths in. Inches (the default) keep the messages in inches;
	 * centimeters put cm first with inches in brackets.
	 */
	lengthUnit?: LengthUnit;
	/** First day entries are taken (included). */
	entriesOpen: IsoDate;
	/** Last day entries are taken (included). */
	entriesClose: IsoDate;
	/** Months the exhibitor must have grown the plant by the show date; 0 = no such rule. */
	possessionMonths: number;
	/** Entries one exhibitor may have in one class; null = no limit. */
	maxEntriesPerClass: number | null;
	/** Entries one exhibitor may have of one variety in the whole show; null = no limit. */
	maxEntriesPerVariety: number | null;
	requireGoodStanding: boolean;
}

/** The exhibitor's standing and existing entries, not counting the entry being checked. */
export interface ExhibitorContext {
	inGoodStanding: boolean;
	/** The exhibitor's other entries in this class. */
	entriesInClass: number;
	/** The exhibitor's other entries of this variety in the whole show. */
	entriesOfVariety: number;
	/** The exhibitor already has another entry of this variety in this class. */
	varietyAlreadyInClass: boolean;
}

/** Every failure code, in the order failures are reported. */
export const FAILURE_CODES = [
	'entries_not_yet_open',
	'entries_closed',
	'not_in_good_standing',
	'group_not_allowed',
	'genus_not_allowed',
	'growth_form_not_allowed',
	'root_type_not_allowed',
	'leaf_over_limit',
	'habit_not_allowed',
	'size_class_not_allowed',
	'diameter_over_limit',
	'pot_over_limit',
	'too_many_crowns',
	'too_few_crowns',
	'blossom_type_not_allowed',
	'blossom_colour_not_allowed',
	'foliage_not_allowed',
	'not_a_species',
	'collection_wrong_count',
	'collection_repeats_variety',
	'collection_in_single_plant_class',
	'acquired_date_missing',
	'possession_period_not_reached',
	'class_entry_limit_reached',
	'variety_entry_limit_reached',
	'variety_already_in_class'
] as const;

/** A stable identifier of one eligibility rule that failed. */
export type FailureCode = (typeof FAILURE_CODES)[number];

/** One failed rule: a stable code, and one plain sentence naming the numbers involved. */
export interface RuleFailure {
	code: FailureCode;
	message: string;
}

/** Everything `checkEligibility` needs. */
export interface EligibilityInput {
	rules: ClassRules;
	plant: PlantFacts;
	show: ShowContext;
	exhibitor: ExhibitorContext;
	phase: CheckPhase;
}

/** The verdict: `fits` is true exactly when `failures` is empty. */
export interface EligibilityResult {
	fits: boolean;
	failures: RuleFailure[];
}

/** A class of the schedule, as `classesThatFit` needs it. */
export interface ClassToTry {
	id: string;
	rules: ClassRules;
}

/** Optional context for `classesThatFit`; what is left out is not checked. */
export interface ClassesThatFitOptions {
	/** Defaults to 'desk', where moves are proposed. */
	phase?: CheckPhase;
	/** When given, the show rules (entry window, possession, limits) are checked too. */
	show?: ShowContext;
	/** When given, the exhibitor rules are checked too, with the exhibitor's entries in that class. */
	exhibitorIn?: (classId: string) => ExhibitorContext;
}

/** Largest diameter, in inches, of a mature single crown of each size class; null = no upper limit. */
export const SIZE_LIMITS_IN: Readonly<Record<SizeClass, number | null>> = {
	miniature: 6,
	semiminiature: 8,
	standard: null,
	large: null
};

/** Fewest crowns a plant must have to be shown as a trailer. */
export const TRAILER_MIN_CROWNS = 3;

/** Crowns allowed on an entry shown as a single crown (a sucker is a second crown). */
export const SINGLE_CROWN_MAX_CROWNS = 1;

/** Measurements are rounded off in conversion; a difference this small is not "over". */
const LENGTH_TOLERANCE_IN = 1e-9;

const SIZE_CLASS_NAMES: Readonly<Record<SizeClass, string>> = {
	miniature: 'miniature',
	semiminiature: 'semiminiature',
	standard: 'standard',
	large: 'large'
};

/**
 * The largest diameter, in inches, at which a plant of a size class may still
 * be judged in its class (miniature 6, semiminiature 8); null when the size
 * class has no upper limit.
 */
export function sizeLimitIn(sizeClass: SizeClass): number | null {
	if (!Object.hasOwn(SIZE_LIMITS_IN, sizeClass)) {
		throw new RangeError(`Unknown size class '${String(sizeClass)}'.`);
	}
	return SIZE_LIMITS_IN[sizeClass];
}

/** Diameter, in inches, from which a rosette counts as large. */
export const LARGE_FROM_IN = 16;

/**
 * The size class that a rosette of this diameter (inches) measures as: up to 6 in a miniature,
 * up to 8 in a semiminiature, 16 in and over large, otherwise standard. Used at the desk to
 * propose classes for a plant that has outgrown its declared size class.
 */
export function sizeClassForDiameter(diameterIn: number): SizeClass {
	assertMeasure('diameter', diameterIn);
	const within = (limit: number | null) =>
		limit !== null && diameterIn <= limit + LENGTH_TOLERANCE_IN;
	if (within(SIZE_LIMITS_IN.miniature)) return 'miniature';
	if (within(SIZE_LIMITS_IN.semiminiature)) return 'semiminiature';
	return diameterIn >= LARGE_FROM_IN - LENGTH_TOLERANCE_IN ? 'large' : 'standard';
}

/**
 * The size class a plant can be shown as once measured: its declared size class, unless the
 * measured diameter (or, for a size class measured by the leaf, the longest leaf blade) is over
 * that size class's limit, in which case the size class of the measurement. A plant is never
 * moved down because it measures small.
 */
export function measuredSizeClass(plant: PlantFacts): SizeClass {
	const byLeaf = leafSizeClass(plant);
	if (byLeaf) return byLeaf;
	const diameter = plant.measured?.diameterIn;
	const limit = diameterLimitOf(plant);
	if (diameter === undefined || limit === null || diameter <= limit + LENGTH_TOLERANCE_IN) {
		return plant.sizeClass;
	}
	return sizeClassForDiameter(diameter);
}

/**
 * Decides whether a plant (or collection) may be entered in a show class, and
 * returns every rule it fails, in the order of `FAILURE_CODES`. In phase
 * 'entry' the entry window is checked and measurements are ignored; in phase
 * 'desk' the window is skipped and the clerks' measurements are checked.
 * Throws a RangeError for input no form should let through (a bad date, a
 * negative measurement).
 */
export function checkEligibility(input: EligibilityInput): EligibilityResult {
	const { rules, plant, show, exhibitor, phase } = input;
	return toResult(collectFailures(rules, plant, phase, show, exhibitor));
}

/**
 * Lists the ids of the classes a plant fits, in the order given, so the desk
 * can propose where to move a misclassified entry. Show and exhibitor rules
 * are checked only when their context is given.
 */
export function classesThatFit(
	plant: PlantFacts,
	classes: readonly ClassToTry[],
	options: ClassesThatFitOptions = {}
): string[] {
	const phase = options.phase ?? 'desk';
	return classes
		.filter(
			(showClass) =>
				collectFailures(
					showClass.rules,
					plant,
					phase,
					options.show,
					options.exhibitorIn?.(showClass.id)
				).length === 0
		)
		.map((showClass) => showClass.id);
}

function toResult(failures: RuleFailure[]): EligibilityResult {
	const order = (code: FailureCode) => FAILURE_CODES.indexOf(code);
	const sorted = [...failures].sort((a, b) => order(a.code) - order(b.code));
	return { fits: sorted.length === 0, failures: sorted };
}

function collectFailures(
	rules: ClassRules,
	plant: PlantFacts,
	phase: CheckPhase,
	show: ShowContext | undefined,
	exhibitor: ExhibitorContext | undefined
): RuleFailure[] {
	const failures: RuleFailure[] = [];
	const fail = (code: FailureCode, message: string) => failures.push({ code, message });
	const name = quoted(plant.varietyName);

	// The show and the exhibitor
	if (show && phase === 'entry') {
		if (compareIsoDates(show.today, show.entriesOpen) < 0) {
			fail(
				'entries_not_yet_open',
				`Entries for this show open on ${formatDateLong(show.entriesOpen)}; today is ${formatDateLong(show.today)}.`
			);
		} else if (compareIsoDates(show.today, show.entriesClose) > 0) {
			fail(
				'entries_closed',
				`Entries for this show closed on ${formatDateLong(show.entriesClose)}; today is ${formatDateLong(show.today)}.`
			);
		}
	}
	if (show?.requireGoodStanding && exhibitor && !exhibitor.inGoodStanding) {
		fail(
			'not_in_good_standing',
			'This show is open only to members in good standing, so please renew your membership with the society before entering.'
		);
	}

	// The plant against the class
	if (rules.habit !== 'any' && rules.habit !== plant.habit) {
		fail(
			'habit_not_allowed',
			rules.habit === 'trailer'
				? `This class is for trailers, and ${name} is a single-crown variety.`
				: `This class is for single-crown plants, and ${name} is a trailer.`
		);
	}
	if (rules.sizeClasses.length > 0 && !rules.sizeClasses.includes(plant.sizeClass)) {
		fail(
			'size_class_not_allowed',
			`This class is for ${listOf(
				rules.sizeClasses.map((s) => SIZE_CLASS_NAMES[s]),
				'or'
			)} plants, and ${name} is a ${SIZE_CLASS_NAMES[plant.sizeClass]}.`
		);
	}
	if (phase === 'desk') {
		checkMeasurements(rules, plant, fail, show?.lengthUnit ?? 'in');
	}
	if (
		rules.blossomTypes.length > 0 &&
		!rules.blossomTypes.some((t) => sameWord(t, plant.blossomType))
	) {
		fail(
			'blossom_type_not_allowed',
			plant.blossomType.trim()
				? `This class is for ${listOf(rules.blossomTypes, 'or')} blossoms, and ${name} has ${plant.blossomType.trim()} blossoms.`
				: `This class is for ${listOf(rules.blossomTypes, 'or')} blossoms, and no blossom type is recorded for ${name}.`
		);
	}
	if (
		rules.blossomColours.length > 0 &&
		!plant.blossomColours.some((c) => rules.blossomColours.some((allowed) => sameWord(allowed, c)))
	) {
		fail(
			'blossom_colour_not_allowed',
			plant.blossomColours.length > 0
				? `This class is for ${listOf(rules.blossomColours, 'or')} blossoms, and ${name} has ${listOf(plant.blossomColours, 'and')} blossoms.`
				: `This class is for ${listOf(rules.blossomColours, 'or')} blossoms, and no blossom color is recorded for ${name}.`
		);
	}
	if (rules.foliage !== 'any' && rules.foliage !== plant.foliage) {
		fail(
			'foliage_not_allowed',
			`This class is for ${rules.foliage} foliage, and ${name} has ${plant.foliage} foliage.`
		);
	}
	if (rules.speciesOnly && !plant.isSpecies) {
		fail('not_a_species', `This class is for species only, and ${name} is a hybrid.`);
	}
	checkCollection(rules, plant, fail);
	checkGroupRules(rules, plant, phase, fail, show?.lengthUnit ?? 'in');

	// How long the exhibitor has grown it (the class's own period, else the show's)
	const possessionMonths = show ? (rules.possessionMonths ?? show.possessionMonths) : 0;
	if (show && possessionMonths > 0) {
		const months = count(possessionMonths, 'month', 'months');
		const asker = rules.possessionMonths === null ? 'this show asks' : 'this class asks';
		if (plant.acquiredOn === null) {
			fail(
				'acquired_date_missing',
				`Please give the date you got ${name}, because ${asker} that you have grown a plant for at least ${months}.`
			);
		} else if (!hasPossessionPeriod(plant.acquiredOn, show.showDate, possessionMonths)) {
			const reached = possessionReachedOn(plant.acquiredOn, possessionMonths);
			fail(
				'possession_period_not_reached',
				`${asker[0].toUpperCase()}${asker.slice(1)} that you have grown a plant for at least ${months}; you got ${name} on ${formatDateLong(plant.acquiredOn)}, so it qualifies from ${formatDateLong(reached)}, after the show on ${formatDateLong(show.showDate)}.`
			);
		}
	}

	// The exhibitor's other entries (the class's own limits, else the show's)
	if (show && exhibitor) {
		const perClass = rules.maxEntriesPerExhibitor ?? show.maxEntriesPerClass;
		const perVariety = rules.maxEntriesPerVariety ?? show.maxEntriesPerVariety;
		if (perClass !== null && exhibitor.entriesInClass >= perClass) {
			const limit =
				rules.maxEntriesPerExhibitor === null
					? `the show allows ${perClass} per exhibitor in a class`
					: `this class allows ${perClass} per exhibitor`;
			fail(
				'class_entry_limit_reached',
				`You already have ${count(exhibitor.entriesInClass, 'entry', 'entries')} in this class, and ${limit}.`
			);
		}
		if (perVariety !== null && exhibitor.entriesOfVariety >= perVariety) {
			const who = rules.maxEntriesPerVariety === null ? 'the show allows' : 'this class allows';
			fail(
				'variety_entry_limit_reached',
				`You already have ${count(exhibitor.entriesOfVariety, 'entry', 'entries')} of ${name} in this show, and ${who} ${perVariety} of each variety per exhibitor.`
			);
		}
	}
	if (exhibitor?.varietyAlreadyInClass) {
		fail(
			'variety_already_in_class',
			`You already have ${name} in this class, and each variety may be entered only once in a class.`
		);
	}

	return failures;
}

function checkMeasurements(
	rules: ClassRules,
	plant: PlantFacts,
	fail: (code: FailureCode, message: string) => void,
	unit: LengthUnit
): void {
	const inches = (value: number) => lengthWords(value, unit);
	const diameter = plant.measured?.diameterIn;
	if (diameter !== undefined) {
		assertMeasure('diameter', diameter);
		const kind = SIZE_CLASS_NAMES[plant.sizeClass];
		const ownLimit = diameterLimitOf(plant);
		const limits: { limit: number; message: string }[] = [];
		if (ownLimit !== null) {
			limits.push({
				limit: ownLimit,
				message: `At ${inches(diameter)} across, this ${kind} is over the ${inches(ownLimit)} limit for a ${kind}, so it cannot be judged in this class.`
			});
		}
		if (rules.maxDiameterIn !== null) {
			limits.push({
				limit: rules.maxDiameterIn,
				message: `This class takes plants up to ${inches(rules.maxDiameterIn)} across, and this plant measures ${inches(diameter)}.`
			});
		}
		const exceeded = limits
			.filter(({ limit }) => diameter > limit + LENGTH_TOLERANCE_IN)
			.sort((a, b) => a.limit - b.limit)[0];
		if (exceeded) fail('diameter_over_limit', exceeded.message);
	}

	const pot = plant.measured?.potIn;
	if (pot !== undefined) {
		assertMeasure('pot size', pot);
		if (rules.maxPotIn !== null && pot > rules.maxPotIn + LENGTH_TOLERANCE_IN) {
			fail(
				'pot_over_limit',
				`This class takes pots up to ${inches(rules.maxPotIn)} across, and this pot measures ${inches(pot)}.`
			);
		}
	}

	const crowns = plant.measured?.crowns;
	if (crowns !== undefined) {
		assertMeasure('crown count', crowns);
		if (!Number.isInteger(crowns)) {
			throw new RangeError(`A crown count must be a whole number, not ${crowns}.`);
		}
		const singleCrown =
			plant.habit === 'single_crown' && !plant.isSpecies && isAfricanViolet(plant);
		const maxCrowns = rules.maxCrowns ?? (singleCrown ? SINGLE_CROWN_MAX_CROWNS : null);
		const trailer = plant.habit === 'trailer' && isAfricanViolet(plant);
		const minCrowns = rules.minCrowns ?? (trailer ? TRAILER_MIN_CROWNS : null);
		if (maxCrowns !== null && crowns > maxCrowns) {
			fail(
				'too_many_crowns',
				rules.maxCrowns === null
					? `A single-crown entry must have only one crown, and this plant has ${crowns}, so the ${count(crowns - 1, 'sucker', 'suckers')} must come off before it can be shown in this class.`
					: `This class allows at most ${count(maxCrowns, 'crown', 'crowns')}, and this plant has ${crowns}.`
			);
		}
		if (minCrowns !== null && crowns < minCrowns) {
			fail(
				'too_few_crowns',
				rules.minCrowns === null
					? `A trailer needs at least ${count(minCrowns, 'crown', 'crowns')} to be shown as a trailer, and this plant has ${crowns}.`
					: `This class needs at least ${count(minCrowns, 'crown', 'crowns')}, and this plant has ${crowns}.`
			);
		}
	}
}

function checkCollection(
	rules: ClassRules,
	plant: PlantFacts,
	fail: (code: FailureCode, message: string) => void
): void {
	const ids = plant.collectionVarietyIds ?? [];
	if (rules.collectionSize === null) {
		if (ids.length > 1) {
			fail(
				'collection_in_single_plant_class',
				`This class takes a single plant, and this entry is a collection of ${ids.length} plants.`
			);
		}
		return;
	}
	const size = rules.collectionSize;
	const different = new Set(ids).size;
	if (ids.length !== size) {
		fail(
			'collection_wrong_count',
			`This collection class takes ${size} different named varieties, and this entry has ${count(ids.length, 'plant', 'plants')}.`
		);
	}
	if (different < ids.length) {
		fail(
			'collection_repeats_variety',
			`A collection must be made of different named varieties, and this entry has ${count(ids.length, 'plant', 'plants')} of only ${count(different, 'variety', 'varieties')}.`
		);
	}
}

function assertMeasure(what: string, value: number): void {
	if (!Number.isFinite(value) || value < 0) {
		throw new RangeError(
			`A measured ${what} must be a finite number of zero or more, not ${value}.`
		);
	}
}

function sameWord(a: string, b: string): boolean {
	const plain = (s: string) => s.toLowerCase().replace(/[\s_-]+/g, '');
	return plain(a) === plain(b);
}

function quoted(varietyName: string): string {
	const trimmed = varietyName.trim();
	return trimmed ? `"${trimmed}"` : 'this variety';
}

function lengthWords(value: number, unit: LengthUnit): string {
	return unit === 'cm' ? formatLengthBoth(value, 'cm') : `${Number(value.toFixed(2))} in`;
}

function count(n: number, one: string, many: string): string {
	return `${n} ${n === 1 ? one : many}`;
}

function listOf(items: readonly string[], joiner: 'and' | 'or'): string {
	if (items.length <= 1) return items.join('');
	return `${items.slice(0, -1).join(', ')} ${joiner} ${items[items.length - 1]}`;
}

// ---------------------------------------------------------------------------------------------
// The entry desk: what the clerk does about each failed rule (issue 14). Kept apart from the
// checks above; a code without desk advice of its own gets the general advice.

/** A failed rule as the desk shows it: the reason, and what to do about it. */
export interface DeskFailure extends RuleFailure {
	whatToDo: string;
}

/** The desk's verdict: the check's result with what to do for every failure. */
export interface DeskVerdict {
	fits: boolean;
	failures: DeskFailure[];
}

const DESK_ADVICE: Partial<Record<FailureCode, string>> = {
	diameter_over_limit:
		'Move the entry to a class for its measured size (the classes that fit are listed), or scratch it if none fits.',
	leaf_over_limit:
		'The leaf blades are too long for this size class: move the entry to a class for its measured size (the classes that fit are listed), or scratch it if none fits.',
	pot_over_limit:
		'The plant cannot be shown in this pot in this class: move it to a class without this pot limit, or scratch it.',
	too_many_crowns:
		'The sucker must come off before judging: the exhibitor removes it and the clerk counts the crowns again. Otherwise move the plant to a class that takes several crowns.',
	too_few_crowns:
		'Move the plant to a class for single crowns, or scratch it; a trailer cannot gain crowns on the day.',
	size_class_not_allowed:
		'Move the entry to a class for its size (the classes that fit are listed).',
	habit_not_allowed: 'Move the entry to a class for its habit (the classes that fit are listed).',
	class_entry_limit_reached:
		'The exhibitor chooses which entries stay in this class; move the others to another class that fits, or scratch them.',
	variety_entry_limit_reached:
		'The exhibitor chooses which entry of this variety is shown; scratch the others.',
	variety_already_in_class:
		'Move one of the two plants of this variety to another class that fits, or scratch it.',
	acquired_date_missing:
		'Ask the exhibitor when they got the plant and record it; without it the plant cannot be shown.',
	possession_period_not_reached:
		'The plant has not been grown long enough for this show: scratch the entry (it may be shown next time).',
	not_in_good_standing:
		'The exhibitor renews their membership with the society (at the desk or online) before the plant is shown.'
};

const GENERAL_DESK_ADVICE =
	'Move the entry to a class that fits (the classes that fit are listed), or scratch it.';

/** What the desk does about one failed rule. */
export function deskAdvice(code: FailureCode): string {
	return DESK_ADVICE[code] ?? GENERAL_DESK_ADVICE;
}

/** Adds what to do to every failure of a check run at the desk. */
export function withDeskAdvice(result: EligibilityResult): DeskVerdict {
	return {
		fits: result.fits,
		failures: result.failures.map((f) => ({ ...f, whatToDo: deskAdvice(f.code) }))
	};
}

// Groups of the gesneriad family (African violets, or a genus), growth forms and root types.

/** Whether a plant is an African violet (a plant of no stated group is one). */
export function isAfricanViolet(plant: Pick<PlantFacts, 'plantGroup'>): boolean {
	return (plant.plantGroup ?? AFRICAN_VIOLET) === AFRICAN_VIOLET;
}

/** A plant's growth form: the one given, else its habit. */
export function growthFormOf(plant: Pick<PlantFacts, 'growthForm' | 'habit'>): string {
	return plant.growthForm ?? plant.habit;
}

/**
 * The largest diameter, in inches, of a plant's size class in its group; null when the size
 * class has no upper limit or is measured by another part than the span (miniature Sinningia by
 * the leaf blade). African violets keep `sizeLimitIn`.
 */
export function diameterLimitOf(
	plant: Pick<PlantFacts, 'plantGroup' | 'sizeClass'>
): number | null {
	if (isAfricanViolet(plant)) return sizeLimitIn(plant.sizeClass);
	const size = groupSizeClass(groupOf(plant), plant.sizeClass);
	return size && size.measure === 'diameter' ? size.maxIn : null;
}

/**
 * For a plant of a size class measured by the leaf whose longest leaf blade is over the limit:
 * the first larger size class of its group that the measurements fit (a miniature Sinningia
 * with long leaves is a standard one). Null otherwise.
 */
function leafSizeClass(plant: PlantFacts): SizeClass | null {
	const leaf = plant.measured?.leafIn;
	if (leaf === undefined || isAfricanViolet(plant)) return null;
	const group = groupOf(plant);
	const at = group.sizeClasses.findIndex((s) => s.key === plant.sizeClass);
	const size = group.sizeClasses[at];
	if (!size || size.measure !== 'leaf' || size.maxIn === null) return null;
	if (leaf <= size.maxIn + LENGTH_TOLERANCE_IN) return null;
	const diameter = plant.measured?.diameterIn;
	const fits = (s: GroupSizeClass) =>
		s.maxIn === null ||
		(s.measure === 'leaf'
			? leaf <= s.maxIn + LENGTH_TOLERANCE_IN
			: diameter !== undefined && diameter <= s.maxIn + LENGTH_TOLERANCE_IN);
	return group.sizeClasses.slice(at + 1).find(fits)?.key ?? null;
}

function groupOf(plant: Pick<PlantFacts, 'plantGroup'>) {
	const key = plant.plantGroup ?? AFRICAN_VIOLET;
	if (!isPlantGroup(key)) throw new RangeError(`Unknown plant group '${key}'.`);
	return plantGroupOf(key);
}

function checkGroupRules(
	rules: ClassRules,
	plant: PlantFacts,
	phase: CheckPhase,
	fail: (code: FailureCode, message: string) => void,
	unit: LengthUnit
): void {
	const group = groupOf(plant);
	const name = quoted(plant.varietyName);
	const violet = group.key === AFRICAN_VIOLET;
	const kind = rules.plantKind ?? 'any';
	if (kind === 'african_violet' && !violet) {
		fail(
			'group_not_allowed',
			`This class is for African violets, and ${name} is ${article(group.name)}.`
		);
	} else if (kind === 'other_gesneriad' && violet) {
		fail(
			'group_not_allowed',
			`This class is for gesneriads other than African violets, and ${name} is an African violet.`
		);
	}
	const genera = rules.genera ?? [];
	if (genera.length > 0 && !genera.includes(group.key)) {
		const asked = listOf(
			genera.map((g) => (isPlantGroup(g) ? plantGroupOf(g).name : g)),
			'or'
		);
		fail('genus_not_allowed', `This class is for ${asked}, and ${name} is ${article(group.name)}.`);
	}
	const forms = rules.growthForms ?? [];
	const form = growthFormOf(plant);
	if (forms.length > 0 && !forms.includes(form)) {
		const label = (f: string) => GROWTH_FORM_LABELS[f] ?? f;
		fail(
			'growth_form_not_allowed',
			`This class is for ${listOf(forms.map(label), 'or')} plants, and ${name} grows as ${article(label(form))}.`
		);
	}
	const roots = rules.rootTypes ?? [];
	if (roots.length > 0 && !roots.includes(group.rootType)) {
		fail(
			'root_type_not_allowed',
			`This class is for ${listOf(
				roots.map((r) => ROOT_TYPE_LABELS[r]),
				'or'
			)} gesneriads, and ${name} is ${ROOT_TYPE_LABELS[group.rootType]}.`
		);
	}
	const leaf = plant.measured?.leafIn;
	if (phase === 'desk' && leaf !== undefined) {
		assertMeasure('leaf length', leaf);
		const size = groupSizeClass(group, plant.sizeClass);
		if (
			size &&
			size.measure === 'leaf' &&
			size.maxIn !== null &&
			leaf > size.maxIn + LENGTH_TOLERANCE_IN
		) {
			fail(
				'leaf_over_limit',
				`A ${size.key} ${group.name} has leaf blades up to ${lengthWords(size.maxIn, unit)} long, and the longest leaf blade of this plant measures ${lengthWords(leaf, unit)}, so it cannot be judged in this class.`
			);
		}
	}
}

function article(words: string): string {
	return `${/^[aeiou]/i.test(words) ? 'an' : 'a'} ${words}`;
}
