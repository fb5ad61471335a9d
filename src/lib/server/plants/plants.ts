import { QueryTypes, type Transaction } from 'sequelize';
import type { ObtainedHow, PlantEventKind } from '$lib/domain/readiness';
import type { PlantEventInput, PlantInput, PotSuckerInput } from '$lib/schemas/plants';
import { recordAudit } from '../audit';
import { Plant, PlantEvent, PlantPhoto, Variety, sequelize } from '../db';
import { Refusal } from '../http/refusal';

/** Bad input that only the database can find out (a variety or parent that is not the member's). */
export class PlantInputError extends Refusal {
	declare readonly field: string;
	constructor(field: string, message: string) {
		super(message, 400, field);
	}
}

/** A plant as the collection list shows it. */
export interface PlantSummary {
	id: string;
	varietyId: string;
	varietyName: string;
	habit: 'single_crown' | 'trailer';
	sizeClass: string;
	label: string | null;
	obtainedHow: ObtainedHow;
	obtainedOn: string;
	parentId: string | null;
	parentName: string | null;
	potSizeIn: number | null;
	lastEvent: { kind: PlantEventKind; on: string } | null;
	photoCount: number;
	goneOn: string | null;
}

/** One event of a plant's log, for the page. */
export interface PlantEventRow {
	id: string;
	kind: PlantEventKind;
	happenedOn: string;
	diameterIn: number | null;
	crowns: number | null;
	potSizeIn: number | null;
	childPlantId: string | null;
	note: string | null;
}

/** A plant with its log, photos, parent and offspring. */
export interface PlantDetail extends PlantSummary {
	notes: string | null;
	events: PlantEventRow[];
	photos: { id: string; caption: string | null }[];
	children: { id: string; name: string; obtainedHow: ObtainedHow; obtainedOn: string }[];
}

/** A plant in a lineage, with how many generations it is from the plant asked about. */
export interface LineageNode {
	id: string;
	name: string;
	obtainedHow: ObtainedHow;
	obtainedOn: string;
	parentId: string | null;
	generation: number;
}

const num = (v: string | number | null): number | null => (v === null ? null : Number(v));

/** The name a plant goes by: its variety, and its own name tag when it has one. */
export function plantName(varietyName: string, label: string | null): string {
	return label ? `${varietyName} (${label})` : varietyName;
}

interface SummaryRow {
	id: string;
	variety_id: string;
	variety_name: string;
	habit: 'single_crown' | 'trailer';
	size_class: string;
	label: string | null;
	obtained_how: ObtainedHow;
	obtained_on: string;
	parent_id: string | null;
	parent_variety: string | null;
	parent_label: string | null;
	pot_size_in: string | null;
	last_kind: PlantEventKind | null;
	last_on: string | null;
	photo_count: string;
	gone_on: string | null;
	notes: string | null;
}

const SUMMARY_SQL = `
	SELECT p.id, p.variety_id, v.name AS variety_name, v.habit, v.size_class, p.label,
	       p.obtained_how, p.obtained_on, p.parent_id, pv.name AS parent_variety,
	       pp.label AS parent_label, p.pot_size_in, p.gone_on, p.notes,
	       le.kind AS last_kind, le.happened_on AS last_on,
	       (SELECT count(*) FROM plant_photos ph WHERE ph.plant_id = p.id) AS photo_count
	  FROM plants p
	  JOIN varieties v ON v.id = p.variety_id
	  LEFT JOIN plants pp ON pp.id = p.parent_id
	  LEFT JOIN varieties pv ON pv.id = pp.variety_id
	  LEFT JOIN LATERAL (
	       SELECT e.kind, e.happened_on FROM plant_events e
	        WHERE e.plant_id = p.id ORDER BY e.happened_on DESC, e.created_at DESC LIMIT 1
	  ) le ON true`;

function toSummary(r: SummaryRow): PlantSummary {
	return {
		id: r.id,
		varietyId: r.variety_id,
		varietyName: r.variety_name,
		habit: r.habit,
		sizeClass: r.size_class,
		label: r.label,
		obtainedHow: r.obtained_how,
		obtainedOn: r.obtained_on,
		parentId: r.parent_id,
		parentName: r.parent_variety ? plantName(r.parent_variety, r.parent_label) : null,
		potSizeIn: num(r.pot_size_in),
		lastEvent: r.last_kind && r.last_on ? { kind: r.last_kind, on: r.last_on } : null,
		photoCount: Number(r.photo_count),
		goneOn: r.gone_on
	};
}

/** The member's plants, growing ones first, by variety; one query. */
export async function listPlants(ownerId: string): Promise<PlantSummary[]> {
	const rows = await sequelize.query<SummaryRow>(
		`${SUMMARY_SQL}
		  WHERE p.owner_id = :ownerId
		  ORDER BY (p.gone_on IS NOT NULL), v.name, p.obtained_on, p.id`,
		{ replacements: { ownerId }, type: QueryTypes.SELECT }
	);
	return rows.map(toSummary);
}

/** A plant related to another (child, ancestor, offspring) as the lineage queries read it. */
interface RelativeRow {
	id: string;
	name: string;
	label: string | null;
	how: ObtainedHow;
	on: string;
}

/** One of the member's plants with its log, photos and offspring; null when it is not theirs. */
export async function getPlant(ownerId: string, plantId: string): Promise<PlantDetail | null> {
	const [row] = await sequelize.query<SummaryRow>(
		`${SUMMARY_SQL} WHERE p.owner_id = :ownerId AND p.id = :plantId`,
		{ replacements: { ownerId, plantId }, type: QueryTypes.SELECT }
	);
	if (!row) return null;
	const [events, photos, children] = await Promise.all([
		PlantEvent.findAll({
			where: { plantId },
			order: [
				['happenedOn', 'DESC'],
				['createdAt', 'DESC']
			]
		}),
		PlantPhoto.findAll({ where: { plantId }, order: [['createdAt', 'ASC']] }),
		sequelize.query<RelativeRow>(
			`SELECT p.id, v.name, p.label, p.obtained_how AS how, p.obtained_on AS on
			   FROM plants p JOIN varieties v ON v.id = p.variety_id
			  WHERE p.parent_id = :plantId AND p.owner_id = :ownerId ORDER BY p.obtained_on, p.id`,
			{ replacements: { plantId, ownerId }, type: QueryTypes.SELECT }
		)
	]);
	return {
		...toSummary(row),
		notes: row.notes,
		events: events.map((e) => ({
			id: e.id,
			kind: e.kind,
			happenedOn: e.happenedOn,
			diameterIn: num(e.diameterIn),
			crowns: e.crowns,
			potSizeIn: num(e.potSizeIn),
			childPlantId: e.childPlantId,
			note: e.note
		})),
		photos: photos.map((p) => ({ id: p.id, caption: p.caption })),
		children: children.map((c) => ({
			id: c.id,
			name: plantName(c.name, c.label),
			obtainedHow: c.how,
			obtainedOn: c.on
		}))
	};
}

/** Varieties a member may grow in the collection: those of the registries of their societies. */
export async function listVarietyChoices(
	societyIds: string[]
): Promise<{ id: string; name: string; societyId: string }[]> {
	if (societyIds.length === 0) return [];
	const rows = await Variety.findAll({
		where: { societyId: societyIds },
		attributes: ['id', 'name', 'societyId'],
		order: [['name', 'ASC']]
	});
	return rows.map((v) => ({ id: v.id, name: v.name, societyId: v.societyId }));
}

async function ownPlantOr404(
	ownerId: string,
	plantId: string,
	transaction: Transaction
): Promise<Plant> {
	const plant = await Plant.findOne({
		where: { id: plantId, ownerId },
		transaction,
		lock: transaction.LOCK.UPDATE
	});
	if (!plant) throw new PlantInputError('plant', 'This plant is not in your collection.');
	return plant;
}

async function checkVariety(
	varietyId: string,
	societyIds: string[],
	transaction: Transaction
): Promise<void> {
	const variety = await Variety.findOne({
		where: { id: varietyId, societyId: societyIds },
		attributes: ['id'],
		transaction
	});
	if (!variety) {
		throw new PlantInputError('varietyId', "Choose a variety from your society's registry.");
	}
}

/** True when `candidateId` is `plantId` or one of its offspring (so it cannot become its parent). */
async function isSelfOrDescendant(
	plantId: string,
	candidateId: string,
	transaction: Transaction
): Promise<boolean> {
	const rows = await sequelize.query(
		`WITH RECURSIVE down AS (
		   SELECT id FROM plants WHERE id = :plantId
		   UNION SELECT p.id FROM plants p JOIN down d ON p.parent_id = d.id)
		 SELECT 1 FROM down WHERE id = :candidateId`,
		{ replacements: { plantId, candidateId }, type: QueryTypes.SELECT, transaction }
	);
	return rows.length > 0;
}

function plantValues(input: PlantInput) {
	return {
		varietyId: input.varietyId,
		label: input.label,
		obtainedHow: input.obtainedHow,
		obtainedOn: input.obtainedOn,
		parentId: input.parentId,
		potSizeIn: input.potSize === null ? null : input.potSize.toFixed(2),
		notes: input.notes
	};
}

/**
 * Adds a plant to the member's collection. The variety must be in the registry of one of their
 * societies (`societyIds`) and the parent, when given, one of their own plants.
 */
export async function createPlant(
	ownerId: string,
	societyIds: string[],
	input: PlantInput,
	options: { transaction: Transaction }
): Promise<Plant> {
	const { transaction } = options;
	await checkVariety(input.varietyId, societyIds, transaction);
	if (input.parentId) await ownPlantOr404(ownerId, input.parentId, transaction);
	return Plant.create({ ownerId, goneOn: null, ...plantValues(input) }, { transaction });
}

/** Changes a plant's facts; its parent may not be the plant itself or one of its offspring. */
export async function updatePlant(
	ownerId: string,
	societyIds: string[],
	plantId: string,
	input: PlantInput,
	options: { transaction: Transaction }
): Promise<Plant> {
	const { transaction } = options;
	const plant = await ownPlantOr404(ownerId, plantId, transaction);
	await checkVariety(input.varietyId, societyIds, transaction);
	if (input.parentId) {
		await ownPlantOr404(ownerId, input.parentId, transaction);
		if (await isSelfOrDescendant(plantId, input.parentId, transaction)) {
			throw new PlantInputError(
				'parentId',
				'A plant cannot descend from itself: choose another parent.'
			);
		}
	}
	plant.set({ ...plantValues(input), updatedAt: new Date() });
	return plant.save({ transaction });
}

/** Marks a plant as no longer grown (given away, lost) on a day, or back in the collection. */
export async function setPlantGone(
	ownerId: string,
	plantId: string,
	goneOn: string | null,
	options: { transaction: Transaction }
): Promise<void> {
	const plant = await ownPlantOr404(ownerId, plantId, options.transaction);
	if (goneOn === null && plant.goneOn === null)
		throw new PlantInputError('goneOn', 'This plant is in the collection already.');
	const before = plant.goneOn;
	plant.goneOn = goneOn;
	await plant.save({ transaction: options.transaction });
	if (goneOn !== null) {
		await recordAudit(
			{
				societyId: null,
				actor: { id: ownerId },
				action: 'plant.gone',
				target: { kind: 'plant', id: plant.id, label: plant.label ?? 'Plant' },
				details: { before: { goneOn: before }, after: { goneOn } }
			},
			{ transaction: options.transaction }
		);
	}
}

/** Writes one event in a plant's log; a repotting with a pot size also sets the plant's pot size. */
export async function addPlantEvent(
	ownerId: string,
	plantId: string,
	input: PlantEventInput,
	options: { transaction: Transaction }
): Promise<PlantEvent> {
	const { transaction } = options;
	const plant = await ownPlantOr404(ownerId, plantId, transaction);
	const measured = input.kind === 'measured';
	const event = await PlantEvent.create(
		{
			plantId,
			kind: input.kind,
			happenedOn: input.happenedOn,
			diameterIn: measured && input.diameter !== null ? input.diameter.toFixed(2) : null,
			crowns: measured ? input.crowns : null,
			potSizeIn:
				input.kind === 'repotted' && input.potSize !== null ? input.potSize.toFixed(2) : null,
			childPlantId: null,
			note: input.note
		},
		{ transaction }
	);
	if (event.potSizeIn !== null) {
		plant.potSizeIn = event.potSizeIn;
		await plant.save({ transaction });
	}
	return event;
}

/** Removes one event from the log of one of the member's plants (a mistaken tap); audited. */
export async function deletePlantEvent(
	ownerId: string,
	plantId: string,
	eventId: string,
	options: { transaction: Transaction }
): Promise<boolean> {
	const { transaction } = options;
	const plant = await ownPlantOr404(ownerId, plantId, transaction);
	const event = await PlantEvent.findOne({ where: { id: eventId, plantId }, transaction });
	if (!event) return false;
	await event.destroy({ transaction });
	await recordAudit(
		{
			societyId: null,
			actor: { id: ownerId },
			action: 'plant_event.delete',
			target: {
				kind: 'plant_event',
				id: event.id,
				label: `${event.kind} on ${event.happenedOn}, ${plant.label ?? 'plant'}`
			},
			details: {
				before: {
					plantId,
					kind: event.kind,
					happenedOn: event.happenedOn,
					note: event.note,
					diameterIn: event.diameterIn,
					crowns: event.crowns,
					potSizeIn: event.potSizeIn
				}
			}
		},
		{ transaction }
	);
	return true;
}

/**
 * Pots up a sucker removed from one of the member's plants, in one step: the new plant (same
 * variety, got "rooted from a sucker" on that day, with its parent and pot size) and the event
 * in the parent's log that names it.
 */
export async function potUpSucker(
	ownerId: string,
	parentId: string,
	input: PotSuckerInput,
	options: { transaction: Transaction }
): Promise<Plant> {
	const { transaction } = options;
	const parent = await ownPlantOr404(ownerId, parentId, transaction);
	const pot = input.potSize === null ? null : input.potSize.toFixed(2);
	const child = await Plant.create(
		{
			ownerId,
			varietyId: parent.varietyId,
			label: input.label,
			obtainedHow: 'sucker',
			obtainedOn: input.happenedOn,
			parentId: parent.id,
			potSizeIn: pot,
			notes: null,
			goneOn: null
		},
		{ transaction }
	);
	await PlantEvent.create(
		{
			plantId: parent.id,
			kind: 'sucker_potted',
			happenedOn: input.happenedOn,
			diameterIn: null,
			crowns: null,
			potSizeIn: pot,
			childPlantId: child.id,
			note: null
		},
		{ transaction }
	);
	return child;
}

/**
 * A plant's ancestors (parent, grandparent, ...) and offspring (children, grandchildren, ...),
 * within the member's own collection; null when the plant is not theirs. Two recursive queries.
 */
export async function getLineage(
	ownerId: string,
	plantId: string
): Promise<{ plant: LineageNode; ancestors: LineageNode[]; offspring: LineageNode[] } | null> {
	const query = (sql: string) =>
		sequelize.query<RelativeRow & { parent_id: string | null; generation: number }>(
			`WITH RECURSIVE ${sql}
			 SELECT t.id, v.name, p.label, p.obtained_how AS how, p.obtained_on AS on, p.parent_id,
			        t.generation
			   FROM tree t JOIN plants p ON p.id = t.id JOIN varieties v ON v.id = p.variety_id
			  ORDER BY abs(t.generation), p.obtained_on, p.id`,
			{ replacements: { plantId, ownerId }, type: QueryTypes.SELECT }
		);
	const up = await query(
		`tree(id, parent_id, generation) AS (
		   SELECT id, parent_id, 0 FROM plants WHERE id = :plantId AND owner_id = :ownerId
		   UNION ALL
		   SELECT p.id, p.parent_id, t.generation - 1 FROM plants p JOIN tree t ON p.id = t.parent_id
		    WHERE p.owner_id = :ownerId AND t.generation > -50)`
	);
	if (up.length === 0) return null;
	const down = await query(
		`tree(id, generation) AS (
		   SELECT id, 0 FROM plants WHERE id = :plantId AND owner_id = :ownerId
		   UNION ALL
		   SELECT p.id, t.generation + 1 FROM plants p JOIN tree t ON p.parent_id = t.id
		    WHERE p.owner_id = :ownerId AND t.generation < 50)`
	);
	const toNode = (r: (typeof up)[number]): LineageNode => ({
		id: r.id,
		name: plantName(r.name, r.label),
		obtainedHow: r.how,
		obtainedOn: r.on,
		parentId: r.parent_id,
		generation: r.generation
	});
	return {
		plant: toNode(up.find((r) => r.generation === 0)!),
		ancestors: up.filter((r) => r.generation < 0).map(toNode),
		offspring: down.filter((r) => r.generation > 0).map(toNode)
	};
}
