import { duesCover } from '../people/standing';
import { Op, QueryTypes, type Transaction } from 'sequelize';
import type { IsoDate } from '$lib/domain/dates';
import {
	assessReadiness,
	type LoggedEvent,
	type PlantEventKind,
	type PlantReadiness,
	type ReadinessClass,
	type ReadinessShow
} from '$lib/domain/readiness';
import { Division, Membership, Show, ShowClass, Society, sequelize } from '../db';
import { plantName } from './plants';
import {
	classRulesOf,
	exhibitorContextOf,
	plantFactsOf,
	showContextOf
} from '../entries/eligibility-input';

/** A class of the schedule, as the readiness page names it. */
export interface ClassLabel {
	id: string;
	code: string;
	name: string;
}

/** One plant of a member's collection against one show. */
export interface PlantAssessment {
	plantId: string;
	name: string;
	varietyId: string;
	readiness: PlantReadiness;
	/** The entry already made from this plant in this show, if any. */
	entry: { number: number; classId: string } | null;
}

/** A show's rules and horticulture classes, loaded once for many plants. */
export interface ShowForReadiness {
	id: string;
	name: string;
	societyId: string;
	societyName: string;
	context: ReadinessShow;
	classes: (ReadinessClass & ClassLabel)[];
}

/** Loads a show with its published schedule's horticulture classes; null when there is none. */
export async function loadShowForReadiness(
	showId: string,
	today: IsoDate,
	transaction?: Transaction
): Promise<ShowForReadiness | null> {
	const show = await Show.findOne({
		where: { id: showId, schedulePublishedAt: { [Op.ne]: null } },
		include: [{ model: Society, as: 'society', attributes: ['name', 'lengthUnit'] }],
		transaction
	});
	if (!show) return null;
	const society = show.get('society') as Society;
	const classes = await ShowClass.findAll({
		where: { showId },
		include: [
			{ model: Division, as: 'division', where: { kind: 'horticulture' }, attributes: ['position'] }
		],
		order: [
			[{ model: Division, as: 'division' }, 'position', 'ASC'],
			['position', 'ASC']
		],
		transaction
	});
	return {
		id: show.id,
		name: show.name,
		societyId: show.societyId,
		societyName: society.name,
		context: showContextOf(show, today, society.lengthUnit),
		classes: classes.map((c) => ({ id: c.id, code: c.code, name: c.name, rules: classRulesOf(c) }))
	};
}

/**
 * Published shows of the member's societies that still take entries (entries close today or
 * later): readiness is about what can still be entered.
 */
export async function listUpcomingShows(
	societyIds: string[],
	today: IsoDate
): Promise<
	{ id: string; societyId: string; name: string; entriesClose: string; judgingDay: string }[]
> {
	if (societyIds.length === 0) return [];
	const shows = await Show.findAll({
		where: {
			societyId: societyIds,
			schedulePublishedAt: { [Op.ne]: null },
			entriesClose: { [Op.gte]: today }
		},
		order: [['judgingDay', 'ASC']]
	});
	return shows.map((s) => ({
		id: s.id,
		societyId: s.societyId,
		name: s.name,
		entriesClose: s.entriesClose,
		judgingDay: s.judgingDay
	}));
}

interface PlantRow {
	id: string;
	owner_id: string;
	label: string | null;
	obtained_on: string;
	variety_id: string;
	name: string;
	is_species: boolean;
	habit: 'single_crown' | 'trailer';
	size_class: 'miniature' | 'semiminiature' | 'standard' | 'large';
	blossom_type: string;
	blossom_colours: string[];
	foliage: 'plain' | 'variegated';
	plant_group: string;
	growth_form: string;
}

interface EntryRow {
	exhibitor_id: string;
	class_id: string;
	variety_id: string | null;
	plant_id: string | null;
	number: number;
}

/**
 * Assesses every growing plant of the given members (whose variety is in the show's society's
 * registry) against the show, in four queries whatever the number of members or plants.
 * `onlyPlantIds` narrows it to some plants.
 */
export async function assessCollections(
	show: ShowForReadiness,
	userIds: string[],
	options: { onlyPlantIds?: string[]; transaction?: Transaction } = {}
): Promise<Map<string, PlantAssessment[]>> {
	const { transaction, onlyPlantIds } = options;
	const result = new Map<string, PlantAssessment[]>();
	if (userIds.length === 0 || onlyPlantIds?.length === 0) return result;
	const plants = await sequelize.query<PlantRow>(
		`SELECT p.id, p.owner_id, p.label, p.obtained_on, v.id AS variety_id, v.name, v.is_species,
		        v.habit, v.size_class, v.blossom_type, v.blossom_colours, v.foliage,
		        v.plant_group, v.growth_form
		   FROM plants p JOIN varieties v ON v.id = p.variety_id
		  WHERE p.owner_id IN (:userIds) AND v.society_id = :societyId AND p.gone_on IS NULL
		    ${onlyPlantIds ? 'AND p.id IN (:onlyPlantIds)' : ''}
		  ORDER BY v.name, p.obtained_on, p.id`,
		{
			replacements: { userIds, societyId: show.societyId, onlyPlantIds },
			type: QueryTypes.SELECT,
			transaction
		}
	);
	if (plants.length === 0) return result;
	const [events, entries, memberships] = await Promise.all([
		sequelize.query<{
			plant_id: string;
			kind: PlantEventKind;
			happened_on: string;
			diameter_in: string | null;
			crowns: number | null;
		}>(
			`SELECT plant_id, kind, happened_on, diameter_in, crowns FROM plant_events
			  WHERE plant_id IN (:plantIds) AND kind IN ('measured','sucker_removed','sucker_potted','in_bloom')
			  ORDER BY happened_on, created_at`,
			{ replacements: { plantIds: plants.map((p) => p.id) }, type: QueryTypes.SELECT, transaction }
		),
		sequelize.query<EntryRow>(
			`SELECT exhibitor_id, class_id, variety_id, plant_id, number FROM entries
			  WHERE show_id = :showId AND exhibitor_id IN (:userIds) AND status NOT IN ('withdrawn','scratched')`,
			{ replacements: { showId: show.id, userIds }, type: QueryTypes.SELECT, transaction }
		),
		Membership.findAll({
			where: { societyId: show.societyId, userId: userIds },
			attributes: ['userId', 'duesPaidThrough'],
			transaction
		})
	]);

	const eventsOf = new Map<string, LoggedEvent[]>();
	for (const e of events) {
		const list = eventsOf.get(e.plant_id) ?? [];
		list.push({
			kind: e.kind,
			on: e.happened_on,
			diameterIn: e.diameter_in === null ? null : Number(e.diameter_in),
			crowns: e.crowns
		});
		eventsOf.set(e.plant_id, list);
	}
	// Good standing: the same rule as the entry service (people/standing.ts).
	const standing = new Map(
		memberships.map((m) => [m.userId, duesCover(m.duesPaidThrough, show.context.showDate)])
	);

	for (const p of plants) {
		const own = entries.filter((e) => e.exhibitor_id === p.owner_id);
		const exhibitorIn = exhibitorContextOf(
			standing.get(p.owner_id) ?? false,
			own.map((e) => ({ classId: e.class_id, varietyId: e.variety_id })),
			p.variety_id
		);
		const readiness = assessReadiness(
			{
				plantId: p.id,
				facts: plantFactsOf(
					{
						id: p.variety_id,
						name: p.name,
						isSpecies: p.is_species,
						habit: p.habit,
						sizeClass: p.size_class,
						blossomType: p.blossom_type,
						blossomColours: p.blossom_colours,
						foliage: p.foliage,
						plantGroup: p.plant_group,
						growthForm: p.growth_form
					},
					p.obtained_on
				),
				events: eventsOf.get(p.id) ?? []
			},
			show.context,
			show.classes,
			exhibitorIn
		);
		const entry = own.find((e) => e.plant_id === p.id);
		const list = result.get(p.owner_id) ?? [];
		list.push({
			plantId: p.id,
			name: plantName(p.name, p.label),
			varietyId: p.variety_id,
			readiness,
			entry: entry ? { number: entry.number, classId: entry.class_id } : null
		});
		result.set(p.owner_id, list);
	}
	return result;
}
