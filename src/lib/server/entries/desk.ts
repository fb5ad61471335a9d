import { GROWTH_FORM_LABELS, isPlantGroup, plantGroupOf } from '$lib/domain/plant-groups';
import { QueryTypes, type Transaction } from 'sequelize';
import {
	checkEligibility,
	classesThatFit,
	measuredSizeClass,
	withDeskAdvice,
	type DeskVerdict,
	type PlantFacts
} from '$lib/domain/eligibility';
import { todayIn } from '$lib/domain/dates';
import type { CheckInInput } from '$lib/schemas/desk';
import { DeskProblem } from './desk-problem';
import { inchesOf } from './desk-measures';
import { fixEntryNumbers, numberForNewEntry } from './entry-numbers';
import { stageOfShow } from '../shows/show-stage';

import { recordShowAudit, type AuditActor } from '../audit';
import { Division, Entry, Show, ShowClass, User, Variety, sequelize } from '../db';
import { classRulesOf, measuredOf, plantFactsOf, showContextOf } from './eligibility-input';
import { exhibitorContextFor, withStandingHint } from './entries';
import { IN_SCHEDULE_ORDER } from '../shows/schedule';
import { loadSocietySettings } from '../people/society-settings';

/** Stages in which the first check-in fixes the entry numbers: entries made online have closed. */
const FIXED_AT_CHECK_IN = new Set(['entries_closed', 'show_days']);

/** A line of the desk's search results. */
export interface DeskHit {
	id: string;
	number: number;
	classLabel: string;
	plant: string;
	exhibitor: string;
	status: string;
}

/**
 * Finds entries of a show by entry number (when the text is a number) or by variety, title or
 * exhibitor name; at most 30, by number.
 */
export async function findDeskEntries(showId: string, text: string): Promise<DeskHit[]> {
	const q = text.trim().slice(0, 80);
	if (!q) return [];
	const number = /^\d{1,9}$/.test(q) ? Number(q) : null;
	const like = `%${q.replace(/[\\%_]/g, (c) => `\\${c}`)}%`;
	const rows = await sequelize.query<{
		id: string;
		number: number;
		class_label: string;
		plant: string;
		exhibitor: string;
		status: string;
	}>(
		`SELECT e.id, e.number, c.code || ' ' || c.name AS class_label,
		        COALESCE(v.name, e.title, '') AS plant, COALESCE(u.name, u.email) AS exhibitor, e.status
		   FROM entries e
		   JOIN classes c ON c.id = e.class_id
		   JOIN users u ON u.id = e.exhibitor_id
		   LEFT JOIN varieties v ON v.id = e.variety_id
		  WHERE e.show_id = :showId
		    AND (${number !== null ? 'e.number = :number' : 'v.name ILIKE :like OR e.title ILIKE :like OR u.name ILIKE :like OR u.email ILIKE :like'})
		  ORDER BY e.number
		  LIMIT 30`,
		{ replacements: { showId, number, like }, type: QueryTypes.SELECT }
	);
	return rows.map((r) => ({
		id: r.id,
		number: r.number,
		classLabel: r.class_label,
		plant: r.plant,
		exhibitor: r.exhibitor,
		status: r.status
	}));
}

/** A class the desk may move an entry to. */
export interface ClassChoice {
	id: string;
	label: string;
}

/** The desk's view of one entry: facts, the verdict with measurements, and classes that fit. */
export interface DeskEntry {
	id: string;
	number: number;
	status: string;
	classId: string;
	classLabel: string;
	plant: string;
	exhibitor: string;
	variety: {
		name: string;
		habit: string;
		sizeClass: string;
		blossomType: string;
		blossomColours: string[];
		foliage: string;
		/** The group's name (African violet, Sinningia, …) and the growth form in words. */
		group?: string;
		growthForm?: string;
	} | null;
	shownSizeClass: string | null;
	acquiredOn: string | null;
	measuredDiameterIn: number | null;
	measuredCrowns: number | null;
	potSizeIn: number | null;
	/** The longest leaf blade, and whether the plant's group sizes any of its plants by the leaf. */
	measuredLeafIn: number | null;
	sizedByLeaf: boolean;
	checkedInAt: string | null;
	deskNote: string | null;
	verdict: DeskVerdict | null;
	proposals: ClassChoice[];
}

function measuredFacts(entry: Entry, variety: Variety): PlantFacts {
	return plantFactsOf(variety, entry.acquiredOn, {
		sizeClass: entry.shownSizeClass ?? variety.sizeClass,
		measured: measuredOf(entry)
	});
}

interface Judged {
	verdict: DeskVerdict;
	fitting: ShowClass[];
	plant: PlantFacts;
}

/** Runs the eligibility again with what was measured, and finds the classes the plant fits. */
async function judgeAtDesk(
	show: Show,
	entry: Entry,
	variety: Variety,
	classes: ShowClass[],
	transaction?: Transaction
): Promise<Judged> {
	const plant = measuredFacts(entry, variety);
	const exhibitorIn = await exhibitorContextFor(show, entry.exhibitorId, variety.id, {
		exceptEntryId: entry.id,
		transaction
	});
	const settings = await loadSocietySettings(show.societyId, { transaction });
	const context = showContextOf(show, todayIn(settings.timeZone), settings.lengthUnit);
	const current = classes.find((c) => c.id === entry.classId)!;
	const result = checkEligibility({
		rules: classRulesOf(current),
		plant,
		show: context,
		exhibitor: exhibitorIn(current.id),
		phase: 'desk'
	});
	// A plant that outgrew its declared size class is proposed where its measured size fits.
	const asMeasured = { ...plant, sizeClass: measuredSizeClass(plant) };
	const horticulture = new Set(
		(
			await Division.findAll({
				where: { showId: show.id, kind: 'horticulture' },
				attributes: ['id'],
				transaction
			})
		).map((d) => d.id)
	);
	const ids = classesThatFit(
		asMeasured,
		classes
			.filter((c) => horticulture.has(c.divisionId))
			.map((c) => ({ id: c.id, rules: classRulesOf(c) })),
		{ phase: 'desk', show: context, exhibitorIn }
	);
	return {
		verdict: withDeskAdvice({ fits: result.fits, failures: withStandingHint(result.failures) }),
		fitting: classes.filter((c) => ids.includes(c.id) && c.id !== entry.classId),
		plant: asMeasured
	};
}

const label = (c: ShowClass) => `${c.code} ${c.name}`;

/** A variety's group and growth form in words, for the clerk. */
function groupWords(variety: Variety): { group: string; growthForm: string } {
	const form = variety.growthForm ?? variety.habit;
	return {
		group: isPlantGroup(variety.plantGroup)
			? plantGroupOf(variety.plantGroup).name
			: variety.plantGroup,
		growthForm: GROWTH_FORM_LABELS[form] ?? form
	};
}

/** Whether the variety's group has a size class measured by the longest leaf blade. */
function sizedByLeaf(variety: Variety): boolean {
	return (
		isPlantGroup(variety.plantGroup) &&
		plantGroupOf(variety.plantGroup).sizeClasses.some((s) => s.measure === 'leaf')
	);
}

/** Loads an entry of a show by its number for the desk, or null. */
export async function loadDeskEntry(show: Show, number: number): Promise<DeskEntry | null> {
	const entry = await Entry.findOne({ where: { showId: show.id, number } });
	if (!entry) return null;
	const [classes, variety, exhibitor] = await Promise.all([
		ShowClass.findAll({ where: { showId: show.id }, ...IN_SCHEDULE_ORDER }),
		entry.varietyId ? Variety.findByPk(entry.varietyId) : Promise.resolve(null),
		User.findByPk(entry.exhibitorId, { attributes: ['name', 'email'] })
	]);
	const current = classes.find((c) => c.id === entry.classId)!;
	const judged = variety ? await judgeAtDesk(show, entry, variety, classes) : null;
	return {
		id: entry.id,
		number: entry.number,
		status: entry.status,
		classId: entry.classId,
		classLabel: label(current),
		plant: variety?.name ?? entry.title ?? '',
		exhibitor: exhibitor?.name ?? exhibitor?.email ?? '',
		variety: variety
			? {
					name: variety.name,
					habit: variety.habit,
					sizeClass: variety.sizeClass,
					blossomType: variety.blossomType,
					blossomColours: variety.blossomColours,
					foliage: variety.foliage,
					...groupWords(variety)
				}
			: null,
		shownSizeClass: entry.shownSizeClass,
		acquiredOn: entry.acquiredOn,
		measuredDiameterIn: entry.measuredDiameterIn === null ? null : Number(entry.measuredDiameterIn),
		measuredCrowns: entry.measuredCrowns,
		potSizeIn: entry.potSizeIn === null ? null : Number(entry.potSizeIn),
		measuredLeafIn: entry.measuredLeafIn === null ? null : Number(entry.measuredLeafIn),
		sizedByLeaf: variety ? sizedByLeaf(variety) : false,
		checkedInAt: entry.checkedInAt ? entry.checkedInAt.toISOString() : null,
		deskNote: entry.deskNote,
		verdict: judged?.verdict ?? null,
		proposals: (judged?.fitting ?? []).map((c) => ({ id: c.id, label: label(c) }))
	};
}

export { DeskProblem };

async function lockEntry(show: Show, entryId: string, transaction: Transaction): Promise<Entry> {
	const entry = await Entry.findOne({
		where: { id: entryId, showId: show.id },
		transaction,
		lock: transaction.LOCK.UPDATE
	});
	if (!entry) throw new DeskProblem('That entry is not part of this show.');
	if (entry.status === 'withdrawn') throw new DeskProblem('The exhibitor withdrew this entry.');
	return entry;
}

/**
 * Checks an entry in with what the clerk measured (inches or centimeters; stored in inches), or
 * with nothing measured yet (`input` null: one tap when the plant arrives).
 * The first check-in after entries have closed fixes the show's entry numbers (shuffled, see
 * `fixEntryNumbers`); returns the entry's number after the check-in.
 */
export async function checkInEntry(
	show: Show,
	entryId: string,
	clerkId: string,
	input: CheckInInput | null,
	options: { transaction: Transaction }
): Promise<number> {
	const { transaction } = options;
	const locked = await Show.findByPk(show.id, { transaction, lock: transaction.LOCK.UPDATE });
	if (
		locked &&
		!locked.entryNumbersFixedAt &&
		FIXED_AT_CHECK_IN.has(await stageOfShow(locked, { transaction }))
	) {
		await fixEntryNumbers(locked, { transaction, actor: { id: clerkId } });
	}
	const entry = await lockEntry(show, entryId, transaction);
	if (entry.status === 'scratched') throw new DeskProblem('This entry was scratched.');
	if (input === null) {
		// One tap: the plant is here; it is measured afterwards.
		if (entry.status !== 'checked_in') {
			await entry.update(
				{ status: 'checked_in', checkedInAt: new Date(), checkedInBy: clerkId },
				{ transaction }
			);
		}
		return entry.number;
	}
	const { diameter, pot, leaf } = inchesOf(input);
	await entry.update(
		{
			status: 'checked_in',
			measuredDiameterIn: diameter.toFixed(2),
			measuredCrowns: input.crowns,
			potSizeIn: pot.toFixed(2),
			// Measured again without a leaf length: the earlier one no longer stands.
			measuredLeafIn: leaf === null ? null : leaf.toFixed(2),
			checkedInAt: entry.checkedInAt ?? new Date(),
			checkedInBy: entry.checkedInBy ?? clerkId
		},
		{ transaction }
	);
	return entry.number;
}

/**
 * Moves an entry to another class of the show; the class must be one the plant fits with its
 * measurements (the desk's proposals). When it fits only at its measured size, the entry is
 * marked as shown at that size class.
 */
export async function moveEntry(
	show: Show,
	entryId: string,
	classId: string,
	options: { transaction: Transaction; actor: AuditActor }
): Promise<{ target: ShowClass; number: number }> {
	const { transaction } = options;
	// The show's row first, as check-in and desk entries take it: numbers may change below.
	const locked = await Show.findByPk(show.id, { transaction, lock: transaction.LOCK.UPDATE });
	const entry = await lockEntry(show, entryId, transaction);
	if (!entry.varietyId) throw new DeskProblem('Only plant entries can be moved here.');
	const [classes, variety] = await Promise.all([
		ShowClass.findAll({ where: { showId: show.id }, ...IN_SCHEDULE_ORDER, transaction }),
		Variety.findByPk(entry.varietyId, { transaction })
	]);
	const target = classes.find((c) => c.id === classId);
	if (!target) throw new DeskProblem('That class is not in this show’s schedule.');
	if (target.id === entry.classId) throw new DeskProblem('The entry is already in that class.');
	const judged = await judgeAtDesk(show, entry, variety!, classes, transaction);
	if (!judged.fitting.some((c) => c.id === classId)) {
		throw new DeskProblem(
			`The plant does not fit class ${label(target)}; choose one of the classes proposed.`
		);
	}
	const declared = variety!.sizeClass;
	const shown = judged.plant.sizeClass;
	const from = classes.find((c) => c.id === entry.classId);
	const before = entry.number;
	// In the class-number form, an entry that changes class takes a number of its new class.
	const renumber = locked?.entryNumbersFixedAt && locked.entryNumberForm === 'class_prefix';
	const number = renumber ? await numberForNewEntry(locked, target.id, transaction) : entry.number;
	await entry.update(
		{ classId: target.id, shownSizeClass: shown === declared ? null : shown, number },
		{ transaction }
	);
	await recordShowAudit(
		show,
		{
			action: 'entry.move',
			target: { kind: 'entry', id: entry.id, label: `Entry ${entry.number}` },
			details: {
				before: { classId: from?.id ?? null, class: from ? label(from) : null },
				after: { classId: target.id, class: label(target), shownSizeClass: entry.shownSizeClass },
				...(number !== before ? { number: { before, after: number } } : {})
			}
		},
		options
	);
	return { target, number };
}

/** Scratches an entry (it stays on record, is not judged), with the clerk's reason. Audited. */
export async function scratchEntry(
	show: Show,
	entryId: string,
	reason: string,
	options: { transaction: Transaction; actor: AuditActor }
): Promise<void> {
	const { transaction } = options;
	const entry = await lockEntry(show, entryId, transaction);
	if (entry.status === 'scratched') throw new DeskProblem('The entry is scratched already.');
	const before = entry.status;
	await entry.update({ status: 'scratched', deskNote: reason }, { transaction });
	await recordShowAudit(
		show,
		{
			action: 'entry.scratch',
			target: { kind: 'entry', id: entry.id, label: `Entry ${entry.number}` },
			details: { before: { status: before }, after: { status: 'scratched' }, reason }
		},
		options
	);
}

/** Entries for tags: number, class and variety, and the exhibitor for the fold-away stub. */
export interface TagEntry {
	number: number;
	classLabel: string;
	plant: string;
	exhibitor: string;
}

/** The entries of a show to print tags for: all active ones, or the given numbers. */
export async function listTagEntries(
	showId: string,
	numbers: number[] | null
): Promise<TagEntry[]> {
	const rows = await sequelize.query<{
		number: number;
		class_label: string;
		plant: string;
		exhibitor: string;
	}>(
		`SELECT e.number, c.code || ' ' || c.name AS class_label, COALESCE(v.name, e.title, '') AS plant,
		        COALESCE(u.name, u.email) AS exhibitor
		   FROM entries e
		   JOIN classes c ON c.id = e.class_id
		   JOIN users u ON u.id = e.exhibitor_id
		   LEFT JOIN varieties v ON v.id = e.variety_id
		  WHERE e.show_id = :showId AND e.status NOT IN ('withdrawn', 'scratched')
		    ${numbers ? 'AND e.number IN (:numbers)' : ''}
		  ORDER BY e.number`,
		{ replacements: { showId, numbers: numbers ?? [] }, type: QueryTypes.SELECT }
	);
	return rows.map((r) => ({
		number: r.number,
		classLabel: r.class_label,
		plant: r.plant,
		exhibitor: r.exhibitor
	}));
}
