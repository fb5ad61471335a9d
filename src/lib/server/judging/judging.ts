/**
 * What judges and panel clerks see and do. Everything returned here is blind: entry ids and
 * numbers, class, variety, scale and sheets; never the exhibitor or anything derived from them.
 */
import { QueryTypes, type Transaction } from 'sequelize';
import { isSheetComplete } from '$lib/domain/judging';
import {
	DEFAULT_STANDARD_SCALE,
	scoreSheet,
	validateDeductions,
	type PanelMethod,
	type ScaleCriterion,
	type ScaleOfPoints
} from '$lib/domain/scoring';
import type { SheetChange } from '$lib/schemas/judging';
import { ScoreSheet, sequelize } from '../db';
import type { TabletSheet } from '$lib/judging/types';
import { Refusal } from '../http/refusal';

/** A sheet as a tablet holds it (the tablet's own type); version 0 means nothing saved yet. */
export type SheetView = TabletSheet;

/** An entry as a judge sees it: number and plant only. */
export interface JudgeEntry {
	id: string;
	number: number;
	plant: string;
}

/** A class opened by a judge or clerk, with everything the tablet needs to score offline. */
export interface JudgeClass {
	show: { id: string; name: string; method: PanelMethod; locked: boolean };
	panel: { id: string; name: string };
	role: 'judge' | 'clerk';
	/** The sheet this person writes, or null when they may only read (a clerk under 'mean'). */
	sheetKind: 'judge' | 'consensus' | null;
	cls: { id: string; code: string; name: string; division: string };
	scale: ScaleOfPoints;
	entries: JudgeEntry[];
	sheets: Record<string, SheetView>;
}

/** A class on the judge's start page. */
export interface JudgeAssignment {
	showId: string;
	showName: string;
	judgingDay: string;
	locked: boolean;
	panelName: string;
	role: 'judge' | 'clerk';
	classId: string;
	code: string;
	name: string;
	entries: number;
	done: number;
}

interface Access {
	showId: string;
	showName: string;
	societyId: string;
	method: PanelMethod;
	locked: boolean;
	panelId: string;
	panelName: string;
	role: 'judge' | 'clerk';
	classId: string;
	code: string;
	name: string;
	division: string;
	scale: ScaleOfPoints;
}

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;

/** True for a well-formed id (anything else is answered 404 before touching the database). */
export function isUuid(value: string): boolean {
	return UUID.test(value);
}

const ACTIVE = `e.status NOT IN ('withdrawn', 'scratched')`;

/** The plant's name as a judge may see it: variety, design title or the collection's varieties. */
const PLANT = `COALESCE(v.name, e.title,
	(SELECT string_agg(cv.name, ', ' ORDER BY cv.name) FROM varieties cv WHERE cv.id = ANY(e.collection_variety_ids)),
	'')`;

function toScale(id: string | null, name: string | null, criteria: unknown): ScaleOfPoints {
	if (!id || !Array.isArray(criteria)) return DEFAULT_STANDARD_SCALE;
	return { id, name: name ?? '', criteria: criteria as ScaleCriterion[] };
}

/** The columns of a person's access to a class, as ACCESS_FROM reads them. */
interface AccessRow {
	show_id: string;
	show_name: string;
	society_id: string;
	method: PanelMethod;
	published: Date | null;
	panel_id: string;
	panel_name: string;
	is_judge: boolean;
	is_clerk: boolean;
	code: string;
	name: string;
	division: string;
	scale_id: string | null;
	scale_name: string | null;
	criteria: unknown;
	conflict: boolean;
}

/**
 * A person's access to one class (:userId, and the class as `classId`, a parameter or a column):
 * the show, the panel, whether they judge or clerk it, the scale, and whether they or their
 * household have an entry in it.
 */
function accessSelect(classId: string): string {
	return `SELECT s.id AS show_id, s.name AS show_name, s.society_id, s.panel_score_method AS method,
	        s.results_published_at AS published, p.id AS panel_id, p.name AS panel_name,
	        EXISTS (SELECT 1 FROM panel_judges pj WHERE pj.panel_id = p.id AND pj.user_id = :userId) AS is_judge,
	        p.clerk_id IS NOT DISTINCT FROM CAST(:userId AS uuid) AS is_clerk,
	        c.code, c.name, d.code || ' ' || d.name AS division,
	        sc.id AS scale_id, sc.name AS scale_name, sc.criteria,
	        (EXISTS (SELECT 1 FROM entries e WHERE e.class_id = c.id AND ${ACTIVE} AND e.exhibitor_id = :userId)
	         OR EXISTS (
	          SELECT 1 FROM memberships mj
	            JOIN (SELECT user_id, society_id, household FROM memberships
	                  UNION ALL SELECT user_id, society_id, household FROM walk_in_exhibitors) me
	              ON me.society_id = mj.society_id
	             AND lower(trim(me.household)) = lower(trim(mj.household))
	            JOIN entries e ON e.exhibitor_id = me.user_id AND e.class_id = c.id AND ${ACTIVE}
	           WHERE mj.user_id = :userId AND mj.society_id = s.society_id
	             AND coalesce(trim(mj.household), '') <> '')) AS conflict
	   FROM panel_classes pc
	   JOIN panels p ON p.id = pc.panel_id
	   JOIN classes c ON c.id = pc.class_id
	   JOIN divisions d ON d.id = c.division_id
	   JOIN shows s ON s.id = p.show_id
	   LEFT JOIN scales sc ON sc.id = c.scale_id
	  WHERE pc.class_id = ${classId}`;
}

/** Refuses a person without access to the class (or with an entry in it); returns the context. */
function toAccess(row: AccessRow | undefined, classId: string): Access {
	if (!row || (!row.is_judge && !row.is_clerk)) {
		throw new Refusal('This entry is not in your classes.', 403);
	}
	if (row.conflict) {
		throw new Refusal(
			'You cannot judge this class: you or your household have an entry in it. Ask the show chair to move it to another panel.',
			403
		);
	}
	return {
		showId: row.show_id,
		showName: row.show_name,
		societyId: row.society_id,
		method: row.method,
		locked: row.published !== null,
		panelId: row.panel_id,
		panelName: row.panel_name,
		role: row.is_judge ? 'judge' : 'clerk',
		classId,
		code: row.code,
		name: row.name,
		division: row.division,
		scale: toScale(row.scale_id, row.scale_name, row.criteria)
	};
}

/** Checks that the person judges (or clerks) the class and has no entry in it; returns the context. */
async function requireClassAccess(userId: string, classId: string): Promise<Access> {
	if (!isUuid(classId)) throw new Refusal('This page does not exist.', 404);
	const [row] = await sequelize.query<AccessRow>(accessSelect(':classId'), {
		replacements: { userId, classId },
		type: QueryTypes.SELECT
	});
	return toAccess(row, classId);
}

/** Which sheet this person writes in this class, or null when they only read. */
function sheetKindFor(access: Access): 'judge' | 'consensus' | null {
	if (access.method === 'consensus') return 'consensus';
	return access.role === 'judge' ? 'judge' : null;
}

/** The fields of a stored sheet that a view needs (a ScoreSheet model or a raw row). */
type SheetRecord = Pick<
	ScoreSheet,
	| 'id'
	| 'entryId'
	| 'kind'
	| 'deductions'
	| 'comment'
	| 'notJudgedReason'
	| 'notJudgedNote'
	| 'judgesChoiceRank'
	| 'version'
	| 'updatedBy'
>;

/** The columns of a sheet, named as SheetRecord names them. */
const SHEET_COLUMNS = `id, entry_id AS "entryId", kind, deductions, comment,
	not_judged_reason AS "notJudgedReason", not_judged_note AS "notJudgedNote",
	judges_choice_rank AS "judgesChoiceRank", version, updated_by AS "updatedBy"`;

function toView(scale: ScaleOfPoints, sheet: SheetRecord, viewerId: string): SheetView {
	const deductions = sheet.deductions ?? {};
	const notJudged = sheet.notJudgedReason
		? { reason: sheet.notJudgedReason, note: sheet.notJudgedNote ?? '' }
		: null;
	return {
		entryId: sheet.entryId,
		kind: sheet.kind,
		version: sheet.version,
		deductions,
		comment: sheet.comment,
		notJudged,
		judgesChoiceRank: sheet.judgesChoiceRank,
		total: scoreSheet(scale, deductions).total,
		complete: isSheetComplete(scale, { deductions, notJudgedReason: sheet.notJudgedReason }),
		changedByOther: sheet.updatedBy !== null && sheet.updatedBy !== viewerId
	};
}

/** An empty sheet (nothing saved yet). */
export function blankSheet(
	scale: ScaleOfPoints,
	entryId: string,
	kind: 'judge' | 'consensus'
): SheetView {
	return {
		entryId,
		kind,
		version: 0,
		deductions: {},
		comment: '',
		notJudged: null,
		judgesChoiceRank: null,
		total: scoreSheet(scale, {}).total,
		complete: false,
		changedByOther: false
	};
}

/** The sheets of the given entries that this person sees (their own, or the consensus sheets). */
async function sheetsFor(
	userId: string,
	kind: 'judge' | 'consensus',
	entryIds: string[],
	transaction?: Transaction
): Promise<ScoreSheet[]> {
	if (entryIds.length === 0) return [];
	return ScoreSheet.findAll({
		where:
			kind === 'judge'
				? { entryId: entryIds, kind, judgeId: userId }
				: { entryId: entryIds, kind: 'consensus' },
		transaction
	});
}

/** The classes a person judges or clerks, across their shows, with their progress. */
export async function listJudgeAssignments(userId: string): Promise<JudgeAssignment[]> {
	const rows = await sequelize.query<{
		show_id: string;
		show_name: string;
		judging_day: string;
		published: Date | null;
		method: PanelMethod;
		panel_name: string;
		is_judge: boolean;
		class_id: string;
		code: string;
		name: string;
		entries: string;
		done: string;
	}>(
		`WITH mine AS (
		   SELECT p.id, p.name, p.show_id,
		          EXISTS (SELECT 1 FROM panel_judges pj WHERE pj.panel_id = p.id AND pj.user_id = :userId) AS is_judge
		     FROM panels p
		    WHERE p.clerk_id = :userId
		       OR EXISTS (SELECT 1 FROM panel_judges pj WHERE pj.panel_id = p.id AND pj.user_id = :userId))
		 SELECT s.id AS show_id, s.name AS show_name, s.judging_day, s.results_published_at AS published,
		        s.panel_score_method AS method, mine.name AS panel_name, mine.is_judge,
		        c.id AS class_id, c.code, c.name,
		        (SELECT count(*) FROM entries e WHERE e.class_id = c.id AND ${ACTIVE}) AS entries,
		        (SELECT count(*) FROM entries e JOIN score_sheets ss ON ss.entry_id = e.id
		          WHERE e.class_id = c.id AND ${ACTIVE}
		            AND ((s.panel_score_method = 'consensus' AND ss.kind = 'consensus')
		              OR (s.panel_score_method = 'mean' AND ss.kind = 'judge' AND ss.judge_id = :userId))
		            AND (ss.not_judged_reason IS NOT NULL
		              OR (SELECT count(*) FROM jsonb_object_keys(ss.deductions)) >=
		                 coalesce((SELECT jsonb_array_length(sc.criteria) FROM scales sc WHERE sc.id = c.scale_id), 5))
		        ) AS done
		   FROM mine
		   JOIN shows s ON s.id = mine.show_id
		   JOIN panel_classes pc ON pc.panel_id = mine.id
		   JOIN classes c ON c.id = pc.class_id
		   JOIN divisions d ON d.id = c.division_id
		  ORDER BY s.judging_day DESC, s.name, d.position, c.position`,
		{ replacements: { userId }, type: QueryTypes.SELECT }
	);
	return rows.map((r) => ({
		showId: r.show_id,
		showName: r.show_name,
		judgingDay: r.judging_day,
		locked: r.published !== null,
		panelName: r.panel_name,
		role: r.is_judge ? 'judge' : 'clerk',
		classId: r.class_id,
		code: r.code,
		name: r.name,
		entries: Number(r.entries),
		done: Number(r.done)
	}));
}

/** Loads a class for a judge or clerk: entries by number, the scale, and their sheets. */
export async function loadJudgeClass(userId: string, classId: string): Promise<JudgeClass> {
	const access = await requireClassAccess(userId, classId);
	const entries = await sequelize.query<JudgeEntry>(
		`SELECT e.id, e.number, ${PLANT} AS plant
		   FROM entries e LEFT JOIN varieties v ON v.id = e.variety_id
		  WHERE e.class_id = :classId AND ${ACTIVE}
		  ORDER BY e.number`,
		{ replacements: { classId }, type: QueryTypes.SELECT }
	);
	const kind = sheetKindFor(access) ?? 'consensus';
	const sheets: Record<string, SheetView> = {};
	const found = await sheetsFor(
		userId,
		kind,
		entries.map((e) => e.id)
	);
	for (const e of entries) sheets[e.id] = blankSheet(access.scale, e.id, kind);
	for (const s of found) sheets[s.entryId] = toView(access.scale, s, userId);
	return {
		show: {
			id: access.showId,
			name: access.showName,
			method: access.method,
			locked: access.locked
		},
		panel: { id: access.panelId, name: access.panelName },
		role: access.role,
		sheetKind: sheetKindFor(access),
		cls: { id: classId, code: access.code, name: access.name, division: access.division },
		scale: access.scale,
		entries: entries.map((e) => ({ id: e.id, number: e.number, plant: e.plant })),
		sheets
	};
}

/** The class of an entry, for opening its scoresheet; refuses entries outside the person's classes. */
export async function classOfEntry(userId: string, entryId: string): Promise<string> {
	if (!isUuid(entryId)) throw new Refusal('This page does not exist.', 404);
	const [row] = await sequelize.query<{ class_id: string }>(
		`SELECT e.class_id FROM entries e WHERE e.id = :entryId AND ${ACTIVE}`,
		{ replacements: { entryId }, type: QueryTypes.SELECT }
	);
	if (!row) throw new Refusal('This entry is not in your classes.', 403);
	await requireClassAccess(userId, row.class_id);
	return row.class_id;
}

/** The outcome of one change. */
export interface SaveResult {
	/** 'replayed': the change had been applied before; nothing was applied again. */
	status: 'saved' | 'replayed' | 'unchanged';
	sheet: SheetView;
}

function sameState(a: SheetView, change: SheetChange): boolean {
	const keys = new Set([...Object.keys(a.deductions), ...Object.keys(change.deductions)]);
	for (const k of keys) if (a.deductions[k] !== change.deductions[k]) return false;
	return (
		a.comment === change.comment &&
		(a.notJudged?.reason ?? null) === (change.notJudged?.reason ?? null) &&
		(a.notJudged?.note ?? '') === (change.notJudged?.note ?? '') &&
		a.judgesChoiceRank === change.judgesChoiceRank
	);
}

/** What the audit log keeps of a sheet. */
function auditState(view: SheetView | null) {
	if (!view || view.version === 0) return null;
	return {
		version: view.version,
		deductions: view.deductions,
		total: view.total,
		comment: view.comment,
		notJudged: view.notJudged,
		judgesChoiceRank: view.judgesChoiceRank
	};
}

/** The sheet and the stored answer a save reads once it holds the entry's lock. */
interface SaveState {
	appliedUserId: string | null;
	appliedResponse: SheetView | null;
	sheet: SheetRecord | null;
}

/** The save's first statement: lock the entry, share the show's row, read the person's access. */
const SAVE_LOCK = `SELECT e.id AS entry_id, e.show_id AS entry_show_id, e.class_id,
	        sh.results_published_at AS locked, a.*
	   FROM entries e
	   JOIN shows sh ON sh.id = e.show_id
	   LEFT JOIN LATERAL (${accessSelect('e.class_id')}) a ON true
	  WHERE e.id = :entryId AND ${ACTIVE}
	    FOR NO KEY UPDATE OF e FOR SHARE OF sh`;

/** The second: the answer stored for the change id, if any, and the sheet as it stands. */
function saveStateStatement(kind: 'judge' | 'consensus'): string {
	return `SELECT ac.user_id AS "appliedUserId", ac.response AS "appliedResponse",
		        (SELECT row_to_json(ss) FROM (SELECT ${SHEET_COLUMNS} FROM score_sheets
		          WHERE entry_id = :entryId AND kind = '${kind}'
		                ${kind === 'judge' ? 'AND judge_id = :judgeId' : ''}) ss) AS sheet
		   FROM (VALUES (1)) AS one (x)
		   LEFT JOIN applied_changes ac ON ac.change_id = :changeId`;
}
const SAVE_STATE = {
	judge: saveStateStatement('judge'),
	consensus: saveStateStatement('consensus')
};

/** The third, one statement for every write: the sheet, its audit row and the stored answer. */
function saveWriteStatement(write: 'update' | 'insert' | 'unchanged'): string {
	const sheet = {
		update: `UPDATE score_sheets
		            SET deductions = CAST(:deductions AS jsonb), comment = :comment,
		                not_judged_reason = :reason, not_judged_note = :note, judges_choice_rank = :rank,
		                updated_by = :actorId, version = :version, updated_at = now()
		          WHERE id = :sheetId AND version = :baseVersion
		      RETURNING id`,
		insert: `INSERT INTO score_sheets (show_id, entry_id, kind, judge_id, deductions, comment,
		                not_judged_reason, not_judged_note, judges_choice_rank, updated_by, version)
		         VALUES (:showId, :entryId, :kind, :judgeId, CAST(:deductions AS jsonb), :comment,
		                :reason, :note, :rank, :actorId, :version)
		      RETURNING id`,
		unchanged: `SELECT CAST(:sheetId AS uuid) AS id`
	}[write];
	const audit =
		write === 'unchanged'
			? ''
			: `, audit AS (
			     INSERT INTO score_audit (show_id, sheet_id, entry_id, actor_id, actor_email, change_id, before, after)
			     SELECT CAST(:showId AS uuid), sheet.id, CAST(:entryId AS uuid), CAST(:actorId AS uuid),
			            CAST(:actorEmail AS text), CAST(:changeId AS uuid), CAST(:before AS jsonb),
			            CAST(:after AS jsonb)
			       FROM sheet)`;
	return `WITH sheet AS (${sheet})${audit}
		 INSERT INTO applied_changes (change_id, user_id, sheet_id, response)
		 SELECT CAST(:changeId AS uuid), CAST(:actorId AS uuid), sheet.id, CAST(:response AS jsonb)
		   FROM sheet
		 RETURNING sheet_id`;
}
const SAVE_WRITE = {
	update: saveWriteStatement('update'),
	insert: saveWriteStatement('insert'),
	unchanged: saveWriteStatement('unchanged')
};

/**
 * Applies one change to a sheet, in one transaction of three statements (lock and access; the
 * stored answer and the current sheet; the writes):
 * - refuses (changing nothing) an entry outside the person's classes, a locked show, and
 *   deductions the class's scale does not allow (400 with one problem per criterion);
 * - a change id seen before is answered with the stored answer and applied no second time;
 * - the change must be made on the sheet's current version, else 409 with the current sheet;
 * - the new version is stored with an audit row (who, when, before, after).
 * Writes to one entry's sheets are serialised by locking the entry row (FOR NO KEY UPDATE: it
 * does not block the foreign-key checks of publishing, which inserts awards naming the entry
 * while holding the show; a plain FOR UPDATE here deadlocked a save against a publish). The
 * stored answer and the sheet are read by a statement of their own after the lock is held: a
 * statement sees the database as it was when it began, so reading them in the locking statement
 * could miss a save that finished while this one waited for the lock.
 */
export async function saveSheet(
	actor: { id: string; email: string },
	change: SheetChange
): Promise<SaveResult> {
	return sequelize.transaction(async (transaction) => {
		const run = <R extends object>(sql: string, replacements: Record<string, unknown>) =>
			sequelize.query<R>(sql, { replacements, type: QueryTypes.SELECT, transaction });
		const [entry] = await run<
			{ entry_id: string; entry_show_id: string; class_id: string; locked: Date | null } & Omit<
				AccessRow,
				'show_id'
			> & { show_id: string | null }
		>(SAVE_LOCK, { entryId: change.entryId, userId: actor.id });
		if (!entry) throw new Refusal('This entry is not in your classes.', 403);
		// Who may save is checked first: a person outside the class learns nothing, not even 423.
		const access = toAccess(entry.show_id ? (entry as AccessRow) : undefined, entry.class_id);
		if (entry.locked) {
			throw new Refusal('Results are published: scores are locked and cannot change.', 423);
		}
		const kind = sheetKindFor(access);
		if (!kind) {
			throw new Refusal(
				'In this show each judge keeps their own sheet; the panel clerk does not score.',
				403
			);
		}

		const [state] = await run<SaveState>(
			SAVE_STATE[kind],
			kind === 'judge'
				? { changeId: change.changeId, entryId: entry.entry_id, judgeId: actor.id }
				: { changeId: change.changeId, entryId: entry.entry_id }
		);
		if (state.appliedUserId !== null) {
			const response = state.appliedResponse as SheetView;
			if (state.appliedUserId !== actor.id || response.entryId !== change.entryId) {
				throw new Refusal('This change id was already used for another change.', 409);
			}
			return { status: 'replayed', sheet: response };
		}

		const problems = validateDeductions(access.scale, change.deductions);
		if (problems.length > 0) {
			throw new Refusal(problems.map((p) => p.message).join(' '), 400, 'deductions', problems);
		}
		const deductions = change.deductions as Record<string, number>;

		const current = state.sheet;
		const before = current
			? toView(access.scale, current, actor.id)
			: blankSheet(access.scale, entry.entry_id, kind);
		if (change.baseVersion !== before.version) {
			throw new Refusal(
				'This sheet was changed meanwhile by another member of your panel (or on another device). Their version is shown.',
				409,
				undefined,
				before
			);
		}

		const write = !current ? 'insert' : sameState(before, change) ? 'unchanged' : 'update';
		const stored = {
			deductions,
			comment: change.comment,
			notJudgedReason: change.notJudged?.reason ?? null,
			notJudgedNote: change.notJudged ? change.notJudged.note || null : null,
			judgesChoiceRank: change.judgesChoiceRank
		};
		// The entry's lock makes the version read above the one this write moves on from.
		const after =
			write === 'unchanged'
				? before
				: toView(
						access.scale,
						{
							id: current?.id ?? '',
							entryId: entry.entry_id,
							kind,
							...stored,
							version: before.version + 1,
							updatedBy: actor.id
						},
						actor.id
					);
		const common = {
			sheetId: current?.id ?? null,
			actorId: actor.id,
			changeId: change.changeId,
			response: JSON.stringify(after)
		};
		const changed = {
			...common,
			showId: entry.entry_show_id,
			entryId: entry.entry_id,
			deductions: JSON.stringify(deductions),
			comment: stored.comment,
			reason: stored.notJudgedReason,
			note: stored.notJudgedNote,
			rank: stored.judgesChoiceRank,
			actorEmail: actor.email,
			version: after.version,
			before: before.version === 0 ? null : JSON.stringify(auditState(before)),
			after: JSON.stringify(auditState(after))
		};
		const written = await run<{ sheet_id: string }>(
			SAVE_WRITE[write],
			write === 'unchanged'
				? common
				: write === 'update'
					? { ...changed, baseVersion: before.version }
					: { ...changed, kind, judgeId: kind === 'judge' ? actor.id : null }
		);
		if (written.length !== 1) throw new Error('The sheet moved while its entry was locked.');
		return { status: write === 'unchanged' ? 'unchanged' : 'saved', sheet: after };
	});
}

/**
 * The judging pages a person's tablet keeps for working offline: their list, and each class and
 * scoresheet of the shows whose results are not yet published (entry ids only, nothing more).
 */
export async function listJudgingPagesToKeep(userId: string): Promise<string[]> {
	const rows = await sequelize.query<{ class_id: string; entry_id: string | null }>(
		`SELECT c.id AS class_id, e.id AS entry_id
		   FROM panels p
		   JOIN shows s ON s.id = p.show_id AND s.results_published_at IS NULL
		   JOIN panel_classes pc ON pc.panel_id = p.id
		   JOIN classes c ON c.id = pc.class_id
		   LEFT JOIN entries e ON e.class_id = c.id AND ${ACTIVE}
		  WHERE p.clerk_id = :userId
		     OR EXISTS (SELECT 1 FROM panel_judges pj WHERE pj.panel_id = p.id AND pj.user_id = :userId)
		  ORDER BY c.id, e.number`,
		{ replacements: { userId }, type: QueryTypes.SELECT }
	);
	const pages = new Set(['/judging']);
	for (const r of rows) {
		pages.add(`/judging/class/${r.class_id}`);
		if (r.entry_id) pages.add(`/judging/entry/${r.entry_id}`);
	}
	return [...pages];
}
