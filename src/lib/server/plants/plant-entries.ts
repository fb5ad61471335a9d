import { QueryTypes, type Transaction } from 'sequelize';
import type { RuleFailure } from '$lib/domain/eligibility';
import { Show, sequelize } from '../db';
import {
	EntryInputProblem,
	EntryRefused,
	INACTIVE_STATUSES,
	createEntry
} from '../entries/entries';
import { Refusal } from '../http/refusal';

/** An entry from a plant that the rules refuse; nothing was written. */
export class PlantEntryRefused extends Refusal {
	constructor(readonly failures: RuleFailure[]) {
		super(failures.map((f) => f.message).join(' '), 400, undefined, failures);
	}
}

/**
 * Turns a plant of the member's collection into an entry of a show class ("enter this plant"):
 * the plant gives the variety and the day it was got, and the shared entry service (createEntry)
 * locks the show, checks every rule again and takes the next number. The entry remembers its plant.
 */
export async function createEntryFromPlant(
	exhibitorId: string,
	input: { showId: string; classId: string; plantId: string },
	options: { transaction: Transaction }
): Promise<{ id: string; number: number }> {
	const { transaction } = options;
	const [plant] = await sequelize.query<{
		variety_id: string;
		obtained_on: string;
		entered: number | null;
	}>(
		`SELECT p.variety_id, p.obtained_on,
		        (SELECT e.number FROM entries e
		          WHERE e.plant_id = p.id AND e.show_id = :showId AND e.status NOT IN (:inactiveStatuses)
		          LIMIT 1) AS entered
		   FROM plants p WHERE p.id = :plantId AND p.owner_id = :exhibitorId`,
		{
			replacements: {
				plantId: input.plantId,
				exhibitorId,
				showId: input.showId,
				inactiveStatuses: [...INACTIVE_STATUSES]
			},
			type: QueryTypes.SELECT,
			transaction
		}
	);
	if (!plant) {
		throw new PlantEntryRefused([
			{ code: 'habit_not_allowed', message: 'That plant is not in your collection.' }
		]);
	}
	if (plant.entered !== null) {
		throw new PlantEntryRefused([
			{
				code: 'variety_already_in_class',
				message: `This plant is already entered in this show, as entry ${plant.entered}.`
			}
		]);
	}
	const show = await Show.findByPk(input.showId, { attributes: ['slug'], transaction });
	try {
		const entry = await createEntry(
			input.showId,
			exhibitorId,
			{
				showSlug: show?.slug ?? '',
				classId: input.classId,
				varietyId: plant.variety_id,
				acquiredOn: plant.obtained_on
			},
			{ transaction }
		);
		await sequelize.query('UPDATE entries SET plant_id = :plantId WHERE id = :entryId', {
			replacements: { entryId: entry.id, plantId: input.plantId },
			transaction
		});
		return { id: entry.id, number: entry.number };
	} catch (error) {
		if (error instanceof EntryRefused) throw new PlantEntryRefused(error.failures);
		if (error instanceof EntryInputProblem) {
			throw new PlantEntryRefused([{ code: 'habit_not_allowed', message: error.message }]);
		}
		throw error;
	}
}
