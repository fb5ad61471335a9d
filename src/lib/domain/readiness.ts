/**
 * "Is this plant ready for the show?": matches a plant of a member's collection
 * to the classes of a show schedule and says what it still needs.
 *
 * The class rules and the show rules are checked by `checkEligibility`, the
 * same module the entry form and the entry desk use, so the three never
 * disagree. What this module adds is reading the plant's own log: the last
 * crown count (suckers on a single-crown plant, too few crowns on a trailer),
 * the last diameter (over a size limit), and the last bloom.
 */

import { addCalendarDays, compareIsoDates, formatDateLong, type IsoDate } from './dates';
import {
	TRAILER_MIN_CROWNS,
	checkEligibility,
	type ClassRules,
	type ExhibitorContext,
	type FailureCode,
	type PlantFacts,
	type RuleFailure,
	type ShowContext
} from './eligibility';

/** What a grower can write in a plant's log. */
export const PLANT_EVENT_KINDS = [
	'sucker_removed',
	'groomed',
	'repotted',
	'sucker_potted',
	'in_bloom',
	'disbudded',
	'pest_treatment',
	'measured',
	'note'
] as const;

/** One kind of log event. */
export type PlantEventKind = (typeof PLANT_EVENT_KINDS)[number];

/** How a plant came into the collection. */
export const OBTAINED_HOW = ['bought', 'traded', 'leaf', 'sucker', 'division'] as const;

/** One way of getting a plant; the last three are propagation from another plant. */
export type ObtainedHow = (typeof OBTAINED_HOW)[number];

/** The ways of getting a plant that start from a parent plant. */
export const PROPAGATED: readonly ObtainedHow[] = ['leaf', 'sucker', 'division'];

/** One dated event of a plant's log, as readiness needs it. */
export interface LoggedEvent {
	kind: PlantEventKind;
	on: IsoDate;
	/** For 'measured': the diameter across the leaves, in inches. */
	diameterIn?: number | null;
	/** For 'measured': how many crowns the plant has (a sucker is a crown). */
	crowns?: number | null;
}

/** A plant of the collection: its variety's traits, the day it was got, and its log. */
export interface CollectionPlant {
	plantId: string;
	facts: Omit<PlantFacts, 'measured' | 'collectionVarietyIds'>;
	/** In any order; events of the same day keep the order given. */
	events: readonly LoggedEvent[];
}

/** The show's rules and dates; `entryDay` is when plants are checked in. */
export interface ReadinessShow extends ShowContext {
	entryDay: IsoDate;
}

/** A class of the schedule to match plants against. */
export interface ReadinessClass {
	id: string;
	rules: ClassRules;
}

/** Something the grower should still do (or know) before the show. */
export type NeedCode = 'remove_suckers' | 'too_few_crowns' | 'count_crowns' | 'no_recent_bloom';

/** A need with one plain sentence and, when there is one, the day it must be done by. */
export interface Need {
	code: NeedCode;
	message: string;
	by: IsoDate | null;
}

/** A class the plant's variety fits, and whether it can be entered there now. */
export interface ClassMatch {
	classId: string;
	/** True when an entry can be made in this class today (window, possession, limits, size). */
	canEnter: boolean;
	/** Rules that stop the plant from being entered or judged in this class. */
	blockers: RuleFailure[];
}

/** The overall verdict for one plant. */
export type ReadinessStatus = 'ready' | 'needs_work' | 'cannot_enter' | 'no_class';

/** What `assessReadiness` says about one plant. */
export interface PlantReadiness {
	plantId: string;
	status: ReadinessStatus;
	/** Classes the variety fits (habit, size class, blossom, foliage), in schedule order. */
	matches: ClassMatch[];
	/** What to do before the show, for every class it fits. */
	needs: Need[];
	/** The last crown count and diameter read from the log, when there is one. */
	lastMeasured: { on: IsoDate; crowns: number | null; diameterIn: number | null } | null;
	lastBloomOn: IsoDate | null;
}

/**
 * A bloom logged this many days before today or later counts as "lately".
 * Our own setting, not a published value: entries must be in bloom
 * (show rules 2018, DOMAIN.md), and a plant that bloomed within two months is
 * likely to be in bloom again or still.
 */
export const RECENT_BLOOM_DAYS = 60;

/** The failures that mean "this class is not for this variety" rather than "not yet". */
const TRAIT_FAILURES: ReadonlySet<FailureCode> = new Set<FailureCode>([
	'habit_not_allowed',
	'size_class_not_allowed',
	'blossom_type_not_allowed',
	'blossom_colour_not_allowed',
	'foliage_not_allowed',
	'not_a_species',
	'collection_wrong_count',
	'collection_repeats_variety',
	'collection_in_single_plant_class',
	'group_not_allowed',
	'genus_not_allowed',
	'growth_form_not_allowed',
	'root_type_not_allowed'
]);

const NO_EXHIBITOR: ExhibitorContext = {
	inGoodStanding: true,
	entriesInClass: 0,
	entriesOfVariety: 0,
	varietyAlreadyInClass: false
};

/**
 * Reads the crown count and diameter a plant has now from its log: the last
 * measurement, except that on a single-crown plant a sucker removed (or potted
 * up) after it leaves one crown.
 */
export function currentMeasurements(
	habit: PlantFacts['habit'],
	events: readonly LoggedEvent[]
): PlantReadiness['lastMeasured'] {
	let result = null as PlantReadiness['lastMeasured'];
	for (const event of inDateOrder(events)) {
		if (event.kind === 'measured') {
			result = {
				on: event.on,
				crowns: event.crowns ?? result?.crowns ?? null,
				diameterIn: event.diameterIn ?? result?.diameterIn ?? null
			};
		} else if (
			(event.kind === 'sucker_removed' || event.kind === 'sucker_potted') &&
			habit === 'single_crown' &&
			result?.crowns
		) {
			result = { ...result, crowns: 1 };
		}
	}
	return result;
}

/** The day of the last 'in_bloom' event in the log, or null. */
export function lastBloom(events: readonly LoggedEvent[]): IsoDate | null {
	const blooms = inDateOrder(events).filter((e) => e.kind === 'in_bloom');
	return blooms.length > 0 ? blooms[blooms.length - 1].on : null;
}

/**
 * Matches one plant to the classes of a show and lists what it still needs:
 * the class and show rules through `checkEligibility` (possession period
 * reached by the show date, entry window, exhibitor limits), then the log:
 * suckers on a single-crown plant (remove them before entry day), a trailer
 * with fewer crowns than required, a diameter over a class or size-class
 * limit, and no bloom logged within `RECENT_BLOOM_DAYS`.
 */
export function assessReadiness(
	plant: CollectionPlant,
	show: ReadinessShow,
	classes: readonly ReadinessClass[],
	exhibitorIn: (classId: string) => ExhibitorContext = () => NO_EXHIBITOR
): PlantReadiness {
	const measured = currentMeasurements(plant.facts.habit, plant.events);
	const bloomOn = lastBloom(plant.events);
	const facts: PlantFacts = {
		...plant.facts,
		measured: {
			...(measured?.diameterIn != null ? { diameterIn: measured.diameterIn } : {}),
			...(measured?.crowns != null ? { crowns: measured.crowns } : {})
		}
	};

	const matches: ClassMatch[] = [];
	const needs = new Map<NeedCode, Need>();
	const addNeed = (need: Need) => {
		if (!needs.has(need.code)) needs.set(need.code, need);
	};

	for (const showClass of classes) {
		const exhibitor = exhibitorIn(showClass.id);
		const atEntry = checkEligibility({
			rules: showClass.rules,
			plant: facts,
			show,
			exhibitor,
			phase: 'entry'
		}).failures;
		if (atEntry.some((f) => TRAIT_FAILURES.has(f.code))) continue;
		const atDesk = checkEligibility({
			rules: showClass.rules,
			plant: facts,
			show,
			exhibitor,
			phase: 'desk'
		}).failures;

		const blockers = [...atEntry];
		for (const failure of atDesk) {
			if (failure.code === 'diameter_over_limit') {
				blockers.push({
					code: failure.code,
					message: `${failure.message} (Measured on ${formatDateLong(measured!.on)}.)`
				});
			} else if (failure.code === 'too_many_crowns') {
				addNeed(suckerNeed(measured!, show));
			} else if (failure.code === 'too_few_crowns') {
				addNeed({
					code: 'too_few_crowns',
					message: `${failure.message} (Counted on ${formatDateLong(measured!.on)}.) It needs more crowns by entry day, ${formatDateLong(show.entryDay)}.`,
					by: show.entryDay
				});
			}
		}
		if (plant.facts.habit === 'trailer' && measured?.crowns == null) {
			addNeed({
				code: 'count_crowns',
				message: `No crown count is logged yet: a trailer needs at least ${TRAILER_MIN_CROWNS} crowns to be shown as a trailer, so count them and log a measurement.`,
				by: show.entryDay
			});
		}
		matches.push({ classId: showClass.id, canEnter: blockers.length === 0, blockers });
	}

	if (matches.length > 0) {
		const since = addCalendarDays(show.today, -RECENT_BLOOM_DAYS);
		if (bloomOn === null || compareIsoDates(bloomOn, since) < 0) {
			addNeed({
				code: 'no_recent_bloom',
				message:
					bloomOn === null
						? `No bloom is logged for this plant yet; entries must be in bloom on ${formatDateLong(show.showDate)}.`
						: `The last bloom logged was on ${formatDateLong(bloomOn)}, more than ${RECENT_BLOOM_DAYS} days ago; entries must be in bloom on ${formatDateLong(show.showDate)}.`,
				by: show.showDate
			});
		}
	}

	const needList = [...needs.values()];
	let status: ReadinessStatus;
	if (matches.length === 0) status = 'no_class';
	else if (!matches.some((m) => m.canEnter)) status = 'cannot_enter';
	else status = needList.length === 0 ? 'ready' : 'needs_work';

	return {
		plantId: plant.plantId,
		status,
		matches,
		needs: needList,
		lastMeasured: measured,
		lastBloomOn: bloomOn
	};
}

function suckerNeed(
	measured: NonNullable<PlantReadiness['lastMeasured']>,
	show: ReadinessShow
): Need {
	const suckers = (measured.crowns ?? 1) - 1;
	const what = suckers === 1 ? 'the sucker' : `the ${suckers} suckers`;
	return {
		code: 'remove_suckers',
		message: `The last log (${formatDateLong(measured.on)}) shows ${measured.crowns} crowns: remove ${what} before entry day, ${formatDateLong(show.entryDay)}. Taking suckers off early gives the rosette longer to fill the gap.`,
		by: show.entryDay
	};
}

function inDateOrder(events: readonly LoggedEvent[]): LoggedEvent[] {
	return events
		.map((event, index) => ({ event, index }))
		.sort((a, b) => compareIsoDates(a.event.on, b.event.on) || a.index - b.index)
		.map(({ event }) => event);
}
