import { Op, literal, type FindOptions, type Transaction } from 'sequelize';
import { awardRulesFrom, type AwardRules } from '$lib/domain/awards';
import type { ClassRules, SizeClass } from '$lib/domain/eligibility';
import type { ClassDescribed, ShowDescribed } from '$lib/schedule-text';
import type { ClassInput, DivisionInput, ShowSettingsInput } from '$lib/schemas/show';
import { recordShowAudit, type AuditActor } from '../audit';
import { refuseFrozenClassChange, type ClassProgress } from '$lib/domain/class-rules';
import type { MoveInput, ScheduleTextInput } from '$lib/schemas/show';
import { Division, Entry, Scale, ScoreSheet, Show, ShowClass, sequelize } from '../db';
import { saveAwardRules } from '../results/results';
import { verdictFor } from './show-stage';
import { Refusal } from '../http/refusal';

/** A class of the schedule as pages and PDFs show it. */
export interface ScheduleClass extends ClassDescribed {
	id: string;
	divisionId: string;
	code: string;
	name: string;
	description: string | null;
	scaleId: string | null;
	scaleName: string | null;
}

/** A division with its classes, in schedule order. */
export interface ScheduleDivision {
	id: string;
	code: string;
	name: string;
	kind: 'horticulture' | 'design' | 'other';
	classes: ScheduleClass[];
}

/** A show's settings as the chair's form shows them. */
export interface ShowSettings extends ShowDescribed {
	id: string;
	slug: string;
	name: string;
	awardRules: AwardRules;
	schedulePublished: boolean;
	generalRules: string;
	committee: string;
}

/** The show's award rules, filled from the defaults where a field is missing (`awardRulesFrom`). */
export function awardRulesOf(show: Show): AwardRules {
	return awardRulesFrom(show.awardRules);
}

/** Plain settings of a show for the chair's form. */
export function settingsOf(show: Show): ShowSettings {
	return {
		id: show.id,
		slug: show.slug,
		name: show.name,
		venue: show.venue ?? '',
		publicHours: show.publicHours ?? '',
		entriesOpen: show.entriesOpen,
		entriesClose: show.entriesClose,
		entryDay: show.entryDay,
		judgingDay: show.judgingDay,
		possessionMonths: show.possessionMonths,
		maxEntriesPerClass: show.maxEntriesPerClass,
		maxEntriesPerVariety: show.maxEntriesPerVariety,
		requireGoodStanding: show.requireGoodStanding,
		awardRules: awardRulesOf(show),
		schedulePublished: show.schedulePublishedAt !== null,
		generalRules: show.generalRules ?? '',
		committee: show.committee ?? ''
	};
}

/** The eligibility rules of a class, in the shape the eligibility module reads. */
export function classRulesOf(
	c: Pick<ScheduleClass, keyof ClassRules> | ShowClass
): Required<ClassRules> {
	const diameter = c.maxDiameterIn;
	return {
		habit: c.habit,
		sizeClasses: c.sizeClasses as SizeClass[],
		blossomTypes: c.blossomTypes,
		blossomColours: c.blossomColours,
		foliage: c.foliage,
		minCrowns: c.minCrowns,
		maxCrowns: c.maxCrowns,
		collectionSize: c.collectionSize,
		speciesOnly: c.speciesOnly,
		maxDiameterIn: diameter === null || diameter === undefined ? null : Number(diameter),
		possessionMonths: c.possessionMonths ?? null,
		maxEntriesPerExhibitor: c.maxEntriesPerExhibitor ?? null,
		maxEntriesPerVariety: c.maxEntriesPerVariety ?? null,
		maxPotIn: c.maxPotIn === null || c.maxPotIn === undefined ? null : Number(c.maxPotIn),
		plantKind: c.plantKind ?? 'any',
		genera: c.genera ?? [],
		growthForms: c.growthForms ?? [],
		rootTypes: c.rootTypes ?? []
	};
}

function toScheduleClass(c: ShowClass, scales: Map<string, string>): ScheduleClass {
	return {
		id: c.id,
		divisionId: c.divisionId,
		code: c.code,
		name: c.name,
		description: c.description,
		...classRulesOf(c),
		scaleId: c.scaleId,
		scaleName: c.scaleId ? (scales.get(c.scaleId) ?? null) : null
	};
}

/** Query options that list a show's classes in schedule order: by division, then class. */
export const IN_SCHEDULE_ORDER = {
	include: [{ model: Division, as: 'division', attributes: [] }],
	order: [
		[{ model: Division, as: 'division' }, 'position', 'ASC'],
		['position', 'ASC']
	]
} satisfies Pick<FindOptions, 'include' | 'order'>;

/** The schedule of a show: its divisions and their classes in order (three queries). */
export async function loadSchedule(
	showId: string,
	options: { transaction?: Transaction } = {}
): Promise<ScheduleDivision[]> {
	const { transaction } = options;
	const [divisions, classes] = await Promise.all([
		Division.findAll({ where: { showId }, order: [['position', 'ASC']], transaction }),
		ShowClass.findAll({ where: { showId }, order: [['position', 'ASC']], transaction })
	]);
	const scaleIds = [...new Set(classes.map((c) => c.scaleId).filter((id): id is string => !!id))];
	const scales = scaleIds.length
		? await Scale.findAll({ where: { id: scaleIds }, attributes: ['id', 'name'], transaction })
		: [];
	const names = new Map(scales.map((s) => [s.id, s.name]));
	return divisions.map((d) => ({
		id: d.id,
		code: d.code,
		name: d.name,
		kind: d.kind,
		classes: classes.filter((c) => c.divisionId === d.id).map((c) => toScheduleClass(c, names))
	}));
}

/**
 * The scales of points a society may assign: its own and the shared built-in ones, each in its
 * newest version (a version that a newer one replaces is left out).
 */
export async function listScales(
	societyId: string,
	options: { transaction?: Transaction } = {}
): Promise<{ id: string; name: string }[]> {
	const scales = await Scale.findAll({
		where: {
			[Op.or]: [{ societyId }, { societyId: null }],
			id: {
				[Op.notIn]: literal('(SELECT replaces_id FROM scales WHERE replaces_id IS NOT NULL)')
			}
		},
		attributes: ['id', 'name'],
		order: [['name', 'ASC']],
		transaction: options.transaction
	});
	return scales.map((s) => ({ id: s.id, name: s.name }));
}

/** A rule of the show that cannot be saved, with the field it belongs to. */
export class ScheduleProblem extends Refusal {
	declare readonly field: string;
	constructor(message: string, field = 'form') {
		super(message, 400, field);
	}
}

/** Refuses, with the stage's reason, a change the show's stage does not allow. */
async function requireStage(
	show: Show,
	change: 'schedule' | 'publish_schedule' | 'hide_schedule',
	transaction: Transaction
): Promise<void> {
	const verdict = await verdictFor(show, change, { transaction });
	if (!verdict.allowed) throw new ScheduleProblem(verdict.reason);
}

/** Saves a show's dates, venue and rules; the award thresholds go into its award rules. */
export async function updateShowSettings(
	show: Show,
	input: ShowSettingsInput,
	options: { transaction: Transaction }
): Promise<void> {
	await requireStage(show, 'schedule', options.transaction);
	const current = awardRulesOf(show);
	const awardRules: AwardRules = {
		...current,
		system: input.awardSystem,
		merit: { blue: input.blue, red: input.red, white: input.white },
		placement: {
			first: input.first,
			second: input.second,
			third: input.third,
			honourable: input.honourable
		}
	};
	await show.update(
		{
			name: input.name,
			venue: input.venue || null,
			publicHours: input.publicHours || null,
			entriesOpen: input.entriesOpen,
			entriesClose: input.entriesClose,
			entryDay: input.entryDay,
			judgingDay: input.judgingDay,
			possessionMonths: input.possessionMonths,
			maxEntriesPerClass: input.maxEntriesPerClass,
			maxEntriesPerVariety: input.maxEntriesPerVariety,
			requireGoodStanding: input.requireGoodStanding
		},
		{ transaction: options.transaction }
	);
	// The award rules have one writer, which checks them (a Refusal names the field).
	await saveAwardRules(show, awardRules, show.panelScoreMethod, options);
}

/**
 * Publishes (or withdraws) the schedule, making the public schedule page visible. Hiding a
 * published schedule is recorded in the audit log.
 */
export async function setSchedulePublished(
	show: Show,
	published: boolean,
	options: { transaction: Transaction; actor: AuditActor }
): Promise<void> {
	const { transaction } = options;
	const wasPublished = show.schedulePublishedAt;
	if (published !== (wasPublished !== null)) {
		await requireStage(show, published ? 'publish_schedule' : 'hide_schedule', transaction);
	}
	await show.update({ schedulePublishedAt: published ? new Date() : null }, { transaction });
	if (!published && wasPublished) {
		await recordShowAudit(
			show,
			{
				action: 'schedule.unpublish',
				target: { kind: 'show', id: show.id, label: show.name },
				details: { before: { publishedAt: wasPublished.toISOString() } }
			},
			options
		);
	}
}

async function nextPosition(
	model: typeof Division | typeof ShowClass,
	showId: string,
	transaction: Transaction
): Promise<number> {
	const max = (await (model as typeof Division).max('position', {
		where: { showId },
		transaction
	})) as number | null;
	return (max ?? 0) + 1;
}

async function assertCodeFree(
	model: typeof Division | typeof ShowClass,
	showId: string,
	code: string,
	exceptId: string | null,
	transaction: Transaction
): Promise<void> {
	const where: Record<string | symbol, unknown> = { showId, code };
	if (exceptId) where.id = { [Op.ne]: exceptId };
	const clash = await (model as typeof Division).findOne({ where, transaction });
	if (clash) throw new ScheduleProblem(`The code ${code} is already used in this show.`, 'code');
}

/** Adds a division, or changes one (when `divisionId` is given). */
export async function saveDivision(
	showId: string,
	divisionId: string | null,
	input: DivisionInput,
	options: { transaction: Transaction }
): Promise<Division> {
	const { transaction } = options;
	const show = await Show.findByPk(showId, { transaction });
	if (!show) throw new ScheduleProblem('That show does not exist.');
	await requireStage(show, 'schedule', transaction);
	await assertCodeFree(Division, showId, input.code, divisionId, transaction);
	if (divisionId) {
		const division = await Division.findOne({ where: { id: divisionId, showId }, transaction });
		if (!division) throw new ScheduleProblem('That division is not part of this show.');
		return division.update(input, { transaction });
	}
	const position = await nextPosition(Division, showId, transaction);
	return Division.create({ ...input, position, showId }, { transaction });
}

/** Removes a division with no entries in any of its classes (its classes go with it). */
export async function deleteDivision(
	show: Show,
	divisionId: string,
	options: { transaction: Transaction; actor: AuditActor }
): Promise<void> {
	const { transaction } = options;
	await requireStage(show, 'schedule', transaction);
	const division = await Division.findOne({
		where: { id: divisionId, showId: show.id },
		transaction
	});
	if (!division) throw new ScheduleProblem('That division is not part of this show.');
	const classIds = (
		await ShowClass.findAll({ where: { divisionId }, attributes: ['id'], transaction })
	).map((c) => c.id);
	if (classIds.length && (await Entry.count({ where: { classId: classIds }, transaction })) > 0) {
		throw new ScheduleProblem(
			'This division has entries in its classes; move or withdraw them before removing it.'
		);
	}
	await ShowClass.destroy({ where: { divisionId }, transaction });
	await division.destroy({ transaction });
	await recordShowAudit(
		show,
		{
			action: 'division.delete',
			target: { kind: 'division', id: division.id, label: `${division.code} ${division.name}` },
			details: { before: { code: division.code, name: division.name, classes: classIds.length } }
		},
		options
	);
}

function classValues(input: ClassInput) {
	return {
		code: input.code,
		name: input.name,
		description: input.description || null,
		habit: input.habit,
		sizeClasses: input.sizeClasses,
		blossomTypes: input.blossomTypes,
		blossomColours: input.blossomColours,
		foliage: input.foliage,
		minCrowns: input.minCrowns,
		maxCrowns: input.maxCrowns,
		collectionSize: input.collectionSize,
		speciesOnly: input.speciesOnly,
		maxDiameterIn: input.maxDiameterIn === null ? null : String(input.maxDiameterIn),
		possessionMonths: input.possessionMonths,
		maxEntriesPerExhibitor: input.maxEntriesPerExhibitor,
		maxEntriesPerVariety: input.maxEntriesPerVariety,
		maxPotIn: input.maxPotIn === null ? null : String(input.maxPotIn),
		...groupRulesOfInput(input),
		scaleId: input.scaleId
	};
}

/** Counts a class's entries and the scored sheets on them (for the freeze on its rules). */
export async function classProgress(
	classId: string,
	options: { transaction?: Transaction } = {}
): Promise<ClassProgress> {
	const [entries, scoredSheets] = await Promise.all([
		Entry.count({ where: { classId }, transaction: options.transaction }),
		ScoreSheet.count({
			where: {
				entryId: {
					[Op.in]: literal(`(SELECT id FROM entries WHERE class_id = ${sequelize.escape(classId)})`)
				}
			},
			transaction: options.transaction
		})
	]);
	return { entries, scoredSheets };
}

/** The group, genera, growth forms and root types of a class form (left out: any). */
function groupRulesOfInput(input: ClassInput) {
	return {
		plantKind: input.plantKind ?? 'any',
		genera: input.genera ?? [],
		growthForms: input.growthForms ?? [],
		rootTypes: input.rootTypes ?? []
	};
}

function rulesOfInput(input: ClassInput): ClassRules {
	const { habit, blossomTypes, blossomColours, foliage, minCrowns, maxCrowns } = input;
	return {
		habit,
		sizeClasses: input.sizeClasses,
		blossomTypes,
		blossomColours,
		foliage,
		minCrowns,
		maxCrowns,
		collectionSize: input.collectionSize,
		speciesOnly: input.speciesOnly,
		maxDiameterIn: input.maxDiameterIn,
		possessionMonths: input.possessionMonths,
		maxEntriesPerExhibitor: input.maxEntriesPerExhibitor,
		maxEntriesPerVariety: input.maxEntriesPerVariety,
		maxPotIn: input.maxPotIn,
		...groupRulesOfInput(input)
	};
}

/** Refuses a change to a class whose rules are frozen (see `refuseFrozenClassChange`). */
async function assertClassChangeAllowed(
	existing: ShowClass,
	input: ClassInput,
	transaction: Transaction
): Promise<void> {
	const progress = await classProgress(existing.id, { transaction });
	const refusal = refuseFrozenClassChange(
		{ rules: classRulesOf(existing), divisionId: existing.divisionId, scaleId: existing.scaleId },
		{
			rules: rulesOfInput(input),
			divisionId: input.divisionId,
			scaleId: input.scaleId
		},
		progress
	);
	if (refusal) throw new ScheduleProblem(refusal.message, refusal.field);
}

/** Adds a class, or changes one (when `classId` is given), with its eligibility rules. */
export async function saveClass(
	show: Show,
	classId: string | null,
	input: ClassInput,
	options: { transaction: Transaction }
): Promise<ShowClass> {
	const { transaction } = options;
	await requireStage(show, 'schedule', transaction);
	const division = await Division.findOne({
		where: { id: input.divisionId, showId: show.id },
		transaction
	});
	if (!division) throw new ScheduleProblem('Choose a division of this show.', 'divisionId');
	if (input.scaleId) {
		const scale = await Scale.findOne({
			where: { id: input.scaleId, [Op.or]: [{ societyId: show.societyId }, { societyId: null }] },
			transaction
		});
		if (!scale) throw new ScheduleProblem('Choose one of the society’s scales.', 'scaleId');
	}
	await assertCodeFree(ShowClass, show.id, input.code, classId, transaction);
	if (classId) {
		const existing = await ShowClass.findOne({
			where: { id: classId, showId: show.id },
			transaction
		});
		if (!existing) throw new ScheduleProblem('That class is not part of this show.');
		await assertClassChangeAllowed(existing, input, transaction);
		return existing.update({ ...classValues(input), divisionId: division.id }, { transaction });
	}
	const position = await nextPosition(ShowClass, show.id, transaction);
	return ShowClass.create(
		{ ...classValues(input), position, showId: show.id, divisionId: division.id },
		{ transaction }
	);
}

/** Removes a class that has no entries. */
export async function deleteClass(
	show: Show,
	classId: string,
	options: { transaction: Transaction; actor: AuditActor }
): Promise<void> {
	const { transaction } = options;
	await requireStage(show, 'schedule', transaction);
	const existing = await ShowClass.findOne({
		where: { id: classId, showId: show.id },
		transaction
	});
	if (!existing) throw new ScheduleProblem('That class is not part of this show.');
	if ((await Entry.count({ where: { classId }, transaction })) > 0) {
		throw new ScheduleProblem('This class has entries; move or withdraw them before removing it.');
	}
	await existing.destroy({ transaction });
	await recordShowAudit(
		show,
		{
			action: 'class.delete',
			target: { kind: 'class', id: existing.id, label: `${existing.code} ${existing.name}` },
			details: { before: { code: existing.code, name: existing.name } }
		},
		options
	);
}

/** Saves the schedule's general rules or its show committee, printed in the schedule PDF. */
export async function saveScheduleText(
	show: Show,
	input: ScheduleTextInput,
	options: { transaction: Transaction }
): Promise<void> {
	await requireStage(show, 'schedule', options.transaction);
	await show.update({ [input.part]: input.text || null }, { transaction: options.transaction });
}

type Ordered = typeof Division | typeof ShowClass;

/** Sets one row's position (and the instance's, so later steps see it). */
async function setPosition(
	model: Ordered,
	row: Division | ShowClass,
	position: number,
	transaction: Transaction
): Promise<void> {
	await (model as typeof Division).update({ position }, { where: { id: row.id }, transaction });
	row.position = position;
}

/** Swaps the positions of two rows (a division or class and its neighbour). */
async function swapPositions(
	model: Ordered,
	a: Division | ShowClass,
	b: Division | ShowClass,
	transaction: Transaction
): Promise<void> {
	const [pa, pb] = [a.position, b.position];
	await setPosition(model, a, pb, transaction);
	await setPosition(model, b, pa, transaction);
}

/** Moves a division one place up or down in the schedule. */
export async function moveDivision(
	show: Show,
	input: MoveInput,
	options: { transaction: Transaction }
): Promise<void> {
	const { transaction } = options;
	await requireStage(show, 'schedule', transaction);
	const divisions = await Division.findAll({
		where: { showId: show.id },
		order: [
			['position', 'ASC'],
			['code', 'ASC']
		],
		transaction,
		lock: transaction.LOCK.UPDATE
	});
	const at = divisions.findIndex((d) => d.id === input.id);
	if (at < 0) throw new ScheduleProblem('That division is not part of this show.');
	const other = divisions[input.direction === 'up' ? at - 1 : at + 1];
	if (!other) {
		throw new ScheduleProblem(
			`This division is already ${input.direction === 'up' ? 'first' : 'last'}.`
		);
	}
	await renumber(Division, divisions, transaction);
	await swapPositions(Division, divisions[at], other, transaction);
}

/** Moves a class one place up or down within its division. */
export async function moveClass(
	show: Show,
	input: MoveInput,
	options: { transaction: Transaction }
): Promise<void> {
	const { transaction } = options;
	await requireStage(show, 'schedule', transaction);
	const target = await ShowClass.findOne({ where: { id: input.id, showId: show.id }, transaction });
	if (!target) throw new ScheduleProblem('That class is not part of this show.');
	const classes = await ShowClass.findAll({
		where: { showId: show.id, divisionId: target.divisionId },
		order: [
			['position', 'ASC'],
			['code', 'ASC']
		],
		transaction,
		lock: transaction.LOCK.UPDATE
	});
	const at = classes.findIndex((c) => c.id === input.id);
	const other = classes[input.direction === 'up' ? at - 1 : at + 1];
	if (!other) {
		throw new ScheduleProblem(
			`This class is already ${input.direction === 'up' ? 'first' : 'last'} in its division.`
		);
	}
	await renumber(ShowClass, classes, transaction);
	await swapPositions(ShowClass, classes[at], other, transaction);
}

/** Gives rows that share a position distinct ones, keeping their order. */
async function renumber(
	model: Ordered,
	rows: (Division | ShowClass)[],
	transaction: Transaction
): Promise<void> {
	let last = -Infinity;
	for (const row of rows) {
		if (row.position <= last) await setPosition(model, row, last + 1, transaction);
		last = row.position;
	}
}
