import { QueryTypes, type Transaction } from 'sequelize';
import { findJudgingConflicts, type JudgingConflict } from '$lib/domain/judging';
import { recordShowAudit, type AuditActor } from '../audit';
import { Panel, PanelClass, PanelJudge, Show, ShowClass, User, sequelize } from '../db';
import { Refusal } from '../http/refusal';
import { verdictFor } from '../shows/show-stage';

/** A person as the panels page shows them to the chair. */
export interface PanelPerson {
	userId: string;
	name: string;
	email: string;
}

/** One panel with its people and classes. */
export interface PanelView {
	id: string;
	name: string;
	clerk: PanelPerson | null;
	judges: PanelPerson[];
	classIds: string[];
}

/** Everything the chair's panels page needs. */
export interface PanelsPage {
	panels: PanelView[];
	classes: {
		id: string;
		code: string;
		name: string;
		division: string;
		panelId: string | null;
		entries: number;
	}[];
	judges: PanelPerson[];
	clerks: PanelPerson[];
	/** Standing problems, e.g. an entry moved into a class after its panel was set. */
	warnings: string[];
}

const personName = (p: { name: string | null; email: string }) => p.name ?? p.email;

/** People of a society holding one of the roles, by name. */
async function societyPeople(societyId: string, roles: string[], transaction?: Transaction) {
	const rows = await sequelize.query<{
		id: string;
		name: string | null;
		email: string;
		household: string | null;
	}>(
		`SELECT u.id, u.name, u.email, m.household
		   FROM memberships m JOIN users u ON u.id = m.user_id
		  WHERE m.society_id = :societyId AND m.roles && ARRAY[:roles]::varchar(16)[]
		  ORDER BY coalesce(u.name, u.email)`,
		{ replacements: { societyId, roles }, type: QueryTypes.SELECT, transaction }
	);
	return rows;
}

/** The entries of the classes (not withdrawn or scratched) with their exhibitor's household. */
async function conflictEntries(showId: string, classIds: string[], transaction?: Transaction) {
	if (classIds.length === 0) return [];
	return sequelize.query<{
		classId: string;
		exhibitorId: string;
		exhibitorHousehold: string | null;
	}>(
		`SELECT e.class_id AS "classId", e.exhibitor_id AS "exhibitorId",
		        COALESCE(m.household, w.household) AS "exhibitorHousehold"
		   FROM entries e
		   JOIN shows s ON s.id = e.show_id
		   LEFT JOIN memberships m ON m.user_id = e.exhibitor_id AND m.society_id = s.society_id
		   LEFT JOIN walk_in_exhibitors w ON w.user_id = e.exhibitor_id AND w.society_id = s.society_id
		  WHERE e.show_id = :showId AND e.class_id IN (:classIds)
		    AND e.status NOT IN ('withdrawn', 'scratched')`,
		{ replacements: { showId, classIds }, type: QueryTypes.SELECT, transaction }
	);
}

/** The household recorded for people in the show's society. */
async function households(societyId: string, userIds: string[], transaction?: Transaction) {
	if (userIds.length === 0) return [];
	return sequelize.query<{ userId: string; household: string | null }>(
		`SELECT user_id AS "userId", household FROM memberships
		  WHERE society_id = :societyId AND user_id IN (:userIds)`,
		{ replacements: { societyId, userIds }, type: QueryTypes.SELECT, transaction }
	);
}

/** Finds conflicts between people and classes of a show (own or household entries). */
export async function conflictsFor(
	show: Pick<Show, 'id' | 'societyId'>,
	userIds: string[],
	classIds: string[],
	transaction?: Transaction
): Promise<JudgingConflict[]> {
	// One after the other: queries inside a transaction share one connection.
	const people = await households(show.societyId, userIds, transaction);
	const entries = await conflictEntries(show.id, classIds, transaction);
	const known = new Set(people.map((p) => p.userId));
	const all = [
		...people,
		...userIds.filter((id) => !known.has(id)).map((userId) => ({ userId, household: null }))
	];
	return findJudgingConflicts(all, classIds, entries);
}

/** A plain sentence for a conflict, naming the person and the class (for the chair). */
async function describeConflict(
	conflict: JudgingConflict,
	transaction: Transaction
): Promise<string> {
	const [person] = await sequelize.query<{ name: string | null; email: string }>(
		'SELECT name, email FROM users WHERE id = :id',
		{ replacements: { id: conflict.userId }, type: QueryTypes.SELECT, transaction }
	);
	const cls = await ShowClass.findByPk(conflict.classId, { transaction });
	const who = person ? personName(person) : 'This person';
	const what =
		conflict.reason === 'own_entry'
			? 'they have an entry in it'
			: 'someone of their household has an entry in it';
	return `${who} cannot judge class ${cls?.code ?? ''}: ${what}.`;
}

/** Loads the chair's panels page for a show (a handful of queries, none per row). */
export async function loadPanelsPage(show: Show): Promise<PanelsPage> {
	const [panels, judgesOnPanels, panelClasses, classes, judges, clerks] = await Promise.all([
		Panel.findAll({ where: { showId: show.id }, order: [['name', 'ASC']] }),
		sequelize.query<{ panelId: string; userId: string; name: string | null; email: string }>(
			`SELECT pj.panel_id AS "panelId", u.id AS "userId", u.name, u.email
			   FROM panel_judges pj JOIN panels p ON p.id = pj.panel_id JOIN users u ON u.id = pj.user_id
			  WHERE p.show_id = :showId ORDER BY coalesce(u.name, u.email)`,
			{ replacements: { showId: show.id }, type: QueryTypes.SELECT }
		),
		sequelize.query<{ classId: string; panelId: string }>(
			`SELECT pc.class_id AS "classId", pc.panel_id AS "panelId"
			   FROM panel_classes pc JOIN panels p ON p.id = pc.panel_id WHERE p.show_id = :showId`,
			{ replacements: { showId: show.id }, type: QueryTypes.SELECT }
		),
		sequelize.query<{ id: string; code: string; name: string; division: string; entries: string }>(
			`SELECT c.id, c.code, c.name, d.code || ' ' || d.name AS division,
			        (SELECT count(*) FROM entries e WHERE e.class_id = c.id
			           AND e.status NOT IN ('withdrawn', 'scratched')) AS entries
			   FROM classes c JOIN divisions d ON d.id = c.division_id
			  WHERE c.show_id = :showId ORDER BY d.position, c.position`,
			{ replacements: { showId: show.id }, type: QueryTypes.SELECT }
		),
		societyPeople(show.societyId, ['judge']),
		societyPeople(show.societyId, ['clerk', 'judge'])
	]);
	const people = new Map([...judges, ...clerks].map((p) => [p.id, p]));
	const toPerson = (id: string, fallback?: { name: string | null; email: string }): PanelPerson => {
		const p = people.get(id) ?? fallback ?? { name: null, email: '' };
		return { userId: id, name: personName(p), email: p.email };
	};
	const panelOf = new Map(panelClasses.map((pc) => [pc.classId, pc.panelId]));
	const views: PanelView[] = panels.map((p) => ({
		id: p.id,
		name: p.name,
		clerk: p.clerkId ? toPerson(p.clerkId) : null,
		judges: judgesOnPanels.filter((j) => j.panelId === p.id).map((j) => toPerson(j.userId, j)),
		classIds: panelClasses.filter((pc) => pc.panelId === p.id).map((pc) => pc.classId)
	}));

	// Standing conflicts: one query for all people on panels and all assigned classes.
	const warnings: string[] = [];
	const userIds = [
		...new Set(
			views.flatMap((v) => [...v.judges.map((j) => j.userId), ...(v.clerk ? [v.clerk.userId] : [])])
		)
	];
	const conflicts = await conflictsFor(show, userIds, [...panelOf.keys()]);
	for (const c of conflicts) {
		const view = views.find((v) => v.id === panelOf.get(c.classId));
		const onPanel =
			view && (view.judges.some((j) => j.userId === c.userId) || view.clerk?.userId === c.userId);
		if (!view || !onPanel) continue;
		const cls = classes.find((k) => k.id === c.classId);
		warnings.push(
			`${toPerson(c.userId).name} is on ${view.name}, which judges class ${cls?.code}, where ${c.reason === 'own_entry' ? 'they have an entry' : 'their household has an entry'}: move the class or the person.`
		);
	}
	const strip = (p: { id: string; name: string | null; email: string }) => ({
		userId: p.id,
		name: personName(p),
		email: p.email
	});
	return {
		panels: views,
		classes: classes.map((c) => ({
			id: c.id,
			code: c.code,
			name: c.name,
			division: c.division,
			panelId: panelOf.get(c.id) ?? null,
			entries: Number(c.entries)
		})),
		judges: judges.map(strip),
		clerks: clerks.map(strip),
		warnings
	};
}

/** Refuses, with the stage's reason, a panel change once the results are out. */
async function requireOpen(show: Show, transaction: Transaction): Promise<void> {
	const verdict = await verdictFor(show, 'panels', { transaction });
	if (!verdict.allowed) throw new Refusal(verdict.reason, 423);
}

async function panelOfShow(show: Show, panelId: string, transaction: Transaction): Promise<Panel> {
	const panel = await Panel.findOne({ where: { id: panelId, showId: show.id }, transaction });
	if (!panel) throw new Refusal('That panel is not part of this show.', 404, 'panelId');
	return panel;
}

async function requirePersonWithRole(
	show: Show,
	userId: string,
	roles: string[],
	what: string,
	transaction: Transaction
): Promise<void> {
	const people = await societyPeople(show.societyId, roles, transaction);
	if (!people.some((p) => p.id === userId)) {
		throw new Refusal(`Choose ${what} of ${'this society'}.`, 400, 'userId');
	}
}

/** Refuses when any of the people has an entry (own or household) in any of the classes. */
async function refuseConflicts(
	show: Show,
	userIds: string[],
	classIds: string[],
	transaction: Transaction
) {
	const conflicts = await conflictsFor(show, userIds, classIds, transaction);
	if (conflicts.length > 0) {
		throw new Refusal(await describeConflict(conflicts[0], transaction), 409, 'userId');
	}
}

/** Creates a named panel in a show. */
export async function createPanel(
	show: Show,
	name: string,
	options: { transaction: Transaction }
): Promise<Panel> {
	const { transaction } = options;
	await requireOpen(show, transaction);
	const taken = await sequelize.query(
		'SELECT 1 FROM panels WHERE show_id = :showId AND lower(name) = lower(:name)',
		{ replacements: { showId: show.id, name }, type: QueryTypes.SELECT, transaction }
	);
	if (taken.length > 0)
		throw new Refusal('A panel of this show already has that name.', 400, 'name');
	return Panel.create({ showId: show.id, name, clerkId: null }, { transaction });
}

/** The name (or address) of a person, for the audit log. */
async function personLabel(userId: string | null, transaction: Transaction): Promise<string> {
	if (!userId) return 'nobody';
	const user = await User.findByPk(userId, { attributes: ['name', 'email'], transaction });
	return user ? personName(user) : userId;
}

/** Deletes a panel; its classes become unassigned. Sheets already written stay. Audited. */
export async function deletePanel(
	show: Show,
	panelId: string,
	options: { transaction: Transaction; actor: AuditActor }
): Promise<void> {
	const { transaction } = options;
	await requireOpen(show, transaction);
	const panel = await panelOfShow(show, panelId, transaction);
	const [judges, classes] = await Promise.all([
		PanelJudge.count({ where: { panelId: panel.id }, transaction }),
		PanelClass.count({ where: { panelId: panel.id }, transaction })
	]);
	await panel.destroy({ transaction });
	await recordShowAudit(
		show,
		{
			action: 'panel.delete',
			target: { kind: 'panel', id: panel.id, label: panel.name },
			details: { before: { name: panel.name, judges, classes, clerkId: panel.clerkId } }
		},
		options
	);
}

/** Adds a judge to a panel, refused when the judge or their household has an entry in its classes. */
export async function addJudge(
	show: Show,
	panelId: string,
	userId: string,
	options: { transaction: Transaction }
): Promise<void> {
	const { transaction } = options;
	await requireOpen(show, transaction);
	const panel = await panelOfShow(show, panelId, transaction);
	await requirePersonWithRole(show, userId, ['judge'], 'a judge', transaction);
	const classIds = (await PanelClass.findAll({ where: { panelId: panel.id }, transaction })).map(
		(c) => c.classId
	);
	await refuseConflicts(show, [userId], classIds, transaction);
	await PanelJudge.findOrCreate({ where: { panelId: panel.id, userId }, transaction });
}

/** Takes a judge off a panel (audited; a judge who was not on it is refused). */
export async function removeJudge(
	show: Show,
	panelId: string,
	userId: string,
	options: { transaction: Transaction; actor: AuditActor }
): Promise<void> {
	const { transaction } = options;
	await requireOpen(show, transaction);
	const panel = await panelOfShow(show, panelId, transaction);
	const removed = await PanelJudge.destroy({ where: { panelId: panel.id, userId }, transaction });
	if (removed === 0) throw new Refusal('That judge is not on this panel.', 404, 'userId');
	const judge = await personLabel(userId, transaction);
	await recordShowAudit(
		show,
		{
			action: 'panel.judge_remove',
			target: { kind: 'panel', id: panel.id, label: `${judge} from ${panel.name}` },
			details: { before: { judgeId: userId, judge } }
		},
		options
	);
}

/**
 * Sets (or clears) a panel's clerk; the clerk keeps consensus sheets, so the same rule applies.
 * Replacing or removing a clerk is audited.
 */
export async function setClerk(
	show: Show,
	panelId: string,
	userId: string | null,
	options: { transaction: Transaction; actor: AuditActor }
): Promise<void> {
	const { transaction } = options;
	await requireOpen(show, transaction);
	const panel = await panelOfShow(show, panelId, transaction);
	if (userId) {
		await requirePersonWithRole(show, userId, ['clerk', 'judge'], 'a clerk or judge', transaction);
		const classIds = (await PanelClass.findAll({ where: { panelId: panel.id }, transaction })).map(
			(c) => c.classId
		);
		await refuseConflicts(show, [userId], classIds, transaction);
	}
	const before = panel.clerkId;
	panel.clerkId = userId;
	await panel.save({ transaction });
	if (before && before !== userId) {
		const [was, now] = [
			await personLabel(before, transaction),
			await personLabel(userId, transaction)
		];
		await recordShowAudit(
			show,
			{
				action: 'panel.clerk_change',
				target: { kind: 'panel', id: panel.id, label: panel.name },
				details: { before: { clerkId: before, clerk: was }, after: { clerkId: userId, clerk: now } }
			},
			options
		);
	}
}

/**
 * Assigns a class to a panel (moving it from another panel), refused when a judge or the clerk
 * of the panel, or their household, has an entry in the class. An empty panel id unassigns it.
 */
export async function assignClass(
	show: Show,
	classId: string,
	panelId: string | null,
	options: { transaction: Transaction; actor: AuditActor }
): Promise<void> {
	const { transaction } = options;
	await requireOpen(show, transaction);
	const cls = await ShowClass.findOne({ where: { id: classId, showId: show.id }, transaction });
	if (!cls) throw new Refusal('That class is not part of this show.', 404, 'classId');
	const current = await PanelClass.findOne({ where: { classId }, transaction });
	let panel: Panel | null = null;
	if (panelId) {
		panel = await panelOfShow(show, panelId, transaction);
		const judges = await PanelJudge.findAll({ where: { panelId: panel.id }, transaction });
		const people = [...judges.map((j) => j.userId), ...(panel.clerkId ? [panel.clerkId] : [])];
		await refuseConflicts(show, people, [classId], transaction);
	}
	await PanelClass.destroy({ where: { classId }, transaction });
	if (panel) await PanelClass.create({ classId, panelId: panel.id }, { transaction });
	if (current && current.panelId !== panel?.id) {
		const was = await Panel.findByPk(current.panelId, { attributes: ['name'], transaction });
		await recordShowAudit(
			show,
			{
				action: 'panel.class_change',
				target: { kind: 'class', id: cls.id, label: `${cls.code} ${cls.name}` },
				details: {
					before: { panelId: current.panelId, panel: was?.name ?? null },
					after: { panelId: panel?.id ?? null, panel: panel?.name ?? null }
				}
			},
			options
		);
	}
}

/** The clerk a panel of this show has now (null: no clerk, or no such panel). */
export async function clerkOfPanel(showId: string, panelId: string): Promise<string | null> {
	const panel = await Panel.findOne({ where: { id: panelId, showId }, attributes: ['clerkId'] });
	return panel?.clerkId ?? null;
}

/** The panel of this show a class is assigned to now (null: none). */
export async function panelOfClass(showId: string, classId: string): Promise<string | null> {
	const current = await PanelClass.findOne({ where: { classId }, attributes: ['panelId'] });
	if (!current) return null;
	const ofShow = await Panel.count({ where: { id: current.panelId, showId } });
	return ofShow ? current.panelId : null;
}
