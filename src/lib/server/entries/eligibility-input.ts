import type { IsoDate } from '$lib/domain/dates';
import type { ExhibitorContext, PlantFacts } from '$lib/domain/eligibility';
import type { ReadinessShow } from '$lib/domain/readiness';
import type { LengthUnit } from '$lib/domain/units';
import type { Show } from '../db';
import { classRulesOf } from '../shows/schedule';

/**
 * The one mapping from our models to what the eligibility check reads, used by the entry form,
 * the entry desk and the readiness list, so the three always check the same facts.
 */

/** The rules of a class (the schedule's reader, re-exported so every caller takes it from here). */
export { classRulesOf };

/**
 * A show's dates and limits as the eligibility and readiness modules read them, on the society's
 * `today` and with lengths in its unit.
 */
export function showContextOf(
	show: Pick<
		Show,
		| 'judgingDay'
		| 'entryDay'
		| 'entriesOpen'
		| 'entriesClose'
		| 'possessionMonths'
		| 'maxEntriesPerClass'
		| 'maxEntriesPerVariety'
		| 'requireGoodStanding'
	>,
	today: IsoDate,
	lengthUnit: LengthUnit = 'in'
): ReadinessShow {
	return {
		lengthUnit,
		showDate: show.judgingDay,
		entryDay: show.entryDay,
		today,
		entriesOpen: show.entriesOpen,
		entriesClose: show.entriesClose,
		possessionMonths: show.possessionMonths,
		maxEntriesPerClass: show.maxEntriesPerClass,
		maxEntriesPerVariety: show.maxEntriesPerVariety,
		requireGoodStanding: show.requireGoodStanding
	};
}

/** What the check reads of a variety, whether it comes from the model or from a plain row. */
export interface VarietyFacts {
	id: string;
	name: string;
	isSpecies: boolean;
	habit: PlantFacts['habit'];
	sizeClass: PlantFacts['sizeClass'];
	blossomType: string;
	blossomColours: string[];
	foliage: PlantFacts['foliage'];
	/** The variety's group (African violet, or a gesneriad genus) and growth form. */
	plantGroup?: string;
	growthForm?: string;
	botanicalName?: string | null;
}

/** What is known of a plant of a variety; measurements are added at the desk. */
export function plantFactsOf(
	variety: VarietyFacts,
	acquiredOn: IsoDate | null,
	extra: Partial<PlantFacts> = {}
): PlantFacts {
	return {
		varietyId: variety.id,
		varietyName: variety.name,
		isSpecies: variety.isSpecies,
		habit: variety.habit,
		sizeClass: variety.sizeClass,
		blossomType: variety.blossomType,
		blossomColours: variety.blossomColours,
		foliage: variety.foliage,
		acquiredOn,
		plantGroup: variety.plantGroup,
		growthForm: variety.growthForm,
		botanicalName: variety.botanicalName,
		...extra
	};
}

/** An entry's stored measurements (DECIMAL columns arrive as strings). */
export interface StoredMeasurements {
	measuredDiameterIn: string | number | null;
	measuredCrowns: number | null;
	potSizeIn: string | number | null;
	/** The longest leaf blade (miniature Sinningia); absent or null while not measured. */
	measuredLeafIn?: string | number | null;
}

/** The desk's measurements of an entry as the check reads them: only what was measured. */
export function measuredOf(entry: StoredMeasurements): NonNullable<PlantFacts['measured']> {
	const measured: NonNullable<PlantFacts['measured']> = {};
	if (entry.measuredDiameterIn !== null) measured.diameterIn = Number(entry.measuredDiameterIn);
	if (entry.measuredCrowns !== null) measured.crowns = entry.measuredCrowns;
	if (entry.potSizeIn !== null) measured.potIn = Number(entry.potSizeIn);
	if (entry.measuredLeafIn !== undefined && entry.measuredLeafIn !== null) {
		measured.leafIn = Number(entry.measuredLeafIn);
	}
	return measured;
}

/** An exhibitor's other active entry, as the limits count it. */
export interface CountedEntry {
	classId: string;
	varietyId: string | null;
}

/**
 * The exhibitor's standing and other active entries as a function of the class, so the same
 * counts serve one class or a list of candidate classes.
 */
export function exhibitorContextOf(
	inGoodStanding: boolean,
	others: readonly CountedEntry[],
	varietyId: string
): (classId: string) => ExhibitorContext {
	const ofVariety = others.filter((e) => e.varietyId === varietyId);
	return (classId) => ({
		inGoodStanding,
		entriesInClass: others.filter((e) => e.classId === classId).length,
		entriesOfVariety: ofVariety.length,
		varietyAlreadyInClass: ofVariety.some((e) => e.classId === classId)
	});
}
