import { QueryTypes, type Transaction } from 'sequelize';
import { checkEligibility, type RuleFailure } from '$lib/domain/eligibility';
import { Show, sequelize } from '../db';
import { assessCollections, loadShowForReadiness } from './readiness';
import { feeStatusForNewEntry } from './entry-fees';

/** An entry from a plant that the rules refuse; nothing was written. */
export class PlantEntryRefused extends Error {
	constructor(readonly failures: RuleFailure[]) {
		super(failures.map((f) => f.message).join(' '));
	}
}

/**
 * Turns a plant of the member's collection into an entry of a show class ("enter this plant"):
 * locks the show row (SELECT ... FOR UPDATE) so numbers and limits are decided one entry at a
 * time, re-checks every class and show rule with `checkEligibility` in phase 'entry', and
 * writes the entry (variety, the day the plant was got, the plant) with the next number.
 *
 * Kept separate from the shared entry service so the lead can swap it for `createEntry` of
 * services/entries.ts (passing the plant id) once both are merged.
 */
export async function createEntryFromPlant(
	exhibitorId: string,
	input: { showId: string; classId: string; plantId: string; today: string },
	options: { transaction: Transaction }
): Promise<{ id: string; number: number }> {
	const { transaction } = options;
	const locked = await Show.findByPk(input.showId, {
		transaction,
		lock: transaction.LOCK.UPDATE,
		attributes: ['id', 'nextEntryNumber']
	});
	const show = locked && (await loadShowForReadiness(input.showId, input.today, transaction));
	if (!locked || !show) {
		throw new PlantEntryRefused([
			{ code: 'entries_closed', message: 'This show does not take entries.' }
		]);
	}
	const showClass = show.classes.find((c) => c.id === input.classId);
	const assessed = (
		await assessCollections(show, [exhibitorId], {
			onlyPlantIds: [input.plantId],
			transaction
		})
	).get(exhibitorId)?.[0];
	if (!showClass || !assessed) {
		throw new PlantEntryRefused([
			{
				code: 'habit_not_allowed',
				message: 'That plant or class is not one you can enter in this show.'
			}
		]);
	}
	if (assessed.entry) {
		throw new PlantEntryRefused([
			{
				code: 'variety_already_in_class',
				message: `This plant is already entered in this show, as entry ${assessed.entry.number}.`
			}
		]);
	}
	const [plant] = await sequelize.query<{ obtained_on: string }>(
		'SELECT obtained_on FROM plants WHERE id = $1 AND owner_id = $2',
		{ bind: [input.plantId, exhibitorId], type: QueryTypes.SELECT, transaction }
	);
	const [counts] = await sequelize.query<{
		in_class: string;
		of_variety: string;
		variety_in_class: boolean;
	}>(
		`SELECT count(*) FILTER (WHERE class_id = $3) AS in_class,
		        count(*) FILTER (WHERE variety_id = $4) AS of_variety,
		        bool_or(class_id = $3 AND variety_id = $4) IS TRUE AS variety_in_class
		   FROM entries WHERE show_id = $1 AND exhibitor_id = $2 AND status NOT IN ('withdrawn','scratched')`,
		{
			bind: [show.id, exhibitorId, showClass.id, assessed.varietyId],
			type: QueryTypes.SELECT,
			transaction
		}
	);
	const facts = await sequelize.query<{
		name: string;
		is_species: boolean;
		habit: 'single_crown' | 'trailer';
		size_class: 'miniature' | 'semiminiature' | 'standard' | 'large';
		blossom_type: string;
		blossom_colours: string[];
		foliage: 'plain' | 'variegated';
		dues: string | null;
	}>(
		`SELECT v.name, v.is_species, v.habit, v.size_class, v.blossom_type, v.blossom_colours, v.foliage,
		        (SELECT dues_paid_through FROM memberships m WHERE m.user_id = $2 AND m.society_id = v.society_id) AS dues
		   FROM varieties v WHERE v.id = $1`,
		{ bind: [assessed.varietyId, exhibitorId], type: QueryTypes.SELECT, transaction }
	);
	const v = facts[0];
	const result = checkEligibility({
		rules: showClass.rules,
		plant: {
			varietyId: assessed.varietyId,
			varietyName: v.name,
			isSpecies: v.is_species,
			habit: v.habit,
			sizeClass: v.size_class,
			blossomType: v.blossom_type,
			blossomColours: v.blossom_colours,
			foliage: v.foliage,
			acquiredOn: plant.obtained_on
		},
		show: show.context,
		exhibitor: {
			inGoodStanding: v.dues !== null && v.dues >= show.context.showDate,
			entriesInClass: Number(counts.in_class),
			entriesOfVariety: Number(counts.of_variety),
			varietyAlreadyInClass: counts.variety_in_class
		},
		phase: 'entry'
	});
	if (!result.fits) throw new PlantEntryRefused(result.failures);

	const number = locked.nextEntryNumber;
	await sequelize.query(
		'UPDATE shows SET next_entry_number = next_entry_number + 1, updated_at = now() WHERE id = $1',
		{ bind: [show.id], transaction }
	);
	const feeStatus = await feeStatusForNewEntry(show.id, { transaction });
	const [row] = await sequelize.query<{ id: string }>(
		`INSERT INTO entries (show_id, class_id, exhibitor_id, variety_id, number, acquired_on, plant_id, fee_status)
		 VALUES ($1, $2, $3, $4, $5, $6, $7, $8) RETURNING id`,
		{
			bind: [
				show.id,
				showClass.id,
				exhibitorId,
				assessed.varietyId,
				number,
				plant.obtained_on,
				input.plantId,
				feeStatus
			],
			type: QueryTypes.SELECT,
			transaction
		}
	);
	return { id: row.id, number };
}
