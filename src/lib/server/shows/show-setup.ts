import { randomUUID } from 'node:crypto';
import { QueryTypes, UniqueConstraintError, type Transaction } from 'sequelize';
import { awardRulesFrom } from '$lib/domain/awards';
import { datesForCopy, datesOutOfOrder, type ShowDates } from '$lib/domain/show-stage';
import type { CopyShowInput, NewShowInput } from '$lib/schemas/show-setup';
import { Show, Society, sequelize } from '../db';
import { hasRole } from '../policies';
import { Refusal } from '../http/refusal';

/** Who starts or copies a show: the signed-in person with their roles per society. */
export type SetupActor = Pick<App.SignedInUser, 'id' | 'memberships'>;

/** An earlier show the chair may copy. */
export interface CopySource {
	id: string;
	societyId: string;
	name: string;
	judgingDay: string;
}

/** The societies a person may start shows in (those where they are a show chair). */
export function chairSocieties(actor: SetupActor): { id: string; name: string }[] {
	return actor.memberships
		.filter((m) => m.roles.includes('chair'))
		.map((m) => ({ id: m.societyId, name: m.societyName }));
}

/** The shows of the chair's societies that may be copied, newest first. */
export async function listCopySources(actor: SetupActor): Promise<CopySource[]> {
	const societyIds = chairSocieties(actor).map((s) => s.id);
	if (societyIds.length === 0) return [];
	const shows = await Show.findAll({
		where: { societyId: societyIds },
		attributes: ['id', 'societyId', 'name', 'judgingDay'],
		order: [['judgingDay', 'DESC']]
	});
	return shows.map((s) => ({
		id: s.id,
		societyId: s.societyId,
		name: s.name,
		judgingDay: s.judgingDay
	}));
}

function requireChair(actor: SetupActor, societyId: string): void {
	if (!hasRole({ ...actor, email: '', name: null }, ['chair'], societyId)) {
		throw new Refusal(
			'You can start shows only in a society where you are a show chair.',
			403,
			'societyId'
		);
	}
}

function requireDatesInOrder(dates: ShowDates): void {
	const problem = datesOutOfOrder(dates);
	if (problem) throw new Refusal(problem.message, 400, problem.field);
}

const slugTaken = (slug: string) =>
	new Refusal(
		`The short name ${slug} is already used by another show; choose another.`,
		400,
		'slug'
	);

async function requireSlugFree(slug: string, transaction: Transaction): Promise<void> {
	const taken = await Show.findOne({ where: { slug }, attributes: ['id'], transaction });
	if (taken) throw slugTaken(slug);
}

/** Runs the insert of a new show; a short name taken meanwhile by another chair is refused too. */
async function insertingShow<T>(slug: string, insert: () => Promise<T>): Promise<T> {
	try {
		return await insert();
	} catch (err) {
		if (err instanceof UniqueConstraintError) throw slugTaken(slug);
		throw err;
	}
}

/**
 * Starts an empty show in a society where the person is a show chair: its schedule is not
 * public, it has no divisions or classes, and its award rules are the defaults for the chosen
 * judging system.
 */
export async function createShow(
	actor: SetupActor,
	input: NewShowInput,
	options: { transaction: Transaction }
): Promise<Show> {
	const { transaction } = options;
	requireChair(actor, input.societyId);
	requireDatesInOrder(input);
	await requireSlugFree(input.slug, transaction);
	// A new show starts from the society's own award rules (the defaults where it has none).
	const society = await Society.findByPk(input.societyId, {
		attributes: ['defaultAwardRules'],
		transaction
	});
	const startingRules = awardRulesFrom(society?.defaultAwardRules ?? {});
	return insertingShow(input.slug, () =>
		Show.create(
			{
				societyId: input.societyId,
				name: input.name,
				slug: input.slug,
				venue: input.venue || null,
				publicHours: null,
				entriesOpen: input.entriesOpen,
				entriesClose: input.entriesClose,
				entryDay: input.entryDay,
				judgingDay: input.judgingDay,
				panelScoreMethod: input.panelScoreMethod,
				awardRules: { ...startingRules, system: input.awardSystem } as unknown as Record<
					string,
					unknown
				>,
				schedulePublishedAt: null,
				resultsPublishedAt: null
			},
			{ transaction }
		)
	);
}

/** Columns of a table, in table order, read from the catalog (so columns added later come too). */
async function columnsOf(table: string, transaction: Transaction): Promise<string[]> {
	const rows = await sequelize.query<{ name: string }>(
		`SELECT column_name AS name FROM information_schema.columns
		  WHERE table_schema = current_schema() AND table_name = :table ORDER BY ordinal_position`,
		{ replacements: { table }, type: QueryTypes.SELECT, transaction }
	);
	return rows.map((r) => r.name);
}

const quote = (column: string) => `"${column.replaceAll('"', '""')}"`;

/** Copies every column but the listed ones, as `"a", "b"` and `alias."a", alias."b"`. */
async function copiedColumns(table: string, except: string[], alias: string, t: Transaction) {
	const columns = (await columnsOf(table, t)).filter((c) => !except.includes(c));
	return {
		names: columns.map(quote).join(', '),
		values: columns.map((c) => `${alias}.${quote(c)}`).join(', '),
		empty: columns.length === 0
	};
}

/** New ids for old ones, in the form `unnest` joins on. */
function idMap(oldIds: string[]): { old: string[]; new: string[]; of: Map<string, string> } {
	const fresh = oldIds.map(() => randomUUID());
	return { old: oldIds, new: fresh, of: new Map(oldIds.map((id, i) => [id, fresh[i]])) };
}

async function idsOf(table: string, showId: string, transaction: Transaction): Promise<string[]> {
	const rows = await sequelize.query<{ id: string }>(
		`SELECT id FROM ${table} WHERE show_id = :showId ORDER BY id`,
		{ replacements: { showId }, type: QueryTypes.SELECT, transaction }
	);
	return rows.map((r) => r.id);
}

/** The show columns a copy sets itself; every other column is carried from the earlier show. */
const SHOW_OWN_COLUMNS = [
	'id',
	'society_id',
	'name',
	'slug',
	'venue',
	'entries_open',
	'entries_close',
	'entry_day',
	'judging_day',
	'schedule_published_at',
	'results_published_at',
	'next_entry_number',
	'entry_number_seed',
	'entry_number_digits',
	'entry_numbers_fixed_at',
	'created_at',
	'updated_at'
];

/**
 * Copies an earlier show of the same society into a new show on new dates, in one transaction:
 * the show's rules, award rules (top awards pointed at the new classes), fees and schedule text,
 * its divisions and classes with every rule and scale of points, and its panels with the classes
 * they judge but without judges or clerk. Entries, sheets, awards, mail and audit records stay
 * with the earlier show. The copy's schedule is not public.
 */
export async function copyShow(
	actor: SetupActor,
	input: CopyShowInput,
	options: { transaction: Transaction }
): Promise<Show> {
	const { transaction } = options;
	requireChair(actor, input.societyId);
	const source = await Show.findByPk(input.sourceShowId, { transaction });
	if (!source || source.societyId !== input.societyId) {
		throw new Refusal('You can copy only a show of this society.', 403, 'sourceShowId');
	}
	const dates = datesForCopy(source, input);
	requireDatesInOrder(dates);
	await requireSlugFree(input.slug, transaction);

	const showId = randomUUID();
	const show = await copiedColumns('shows', SHOW_OWN_COLUMNS, 's', transaction);
	await insertingShow(input.slug, () =>
		sequelize.query(
			`INSERT INTO shows (id, society_id, name, slug, venue, entries_open, entries_close, entry_day,
		                    judging_day${show.empty ? '' : `, ${show.names}`})
		 SELECT :showId, s.society_id, :name, :slug, COALESCE(:venue, s.venue), :entriesOpen,
		        :entriesClose, :entryDay, :judgingDay${show.empty ? '' : `, ${show.values}`}
		   FROM shows s WHERE s.id = :sourceId`,
			{
				replacements: {
					showId,
					sourceId: source.id,
					name: input.name,
					slug: input.slug,
					venue: input.venue || null,
					...dates
				},
				transaction
			}
		)
	);

	const divisions = idMap(await idsOf('divisions', source.id, transaction));
	if (divisions.old.length > 0) {
		const cols = await copiedColumns('divisions', ['id', 'show_id'], 'd', transaction);
		await sequelize.query(
			`INSERT INTO divisions (id, show_id, ${cols.names})
			 SELECT m.new_id, :showId, ${cols.values}
			   FROM divisions d
			   JOIN unnest(ARRAY[:old]::uuid[], ARRAY[:new]::uuid[]) AS m(old_id, new_id) ON m.old_id = d.id`,
			{ replacements: { showId, old: divisions.old, new: divisions.new }, transaction }
		);
	}

	const classes = idMap(await idsOf('classes', source.id, transaction));
	if (classes.old.length > 0) {
		const cols = await copiedColumns('classes', ['id', 'show_id', 'division_id'], 'c', transaction);
		await sequelize.query(
			`INSERT INTO classes (id, show_id, division_id, ${cols.names})
			 SELECT m.new_id, :showId, dm.new_id, ${cols.values}
			   FROM classes c
			   JOIN unnest(ARRAY[:old]::uuid[], ARRAY[:new]::uuid[]) AS m(old_id, new_id) ON m.old_id = c.id
			   JOIN unnest(ARRAY[:oldDivisions]::uuid[], ARRAY[:newDivisions]::uuid[])
			        AS dm(old_id, new_id) ON dm.old_id = c.division_id`,
			{
				replacements: {
					showId,
					old: classes.old,
					new: classes.new,
					oldDivisions: divisions.old,
					newDivisions: divisions.new
				},
				transaction
			}
		);
	}

	const panels = idMap(await idsOf('panels', source.id, transaction));
	if (panels.old.length > 0) {
		await sequelize.query(
			`INSERT INTO panels (id, show_id, name)
			 SELECT m.new_id, :showId, p.name
			   FROM panels p
			   JOIN unnest(ARRAY[:old]::uuid[], ARRAY[:new]::uuid[]) AS m(old_id, new_id) ON m.old_id = p.id`,
			{ replacements: { showId, old: panels.old, new: panels.new }, transaction }
		);
		if (classes.old.length > 0) {
			await sequelize.query(
				`INSERT INTO panel_classes (class_id, panel_id)
				 SELECT cm.new_id, pm.new_id
				   FROM panel_classes pc
				   JOIN unnest(ARRAY[:oldClasses]::uuid[], ARRAY[:newClasses]::uuid[])
				        AS cm(old_id, new_id) ON cm.old_id = pc.class_id
				   JOIN unnest(ARRAY[:oldPanels]::uuid[], ARRAY[:newPanels]::uuid[])
				        AS pm(old_id, new_id) ON pm.old_id = pc.panel_id`,
				{
					replacements: {
						oldClasses: classes.old,
						newClasses: classes.new,
						oldPanels: panels.old,
						newPanels: panels.new
					},
					transaction
				}
			);
		}
	}

	const copy = (await Show.findByPk(showId, { transaction }))!;
	await copy.update({ awardRules: withClassesMoved(copy.awardRules, classes.of) }, { transaction });
	return copy;
}

/** Award rules whose top awards name the copy's classes instead of the earlier show's. */
function withClassesMoved(
	rules: Record<string, unknown>,
	classIds: Map<string, string>
): Record<string, unknown> {
	const topAwards = rules.topAwards;
	if (!Array.isArray(topAwards)) return rules;
	return {
		...rules,
		topAwards: topAwards.map((award: Record<string, unknown>) => ({
			...award,
			classIds: Array.isArray(award.classIds)
				? award.classIds.flatMap((id: unknown) => {
						const moved = typeof id === 'string' ? classIds.get(id) : undefined;
						return moved ? [moved] : [];
					})
				: award.classIds
		}))
	};
}
