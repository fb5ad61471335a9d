import { randomUUID } from 'node:crypto';
import { QueryTypes, type Transaction } from 'sequelize';
import { todayIn } from '$lib/domain/dates';
import { deskTakesEntries, type DeskEntriesUntil } from '$lib/domain/desk-window';
import { checkEligibility, withDeskAdvice, type DeskFailure } from '$lib/domain/eligibility';
import type { DeskEntryInput } from '$lib/schemas/desk';
import {
	Division,
	Entry,
	Membership,
	Show,
	ShowClass,
	User,
	Variety,
	WalkInExhibitor,
	sequelize
} from '../db';
import { initialFeeStatus } from '$lib/domain/dues';
import { DeskProblem } from './desk-problem';
import { inchesOf } from './desk-measures';
import { NO_ADDRESS_DOMAIN, isStandInAddress } from '../mail/stand-in';
import { classRulesOf, plantFactsOf, showContextOf } from './eligibility-input';
import { exhibitorContextFor, withStandingHint } from './entries';
import { fixEntryNumbers, numberForNewEntry } from './entry-numbers';
import { stageOfShow, verdictFor } from '../shows/show-stage';
import { Refusal } from '../http/refusal';
import { loadSocietySettings } from '../people/society-settings';

/** Whether the desk takes new entries for the show now, and if not, why. */
export async function deskWindowOf(
	show: Show,
	transaction?: Transaction
): Promise<{ open: true } | { open: false; reason: string }> {
	const [settings, stage, started] = await Promise.all([
		loadSocietySettings(show.societyId, { transaction }),
		stageOfShow(show, { transaction }),
		sequelize.query('SELECT 1 FROM score_sheets WHERE show_id = :showId LIMIT 1', {
			replacements: { showId: show.id },
			type: QueryTypes.SELECT,
			transaction
		})
	]);
	return deskTakesEntries({
		until: show.deskEntriesUntil as DeskEntriesUntil,
		stage,
		today: todayIn(settings.timeZone),
		entryDay: show.entryDay,
		judgingStarted: started.length > 0
	});
}

/**
 * The chair's choice of until when the desk takes new entries; refused once the results are
 * published (the show is then closed for good).
 */
export async function setDeskEntriesUntil(
	show: Show,
	until: DeskEntriesUntil,
	options: { transaction: Transaction }
): Promise<void> {
	const verdict = await verdictFor(show, 'desk_window', options);
	if (!verdict.allowed) throw new Refusal(verdict.reason, 409, 'until');
	await show.update({ deskEntriesUntil: until }, { transaction: options.transaction });
}

/** A person the desk may enter plants for: a member of the society, or a walk-in seen before. */
export interface DeskExhibitor {
	userId: string;
	name: string;
	email: string | null;
	household: string | null;
	walkIn: boolean;
}

/** Members and earlier walk-ins of the show's society matching a name or address; at most 20. */
export async function findDeskExhibitors(show: Show, text: string): Promise<DeskExhibitor[]> {
	const q = text.trim().slice(0, 80);
	if (q.length < 2) return [];
	const like = `%${q.replace(/[\\%_]/g, (c) => `\\${c}`)}%`;
	const rows = await sequelize.query<{
		user_id: string;
		name: string | null;
		email: string;
		household: string | null;
		walk_in: boolean;
	}>(
		`SELECT u.id AS user_id, COALESCE(w.name, u.name) AS name, u.email,
		        COALESCE(m.household, w.household) AS household, w.id IS NOT NULL AS walk_in
		   FROM users u
		   LEFT JOIN memberships m ON m.user_id = u.id AND m.society_id = :societyId
		   LEFT JOIN walk_in_exhibitors w ON w.user_id = u.id AND w.society_id = :societyId
		  WHERE (m.id IS NOT NULL OR w.id IS NOT NULL)
		    AND (u.name ILIKE :like OR w.name ILIKE :like OR u.email ILIKE :like)
		  ORDER BY COALESCE(w.name, u.name, u.email)
		  LIMIT 20`,
		{ replacements: { societyId: show.societyId, like }, type: QueryTypes.SELECT }
	);
	return rows.map((r) => ({
		userId: r.user_id,
		name: r.name ?? r.email,
		email: isStandInAddress(r.email) ? null : r.email,
		household: r.household,
		walkIn: r.walk_in
	}));
}

/** An entry the desk refused, with every failed rule and what to do about it. */
export class DeskEntryRefused extends Refusal {
	constructor(readonly failures: DeskFailure[]) {
		super(failures.map((f) => f.message).join(' '), 400, undefined, failures);
	}
}

/**
 * The person the entry is for: a member (or earlier walk-in) of the society, or a new walk-in.
 * A walk-in's address that already has an account enters for that account; otherwise a person
 * record is made with the address (or a stand-in under `.invalid`), which the walk-in reaches by
 * signing in with the address.
 */
async function exhibitorFor(
	show: Show,
	input: DeskEntryInput,
	clerkId: string,
	transaction: Transaction
): Promise<string> {
	if (input.who === 'member') {
		const [member, walkIn] = await Promise.all([
			Membership.findOne({
				where: { societyId: show.societyId, userId: input.memberId },
				transaction
			}),
			WalkInExhibitor.findOne({
				where: { societyId: show.societyId, userId: input.memberId },
				transaction
			})
		]);
		if (!member && !walkIn) throw new DeskProblem('That person is not a member of this society.');
		return input.memberId;
	}
	const name = input.walkInName!;
	if (input.walkInEmail) {
		const existing = await User.findOne({ where: { email: input.walkInEmail }, transaction });
		if (existing) return existing.id;
	}
	const user = await User.create(
		{
			name,
			email: input.walkInEmail ?? `${randomUUID()}@${NO_ADDRESS_DOMAIN}`,
			emailVerified: null,
			image: null
		},
		{ transaction }
	);
	await WalkInExhibitor.create(
		{
			societyId: show.societyId,
			userId: user.id,
			name,
			email: input.walkInEmail,
			household: input.walkInHousehold,
			createdBy: clerkId,
			claimedAt: null
		},
		{ transaction }
	);
	return user.id;
}

/**
 * Enters a plant at the desk for a member or a walk-in exhibitor, measured and checked in at
 * once, while the show's desk takes entries. Locks the show's row (numbers and limits are
 * decided one entry at a time), runs the same eligibility check as the entry form with the
 * desk's measurements, fixes the show's numbers first if entries have closed and they are not
 * fixed yet, and gives the entry its number. Throws DeskEntryRefused (nothing written, not even
 * the walk-in) when a rule fails, DeskProblem for anything else the desk cannot do.
 */
export async function enterAtDesk(
	showId: string,
	clerk: { id: string; email?: string },
	input: DeskEntryInput,
	options: { transaction: Transaction }
): Promise<{ id: string; number: number }> {
	const { transaction } = options;
	const show = await Show.findByPk(showId, { transaction, lock: transaction.LOCK.UPDATE });
	if (!show) throw new DeskProblem('That show does not exist.');
	const window = await deskWindowOf(show, transaction);
	if (!window.open) throw new DeskProblem(window.reason);

	const [showClass, variety] = await Promise.all([
		ShowClass.findOne({ where: { id: input.classId, showId: show.id }, transaction }),
		Variety.findOne({ where: { id: input.varietyId, societyId: show.societyId }, transaction })
	]);
	if (!showClass) throw new DeskProblem('That class is not in this show’s schedule.');
	const division = await Division.findByPk(showClass.divisionId, {
		attributes: ['kind'],
		transaction
	});
	if (division?.kind !== 'horticulture') {
		throw new DeskProblem('Plants are entered in horticulture classes; choose one of those.');
	}
	if (!variety) throw new DeskProblem('That variety is not in the society’s registry.');

	const exhibitorId = await exhibitorFor(show, input, clerk.id, transaction);
	const { diameter, pot, leaf } = inchesOf(input);
	const settings = await loadSocietySettings(show.societyId, { transaction });
	const exhibitorIn = await exhibitorContextFor(show, exhibitorId, variety.id, { transaction });
	const result = checkEligibility({
		rules: classRulesOf(showClass),
		plant: plantFactsOf(variety, input.acquiredOn, {
			measured: {
				diameterIn: diameter,
				crowns: input.crowns,
				potIn: pot,
				...(leaf === null ? {} : { leafIn: leaf })
			}
		}),
		show: showContextOf(show, todayIn(settings.timeZone), settings.lengthUnit),
		exhibitor: exhibitorIn(showClass.id),
		phase: 'desk'
	});
	if (!result.fits) {
		throw new DeskEntryRefused(
			withDeskAdvice({ fits: false, failures: withStandingHint(result.failures) }).failures
		);
	}

	await fixEntryNumbers(show, { transaction, actor: clerk });
	const number = await numberForNewEntry(show, showClass.id, transaction);
	const entry = await Entry.create(
		{
			showId: show.id,
			classId: showClass.id,
			exhibitorId,
			number,
			title: null,
			acquiredOn: input.acquiredOn,
			status: 'checked_in',
			measuredDiameterIn: diameter.toFixed(2),
			measuredCrowns: input.crowns,
			potSizeIn: pot.toFixed(2),
			measuredLeafIn: leaf === null ? null : leaf.toFixed(2),
			checkedInAt: new Date(),
			checkedInBy: clerk.id,
			varietyId: variety.id,
			enteredAtDeskBy: clerk.id,
			feeStatus: initialFeeStatus(show.entryFeeCents)
		},
		{ transaction }
	);
	return { id: entry.id, number: entry.number };
}

/**
 * Marks the walk-in records of a person who has just signed in as claimed (the first time): their
 * entries were made for this very person record, so nothing moves.
 */
export async function claimWalkIns(userId: string): Promise<void> {
	await WalkInExhibitor.update({ claimedAt: new Date() }, { where: { userId, claimedAt: null } });
}

/** A horticulture class of the show the desk can enter a plant in. */
export interface DeskClass {
	id: string;
	label: string;
}

/** The show's horticulture classes in schedule order, for the desk's entry form. */
export async function listDeskClasses(showId: string): Promise<DeskClass[]> {
	const rows = await sequelize.query<{ id: string; code: string; name: string }>(
		`SELECT c.id, c.code, c.name FROM classes c JOIN divisions d ON d.id = c.division_id
		  WHERE c.show_id = :showId AND d.kind = 'horticulture'
		  ORDER BY d.position, c.position`,
		{ replacements: { showId }, type: QueryTypes.SELECT }
	);
	return rows.map((r) => ({ id: r.id, label: `${r.code} ${r.name}` }));
}

/** An entry of a person without a role in the society (a walk-in), as their start page lists it. */
export interface OwnEntry {
	id: string;
	number: number;
	showName: string;
	showSlug: string;
	resultsPublished: boolean;
	classLabel: string;
	plant: string;
	status: string;
}

/** The person's entries in every show, newest show first, with whether its results are out. */
export async function listOwnEntries(userId: string): Promise<OwnEntry[]> {
	const rows = await sequelize.query<{
		id: string;
		number: number;
		show_name: string;
		show_slug: string;
		published: boolean;
		class_label: string;
		plant: string;
		status: string;
	}>(
		`SELECT e.id, e.number, s.name AS show_name, s.slug AS show_slug,
		        s.results_published_at IS NOT NULL AS published, c.code || ' ' || c.name AS class_label,
		        COALESCE(v.name, e.title, '') AS plant, e.status
		   FROM entries e
		   JOIN shows s ON s.id = e.show_id
		   JOIN classes c ON c.id = e.class_id
		   LEFT JOIN varieties v ON v.id = e.variety_id
		  WHERE e.exhibitor_id = :userId
		  ORDER BY s.judging_day DESC, e.number`,
		{ replacements: { userId }, type: QueryTypes.SELECT }
	);
	return rows.map((r) => ({
		id: r.id,
		number: r.number,
		showName: r.show_name,
		showSlug: r.show_slug,
		resultsPublished: r.published,
		classLabel: r.class_label,
		plant: r.plant,
		status: r.status
	}));
}
