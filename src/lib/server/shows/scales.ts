import { Op, QueryTypes, type Transaction } from 'sequelize';
import {
	sameCriteria,
	totalPoints,
	validateScaleDraft,
	type ScaleCriterionDraft,
	type ScaleDraft
} from '$lib/domain/scales';
import { Scale, ShowClass, sequelize } from '../db';
import { Refusal } from '../http/refusal';

/** A scale of points as the society's scales page shows it. */
export interface ScaleRow {
	id: string;
	name: string;
	version: number;
	/** False for the shared built-in scales, which a society copies but does not edit. */
	own: boolean;
	criteria: ScaleCriterionDraft[];
	total: number;
	/** Classes (of any show of the society) judged on this version. */
	classes: number;
	/** True once a sheet is scored on it: saving it then makes a new version. */
	frozen: boolean;
}

/** A scale change that cannot be made, with the form field it belongs to. */
export class ScaleProblem extends Refusal {
	declare readonly field: string;
	constructor(message: string, field = 'form') {
		super(message, 400, field);
	}
}

/** What a save did: changed the scale in place, or made a new version and moved classes to it. */
export interface ScaleSaved {
	scale: Scale;
	newVersion: boolean;
	movedClasses: number;
	keptClasses: number;
}

const REPLACED = `(SELECT replaces_id FROM scales WHERE replaces_id IS NOT NULL)`;

/** The ids, among these scales, that a scored sheet uses (a sheet in a class on the scale). */
async function scoredScaleIds(scaleIds: string[], transaction?: Transaction): Promise<Set<string>> {
	if (!scaleIds.length) return new Set();
	const rows = await sequelize.query<{ scale_id: string }>(
		`SELECT DISTINCT c.scale_id FROM score_sheets s
		   JOIN entries e ON e.id = s.entry_id
		   JOIN classes c ON c.id = e.class_id
		  WHERE c.scale_id IN (:scaleIds)`,
		{ replacements: { scaleIds }, type: QueryTypes.SELECT, transaction }
	);
	return new Set(rows.map((r) => r.scale_id));
}

/** True when a scored sheet uses the scale, so it can no longer change. */
export async function isScaleFrozen(
	scaleId: string,
	options: { transaction?: Transaction } = {}
): Promise<boolean> {
	return (await scoredScaleIds([scaleId], options.transaction)).has(scaleId);
}

function toRow(scale: Scale, societyId: string, classes: number, frozen: boolean): ScaleRow {
	return {
		id: scale.id,
		name: scale.name,
		version: scale.version,
		own: scale.societyId === societyId,
		criteria: scale.criteria.map((c) => ({ key: c.key, label: c.label, maxPoints: c.maxPoints })),
		total: totalPoints(scale.criteria),
		classes,
		frozen
	};
}

/**
 * The scales a society may use, newest versions only: its own first, then the shared built-in
 * ones, each with the number of its classes and whether a scored sheet uses it.
 */
export async function listSocietyScales(societyId: string): Promise<ScaleRow[]> {
	const scales = await Scale.findAll({
		where: {
			[Op.or]: [{ societyId }, { societyId: null }],
			id: { [Op.notIn]: sequelize.literal(REPLACED) }
		},
		order: [['name', 'ASC']]
	});
	const ids = scales.map((s) => s.id);
	const [frozen, counts] = await Promise.all([
		scoredScaleIds(ids),
		ids.length
			? sequelize.query<{ scale_id: string; n: string }>(
					`SELECT c.scale_id, count(*) AS n FROM classes c JOIN shows s ON s.id = c.show_id
					  WHERE s.society_id = :societyId AND c.scale_id IN (:ids) GROUP BY c.scale_id`,
					{ replacements: { societyId, ids }, type: QueryTypes.SELECT }
				)
			: Promise.resolve([])
	]);
	const classes = new Map(counts.map((c) => [c.scale_id, Number(c.n)]));
	return scales
		.map((s) => toRow(s, societyId, classes.get(s.id) ?? 0, frozen.has(s.id)))
		.sort((a, b) => Number(b.own) - Number(a.own) || a.name.localeCompare(b.name));
}

/** One scale the society may read (its own or a shared one), or null. */
export async function findSocietyScale(
	societyId: string,
	scaleId: string,
	options: { transaction?: Transaction } = {}
): Promise<Scale | null> {
	return Scale.findOne({
		where: { id: scaleId, [Op.or]: [{ societyId }, { societyId: null }] },
		transaction: options.transaction
	});
}

function assertValid(draft: ScaleDraft): void {
	const problems = validateScaleDraft(draft);
	if (problems.length) {
		throw new ScaleProblem(problems[0].message, problems[0].field.split('.')[0]);
	}
}

async function assertNameFree(
	societyId: string,
	name: string,
	exceptId: string | null,
	transaction: Transaction
): Promise<void> {
	const clash = await Scale.findOne({
		where: {
			societyId,
			name: { [Op.iLike]: name.replace(/[\\%_]/g, (m) => `\\${m}`) },
			id: { [Op.notIn]: sequelize.literal(REPLACED) },
			...(exceptId ? { [Op.and]: [{ id: { [Op.ne]: exceptId } }] } : {})
		},
		transaction
	});
	if (clash) throw new ScaleProblem(`The society already has a scale named “${name}”.`, 'name');
}

/** Adds a scale of points to the society (checked with `validateScaleDraft`). */
export async function createScale(
	societyId: string,
	draft: ScaleDraft,
	options: { transaction: Transaction }
): Promise<Scale> {
	const { transaction } = options;
	assertValid(draft);
	await assertNameFree(societyId, draft.name.trim(), null, transaction);
	return Scale.create(
		{ societyId, name: draft.name.trim(), criteria: draft.criteria },
		{ transaction }
	);
}

/** Copies a scale (the society's own or a shared one) into a new scale of the society. */
export async function copyScale(
	societyId: string,
	scaleId: string,
	options: { transaction: Transaction }
): Promise<Scale> {
	const { transaction } = options;
	const source = await findSocietyScale(societyId, scaleId, { transaction });
	if (!source) throw new ScaleProblem('That scale is not one of the society’s.');
	let name = `${source.name} (copy)`.slice(0, 120);
	for (let n = 2; ; n++) {
		try {
			await assertNameFree(societyId, name, null, transaction);
			break;
		} catch (e) {
			if (!(e instanceof ScaleProblem) || n > 50) throw e;
			name = `${source.name} (copy ${n})`.slice(0, 120);
		}
	}
	return Scale.create({ societyId, name, criteria: source.criteria }, { transaction });
}

/**
 * Saves a changed scale of the society. While no scored sheet uses it, the row changes. Once
 * one does, it never changes: a new version is made (linked by `replaces_id`), the society's
 * classes on it that have no scored sheet move to the new version, and the judged classes and
 * their sheets keep the old one. All in the caller's transaction.
 */
export async function updateScale(
	societyId: string,
	scaleId: string,
	draft: ScaleDraft,
	options: { transaction: Transaction }
): Promise<ScaleSaved> {
	const { transaction } = options;
	const scale = await Scale.findOne({
		where: { id: scaleId, societyId },
		transaction,
		lock: transaction.LOCK.UPDATE
	});
	if (!scale) {
		const shared = await Scale.findOne({ where: { id: scaleId, societyId: null }, transaction });
		throw new ScaleProblem(
			shared
				? 'This scale is shared by every society; copy it to make one of your own to edit.'
				: 'That scale is not one of the society’s.'
		);
	}
	const newer = await Scale.findOne({ where: { replacesId: scale.id }, transaction });
	if (newer) {
		throw new ScaleProblem(`A newer version of this scale exists; edit version ${newer.version}.`);
	}
	assertValid(draft);
	const name = draft.name.trim();
	await assertNameFree(societyId, name, scale.id, transaction);
	if (!(await isScaleFrozen(scale.id, { transaction }))) {
		await scale.update({ name, criteria: draft.criteria }, { transaction });
		return { scale, newVersion: false, movedClasses: 0, keptClasses: 0 };
	}
	if (name === scale.name && sameCriteria(scale.criteria, draft.criteria)) {
		return { scale, newVersion: false, movedClasses: 0, keptClasses: 0 };
	}
	const next = await Scale.create(
		{ societyId, name, criteria: draft.criteria, version: scale.version + 1, replacesId: scale.id },
		{ transaction }
	);
	const classes = await sequelize.query<{ id: string; judged: boolean }>(
		`SELECT c.id, EXISTS (SELECT 1 FROM score_sheets s JOIN entries e ON e.id = s.entry_id
		                       WHERE e.class_id = c.id) AS judged
		   FROM classes c JOIN shows sh ON sh.id = c.show_id
		  WHERE c.scale_id = :scaleId AND sh.society_id = :societyId
		  FOR UPDATE OF c`,
		{ replacements: { scaleId: scale.id, societyId }, type: QueryTypes.SELECT, transaction }
	);
	const moving = classes.filter((c) => !c.judged).map((c) => c.id);
	if (moving.length) {
		await ShowClass.update({ scaleId: next.id }, { where: { id: moving }, transaction });
	}
	return {
		scale: next,
		newVersion: true,
		movedClasses: moving.length,
		keptClasses: classes.length - moving.length
	};
}
