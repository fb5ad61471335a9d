import { Op, QueryTypes, type Transaction } from 'sequelize';
import { formatDateLong, todayIn, type IsoDate } from '$lib/domain/dates';
import {
	checkEligibility,
	type CheckPhase,
	type EligibilityResult,
	type ExhibitorContext,
	type RuleFailure
} from '$lib/domain/eligibility';
import type { EntryRequest } from '$lib/schemas/entry';
import { recordAudit } from '../audit';
import { Division, Entry, Show, ShowClass, Variety, sequelize } from '../db';
import { classRulesOf, exhibitorContextOf, plantFactsOf, showContextOf } from './eligibility-input';
import { numberForNewEntry } from './entry-numbers';
import { MEMBERSHIP_PAGE, isInGoodStanding } from '../people/standing';
import { initialFeeStatus } from '$lib/domain/dues';
import { settleFeeOfWithdrawnEntry } from '../payments/refunds';
import { loadSocietySettings } from '../people/society-settings';
import { societyToday } from '../people/society-today';
import { Refusal } from '../http/refusal';

/** Statuses that no longer count towards an exhibitor's limits. */
export const INACTIVE_STATUSES = ['withdrawn', 'scratched'] as const;

/**
 * The exhibitor's standing and other active entries in a show, as a function of the class, so
 * the same counts serve one class or a list of candidate classes (one query for the entries).
 */
export async function exhibitorContextFor(
	show: Show,
	exhibitorId: string,
	varietyId: string,
	options: { exceptEntryId?: string; transaction?: Transaction } = {}
): Promise<(classId: string) => ExhibitorContext> {
	const { transaction, exceptEntryId } = options;
	const [inGoodStanding, others] = await Promise.all([
		isInGoodStanding(exhibitorId, show.societyId, show.judgingDay, { transaction }),
		Entry.findAll({
			where: {
				showId: show.id,
				exhibitorId,
				status: { [Op.notIn]: [...INACTIVE_STATUSES] },
				...(exceptEntryId ? { id: { [Op.ne]: exceptEntryId } } : {})
			},
			attributes: ['id', 'classId', 'varietyId'],
			transaction
		})
	]);
	return exhibitorContextOf(inGoodStanding, others, varietyId);
}

/** Adds to the domain's good-standing sentence where a member becomes current. */
export function withStandingHint(failures: RuleFailure[]): RuleFailure[] {
	return failures.map((f) =>
		f.code === 'not_in_good_standing'
			? {
					...f,
					message: `${f.message} You can pay your dues on your membership page (${MEMBERSHIP_PAGE}).`
				}
			: f
	);
}

/** An entry request that names a class or variety outside the show's society. */
export class EntryInputProblem extends Refusal {
	declare readonly field: 'classId' | 'varietyId' | 'showSlug';
	constructor(message: string, field: 'classId' | 'varietyId' | 'showSlug') {
		super(message, 400, field);
	}
}

/** An entry the rules refuse, with every failed rule. */
export class EntryRefused extends Refusal {
	constructor(readonly failures: RuleFailure[]) {
		super(failures.map((f) => f.message).join(' '), 400, undefined, failures);
	}
}

interface Resolved {
	show: Show;
	showClass: ShowClass;
	variety: Variety;
}

async function resolve(
	show: Show,
	input: EntryRequest,
	transaction?: Transaction
): Promise<Resolved> {
	const [showClass, variety] = await Promise.all([
		ShowClass.findOne({ where: { id: input.classId, showId: show.id }, transaction }),
		Variety.findOne({ where: { id: input.varietyId, societyId: show.societyId }, transaction })
	]);
	if (!show.schedulePublishedAt) {
		throw new EntryInputProblem('There is no show at this address.', 'showSlug');
	}
	if (!showClass)
		throw new EntryInputProblem('That class is not in this show’s schedule.', 'classId');
	// Members enter plants in horticulture classes only, as the entry form offers them.
	const division = await Division.findByPk(showClass.divisionId, {
		attributes: ['kind'],
		transaction
	});
	if (division?.kind !== 'horticulture') {
		throw new EntryInputProblem(
			'That class does not take plant entries from members; ask the show chair.',
			'classId'
		);
	}
	if (!variety)
		throw new EntryInputProblem('That variety is not in the society’s registry.', 'varietyId');
	return { show, showClass, variety };
}

async function judge(
	{ show, showClass, variety }: Resolved,
	exhibitorId: string,
	acquiredOn: IsoDate,
	phase: CheckPhase,
	transaction?: Transaction
): Promise<EligibilityResult> {
	const exhibitorIn = await exhibitorContextFor(show, exhibitorId, variety.id, { transaction });
	const settings = await loadSocietySettings(show.societyId, { transaction });
	const result = checkEligibility({
		rules: classRulesOf(showClass),
		plant: plantFactsOf(variety, acquiredOn),
		show: showContextOf(show, todayIn(settings.timeZone), settings.lengthUnit),
		exhibitor: exhibitorIn(showClass.id),
		phase
	});
	return { fits: result.fits, failures: withStandingHint(result.failures) };
}

/** Checks an entry request without writing anything (the form's live answer). */
export async function previewEntry(
	show: Show,
	exhibitorId: string,
	input: EntryRequest
): Promise<EligibilityResult & { className: string; varietyName: string }> {
	const resolved = await resolve(show, input);
	const result = await judge(resolved, exhibitorId, input.acquiredOn, 'entry');
	return {
		...result,
		className: `${resolved.showClass.code} ${resolved.showClass.name}`,
		varietyName: resolved.variety.name
	};
}

/**
 * Enters a plant: locks the show row (SELECT … FOR UPDATE) so entry numbers and limits are
 * decided one entry at a time, checks every rule again, and writes the entry with the next
 * number. Throws EntryRefused (nothing written) when a rule fails.
 */
export async function createEntry(
	showId: string,
	exhibitorId: string,
	input: EntryRequest,
	options: { transaction: Transaction }
): Promise<Entry> {
	const { transaction } = options;
	const show = await Show.findByPk(showId, { transaction, lock: transaction.LOCK.UPDATE });
	if (!show) throw new EntryInputProblem('That show does not exist.', 'showSlug');
	const resolved = await resolve(show, input, transaction);
	const result = await judge(resolved, exhibitorId, input.acquiredOn, 'entry', transaction);
	if (!result.fits) throw new EntryRefused(result.failures);
	const number = await numberForNewEntry(show, resolved.showClass.id, transaction);
	return Entry.create(
		{
			showId: show.id,
			classId: resolved.showClass.id,
			exhibitorId,
			number,
			title: null,
			acquiredOn: input.acquiredOn,
			measuredDiameterIn: null,
			measuredCrowns: null,
			potSizeIn: null,
			checkedInAt: null,
			checkedInBy: null,
			varietyId: resolved.variety.id,
			feeStatus: initialFeeStatus(show.entryFeeCents)
		},
		{ transaction }
	);
}

/** Runs createEntry in its own transaction. */
export function enterPlant(
	showId: string,
	exhibitorId: string,
	input: EntryRequest
): Promise<Entry> {
	return sequelize.transaction((transaction) =>
		createEntry(showId, exhibitorId, input, { transaction })
	);
}

/** An exhibitor's own entry in a show, as their page lists it. */
export interface MyEntry {
	id: string;
	number: number;
	classLabel: string;
	plant: string;
	acquiredOn: string | null;
	status: string;
	photoCount: number;
}

/** One exhibitor's entries in one show, by number, with their photo counts (one query). */
export async function listMyEntriesInShow(showId: string, exhibitorId: string): Promise<MyEntry[]> {
	const rows = await sequelize.query<{
		id: string;
		number: number;
		class_label: string;
		plant: string;
		acquired_on: string | null;
		status: string;
		photos: string;
	}>(
		`SELECT e.id, e.number, c.code || ' ' || c.name AS class_label,
		        COALESCE(v.name, e.title, '') AS plant, e.acquired_on, e.status,
		        (SELECT count(*) FROM entry_photos p WHERE p.entry_id = e.id) AS photos
		   FROM entries e
		   JOIN classes c ON c.id = e.class_id
		   LEFT JOIN varieties v ON v.id = e.variety_id
		  WHERE e.show_id = :showId AND e.exhibitor_id = :exhibitorId
		  ORDER BY e.number`,
		{ replacements: { showId, exhibitorId }, type: QueryTypes.SELECT }
	);
	return rows.map((r) => ({
		id: r.id,
		number: r.number,
		classLabel: r.class_label,
		plant: r.plant,
		acquiredOn: r.acquired_on,
		status: r.status,
		photoCount: Number(r.photos)
	}));
}

/**
 * True while exhibitors may still enter and withdraw: on or before the day entries close, with
 * `today` read in the society's time zone.
 */
export function entriesStillOpen(show: Pick<Show, 'entriesClose'>, today: IsoDate): boolean {
	return today <= show.entriesClose;
}

/**
 * Withdraws an exhibitor's own entry while entries are open; it stays on record as withdrawn,
 * and the audit log keeps who did it and what became of the fee (in the same transaction).
 * Returns a plain sentence when it cannot be withdrawn, otherwise null.
 */
export async function withdrawEntry(
	exhibitorId: string,
	entryId: string,
	options: { transaction: Transaction }
): Promise<string | null> {
	const { transaction } = options;
	const entry = await Entry.findOne({
		where: { id: entryId, exhibitorId },
		transaction,
		lock: transaction.LOCK.UPDATE
	});
	if (!entry) return 'That entry is not one of yours.';
	const show = await Show.findByPk(entry.showId, { transaction });
	const today = show ? await societyToday(show.societyId, { transaction }) : '';
	if (!show || !entriesStillOpen(show, today)) {
		return `Entries closed on ${show ? formatDateLong(show.entriesClose) : 'an earlier day'}; ask the show chair to withdraw it.`;
	}
	if (entry.status !== 'entered')
		return 'Only an entry that is not yet checked in can be withdrawn.';
	const feeBefore = entry.feeStatus;
	await entry.update({ status: 'withdrawn' }, { transaction });
	// A fee not yet paid is no longer owed; a paid one is refunded where the show allows it
	// (its job, queued in this transaction, sends it after the commit).
	const fee = await settleFeeOfWithdrawnEntry(entry.id, { transaction });
	await recordAudit(
		{
			societyId: show.societyId,
			showId: show.id,
			actor: { id: exhibitorId },
			action: 'entry.withdraw',
			target: { kind: 'entry', id: entry.id, label: `Entry ${entry.number}` },
			details: {
				before: { status: 'entered', feeStatus: feeBefore },
				after: { status: 'withdrawn' },
				fee
			}
		},
		{ transaction }
	);
	return null;
}

/** The id of the show's entry with this number, or null. */
export async function entryIdByNumber(showId: string, number: number): Promise<string | null> {
	const entry = await Entry.findOne({ where: { showId, number }, attributes: ['id'] });
	return entry?.id ?? null;
}

/** A member's own entry by its id; another person's entry is never found. */
export async function findOwnEntry(userId: string, entryId: string): Promise<Entry | null> {
	return Entry.findOne({ where: { id: entryId, exhibitorId: userId } });
}

/** What the member's page of an entry shows of it: its number, state, plant, class and show. */
export interface OwnEntryView {
	id: string;
	number: number | null;
	status: Entry['status'];
	plant: string;
	classLabel: string;
	showName: string;
	showSlug: string;
}

export async function describeOwnEntry(entry: Entry): Promise<OwnEntryView> {
	const [show, showClass, variety] = await Promise.all([
		Show.findByPk(entry.showId, { attributes: ['name', 'slug'] }),
		ShowClass.findByPk(entry.classId, { attributes: ['code', 'name'] }),
		entry.varietyId ? Variety.findByPk(entry.varietyId, { attributes: ['name'] }) : null
	]);
	return {
		id: entry.id,
		number: entry.number,
		status: entry.status,
		plant: variety?.name ?? entry.title ?? '',
		classLabel: showClass ? `${showClass.code} ${showClass.name}` : '',
		showName: show?.name ?? '',
		showSlug: show?.slug ?? ''
	};
}
