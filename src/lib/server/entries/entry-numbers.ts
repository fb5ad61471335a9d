import { randomInt } from 'node:crypto';
import { QueryTypes, type Transaction } from 'sequelize';
import {
	assignEntryNumbers,
	classNumbersOf,
	nextFreeEntryNumber,
	type EntryNumberForm
} from '$lib/domain/entry-numbers';
import { recordShowAudit, type AuditActor } from '../audit';
import { Show, ShowClass, sequelize } from '../db';
import { IN_SCHEDULE_ORDER } from '../shows/schedule';
import { stageOfShow } from '../shows/show-stage';
import { DeskProblem } from './desk-problem';

/** Stages in which a show's numbers may be fixed: once entries made online have closed. */
const FIXABLE_STAGES = new Set(['entries_closed', 'show_days', 'awaiting_results']);

/** The class number of each class of a show, for the class-prefix form (see `classNumbersOf`). */
async function classNumbers(
	showId: string,
	transaction?: Transaction
): Promise<Map<string, number>> {
	const classes = await ShowClass.findAll({
		where: { showId },
		attributes: ['id', 'code'],
		...IN_SCHEDULE_ORDER,
		transaction
	});
	const numbers = classNumbersOf(classes.map((c) => c.code));
	return new Map(classes.map((c, i) => [c.id, numbers[i]]));
}

/**
 * Fixes the entry numbers of a show once entries have closed: every entry (withdrawn ones too,
 * so no number is ever given twice) gets a number from the show's seeded shuffle, in the show's
 * form. Done once; later entries draw from the numbers left (`numberForNewEntry`). The caller
 * holds the show's row lock. Audited. Returns false (changing nothing) when already fixed.
 */
export async function fixEntryNumbers(
	show: Show,
	options: { transaction: Transaction; actor: AuditActor }
): Promise<boolean> {
	const { transaction } = options;
	if (show.entryNumbersFixedAt) return false;
	const stage = await stageOfShow(show, { transaction });
	if (!FIXABLE_STAGES.has(stage)) {
		throw new DeskProblem(
			'Entry numbers are fixed once entries have closed; members may still be entering.'
		);
	}
	const entries = await sequelize.query<{ id: string; class_id: string; number: number }>(
		'SELECT id, class_id, number FROM entries WHERE show_id = :showId ORDER BY id',
		{ replacements: { showId: show.id }, type: QueryTypes.SELECT, transaction }
	);
	const perClass = await classNumbers(show.id, transaction);
	const seed = randomInt(1, 2 ** 31 - 1);
	const form = show.entryNumberForm;
	const { numbers, digits } = assignEntryNumbers(
		entries.map((e) => ({ id: e.id, classNumber: perClass.get(e.class_id) ?? 1 })),
		form,
		seed
	);
	if (entries.length > 0) {
		// Two steps, so the unique (show, number) never sees two entries on one number.
		await sequelize.query('UPDATE entries SET number = -number WHERE show_id = :showId', {
			replacements: { showId: show.id },
			transaction
		});
		await sequelize.query(
			`UPDATE entries e SET number = v.number, updated_at = now()
			   FROM unnest(CAST(ARRAY[:entryIds] AS uuid[]), CAST(ARRAY[:numbers] AS int[])) AS v (id, number)
			  WHERE e.id = v.id AND e.show_id = :showId`,
			{
				replacements: {
					showId: show.id,
					entryIds: entries.map((e) => e.id),
					numbers: entries.map((e) => numbers.get(e.id)!)
				},
				transaction
			}
		);
	}
	await show.update(
		{ entryNumberSeed: seed, entryNumberDigits: digits, entryNumbersFixedAt: new Date() },
		{ transaction }
	);
	await recordShowAudit(
		show,
		{
			action: 'entry_numbers.fix',
			target: { kind: 'show', id: show.id, label: show.name },
			details: {
				before: { numbering: 'in the order entered' },
				after: { form, entries: entries.length }
			}
		},
		options
	);
	return true;
}

/**
 * The number for an entry made now in a class: the next of the show's sequence while numbers are
 * not fixed yet (they are shuffled when fixed), else the first free number of the class's (or the
 * show's) shuffled range. The caller holds the show's row lock.
 */
export async function numberForNewEntry(
	show: Show,
	classId: string,
	transaction: Transaction
): Promise<number> {
	if (!show.entryNumbersFixedAt || show.entryNumberSeed === null) {
		const number = show.nextEntryNumber;
		await show.update({ nextEntryNumber: number + 1 }, { transaction });
		return number;
	}
	const taken = await sequelize.query<{ number: number }>(
		'SELECT number FROM entries WHERE show_id = :showId',
		{ replacements: { showId: show.id }, type: QueryTypes.SELECT, transaction }
	);
	const classNumber = (await classNumbers(show.id, transaction)).get(classId) ?? 1;
	const number = nextFreeEntryNumber(
		show.entryNumberForm as EntryNumberForm,
		show.entryNumberSeed,
		show.entryNumberDigits ?? 3,
		classNumber,
		new Set(taken.map((t) => t.number))
	);
	if (number === null) {
		throw new DeskProblem(
			'Every entry number of this class is taken; ask the show chair to split the class.'
		);
	}
	return number;
}

/** Fixes a show's entry numbers now, in one transaction holding the show's row lock. */
export async function fixEntryNumbersNow(showId: string, actor: AuditActor): Promise<boolean> {
	return sequelize.transaction(async (transaction) => {
		const show = await Show.findByPk(showId, { transaction, lock: transaction.LOCK.UPDATE });
		if (!show) throw new DeskProblem('This show does not exist.');
		return fixEntryNumbers(show, { transaction, actor });
	});
}
