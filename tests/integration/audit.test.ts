import { afterAll, afterEach, describe, expect, it } from 'vitest';
import { randomUUID } from 'node:crypto';
import { Op, QueryTypes, type Transaction } from 'sequelize';
import { addCalendarDays, addCalendarMonths, todayIn } from '../../src/lib/domain/dates';
import { listAuditLog } from '../../src/lib/server/audit';
import {
	DuesPeriod,
	Entry,
	EntryPhoto,
	Payment,
	Plant,
	PlantEvent,
	PlantPhoto,
	Show,
	ShowClass,
	User,
	Variety,
	sequelize
} from '../../src/lib/server/db';
import {
	DeskProblem,
	checkInEntry,
	moveEntry,
	scratchEntry
} from '../../src/lib/server/entries/desk';
import { removeDuesPeriod } from '../../src/lib/server/payments/dues';
import { enterPlant, withdrawEntry } from '../../src/lib/server/entries/entries';
import { changeMemberRoles } from '../../src/lib/server/people/members';
import {
	assignClass,
	deletePanel,
	removeJudge,
	setClerk
} from '../../src/lib/server/judging/panels';
import { deleteEntryPhoto } from '../../src/lib/server/entries/photos';
import { deletePlantPhoto } from '../../src/lib/server/plants/plant-photos';
import { deletePlantEvent, setPlantGone } from '../../src/lib/server/plants/plants';
import { publishResults } from '../../src/lib/server/results/results';
import {
	deleteClass,
	deleteDivision,
	setSchedulePublished
} from '../../src/lib/server/shows/schedule';
import { buildFixture, removeFixtures, type Fixture } from './judging-fixture';

/**
 * Every destructive service writes exactly one audit record, in the caller's transaction: the
 * record is there inside the transaction, not yet outside it, and gone with the change when the
 * transaction rolls back. A refused change writes none.
 */

afterEach(() => removeFixtures());
afterAll(() => sequelize.close());

/** Audit records of an action on a target, seen by a fresh connection (committed rows only). */
async function recorded(action: string, targetId: string, transaction?: Transaction) {
	return sequelize.query<{ actor_label: string; details: Record<string, unknown> }>(
		`SELECT actor_label, details, society_id, show_id FROM audit_events
		  WHERE action = :action AND target_id = :targetId ORDER BY id`,
		{ replacements: { action, targetId }, type: QueryTypes.SELECT, transaction }
	);
}

/**
 * Runs the change twice: first in a transaction that is rolled back after checking that the
 * record is visible inside it and not outside it (nothing is kept, `unchanged` says the change
 * is undone too), then committed: exactly one record. Returns that record.
 */
async function oneRecordWithTheChange(
	action: string,
	targetId: string,
	change: (transaction: Transaction) => Promise<unknown>,
	unchanged: () => Promise<boolean>
) {
	expect(await recorded(action, targetId)).toHaveLength(0);
	await expect(
		sequelize.transaction(async (transaction) => {
			await change(transaction);
			expect(await recorded(action, targetId, transaction)).toHaveLength(1);
			expect(await recorded(action, targetId)).toHaveLength(0);
			throw new Error('roll back');
		})
	).rejects.toThrow('roll back');
	expect(await recorded(action, targetId)).toHaveLength(0);
	expect(await unchanged()).toBe(true);

	await sequelize.transaction((transaction) => change(transaction));
	const rows = await recorded(action, targetId);
	expect(rows).toHaveLength(1);
	expect(await unchanged()).toBe(false);
	return rows[0];
}

/** A refused change writes no record (and the service's own refusal comes through). */
async function noRecordWhenRefused(
	action: string,
	targetId: string,
	change: (transaction: Transaction) => Promise<unknown>
) {
	const before = (await recorded(action, targetId)).length;
	await expect(sequelize.transaction((transaction) => change(transaction))).rejects.toThrow();
	expect(await recorded(action, targetId)).toHaveLength(before);
}

const showOf = async (f: Fixture) => (await Show.findByPk(f.showId))!;
const chairOf = (f: Fixture) => ({ id: f.judges[2].id, email: f.judges[2].email });

describe('schedule and panels', () => {
	it('removing a class or a division: one record each; a class with entries is refused with none', async () => {
		const f = await buildFixture();
		// The schedule changes only while it is not public (domain/show-stage.ts).
		await sequelize.query('UPDATE shows SET schedule_published_at = NULL WHERE id = :id', {
			replacements: { id: f.showId }
		});
		const show = await showOf(f);
		const actor = chairOf(f);
		const emptyClass = await ShowClass.create({
			showId: f.showId,
			divisionId: (await ShowClass.findByPk(f.classId))!.divisionId,
			code: '9',
			name: 'Empty class',
			position: 9
		} as never);
		const row = await oneRecordWithTheChange(
			'class.delete',
			emptyClass.id,
			(t) => deleteClass(show, emptyClass.id, { transaction: t, actor }),
			async () => (await ShowClass.findByPk(emptyClass.id)) !== null
		);
		expect(row.actor_label).toBe(actor.email);
		await noRecordWhenRefused('class.delete', f.classId, (t) =>
			deleteClass(show, f.classId, { transaction: t, actor })
		);

		const [division] = await sequelize.query<{ id: string }>(
			`INSERT INTO divisions (id, show_id, code, name) VALUES (:id, :showId, 'X', 'Spare') RETURNING id`,
			{ replacements: { id: randomUUID(), showId: f.showId }, type: QueryTypes.SELECT }
		);
		await oneRecordWithTheChange(
			'division.delete',
			division.id,
			(t) => deleteDivision(show, division.id, { transaction: t, actor }),
			async () => (await countWhere('divisions', division.id)) === 1
		);
	});

	it('hiding a published schedule is recorded; publishing it is not a removal', async () => {
		const f = await buildFixture();
		const actor = chairOf(f);
		// A public schedule can be hidden only while nobody has entered (domain/show-stage.ts).
		await sequelize.query('DELETE FROM entries WHERE show_id = :id', {
			replacements: { id: f.showId }
		});
		await oneRecordWithTheChange(
			'schedule.unpublish',
			f.showId,
			async (t) => setSchedulePublished(await showOf(f), false, { transaction: t, actor }),
			async () => (await showOf(f)).schedulePublishedAt !== null
		);
		await sequelize.transaction(async (t) =>
			setSchedulePublished(await showOf(f), true, { transaction: t, actor })
		);
		expect(await recorded('schedule.unpublish', f.showId)).toHaveLength(1);
	});

	it('panels: removing a judge, the clerk, a class and the panel are each one record', async () => {
		const f = await buildFixture();
		const show = await showOf(f);
		const actor = chairOf(f);
		const judgeOnPanel = async () =>
			(await countWhere('panel_judges', f.panelId, 'panel_id', `user_id = '${f.judges[0].id}'`)) ===
			1;
		await oneRecordWithTheChange(
			'panel.judge_remove',
			f.panelId,
			(t) => removeJudge(show, f.panelId, f.judges[0].id, { transaction: t, actor }),
			judgeOnPanel
		);
		// Taking off a judge who is not on the panel is refused, with no record.
		await noRecordWhenRefused('panel.judge_remove', f.panelId, (t) =>
			removeJudge(show, f.panelId, f.judges[0].id, { transaction: t, actor })
		);

		const row = await oneRecordWithTheChange(
			'panel.clerk_change',
			f.panelId,
			(t) => setClerk(show, f.panelId, null, { transaction: t, actor }),
			async () => (await countWhere('panels', f.panelId, 'id', 'clerk_id IS NOT NULL')) === 1
		);
		expect(row.details).toMatchObject({
			before: { clerkId: f.clerk.id },
			after: { clerkId: null }
		});
		// Seating a clerk where there was none takes nobody away: no record.
		await sequelize.transaction((t) =>
			setClerk(show, f.panelId, f.judges[1].id, { transaction: t, actor })
		);
		expect(await recorded('panel.clerk_change', f.panelId)).toHaveLength(1);

		await oneRecordWithTheChange(
			'panel.class_change',
			f.classId,
			(t) => assignClass(show, f.classId, null, { transaction: t, actor }),
			async () => (await countWhere('panel_classes', f.classId, 'class_id')) === 1
		);
		await oneRecordWithTheChange(
			'panel.delete',
			f.panelId,
			(t) => deletePanel(show, f.panelId, { transaction: t, actor }),
			async () => (await countWhere('panels', f.panelId)) === 1
		);
	});
});

describe('entries', () => {
	it('scratching an entry: one record with the reason; scratching it again is refused with none', async () => {
		const f = await buildFixture();
		const show = await showOf(f);
		const entryId = f.entries[0].id;
		const row = await oneRecordWithTheChange(
			'entry.scratch',
			entryId,
			(t) =>
				scratchEntry(show, entryId, 'Not in bloom', { transaction: t, actor: { id: f.clerk.id } }),
			async () => (await Entry.findByPk(entryId))!.status === 'checked_in'
		);
		// Without the address, the record reads it from the account.
		expect(row.actor_label).toContain(f.clerk.email);
		expect(row.details).toMatchObject({ reason: 'Not in bloom', after: { status: 'scratched' } });
		await noRecordWhenRefused('entry.scratch', entryId, (t) =>
			scratchEntry(show, entryId, 'Again', { transaction: t, actor: { id: f.clerk.id } })
		);
	});

	it('withdrawing an entry: one record under the exhibitor, with what became of the fee', async () => {
		const f = await buildFixture();
		const today = todayIn('UTC');
		await Show.update(
			{
				entriesOpen: addCalendarDays(today, -10),
				entriesClose: addCalendarDays(today, 10),
				entryDay: addCalendarDays(today, 20),
				judgingDay: addCalendarDays(today, 21)
			},
			{ where: { id: f.showId } }
		);
		const entryId = randomUUID();
		await Entry.create({
			id: entryId,
			showId: f.showId,
			classId: f.classId,
			exhibitorId: f.exhibitors[0].id,
			title: 'To withdraw',
			number: 500,
			status: 'entered'
		} as never);
		const row = await oneRecordWithTheChange(
			'entry.withdraw',
			entryId,
			async (t) => {
				expect(await withdrawEntry(f.exhibitors[0].id, entryId, { transaction: t })).toBeNull();
			},
			async () => (await Entry.findByPk(entryId))!.status === 'entered'
		);
		expect(row.actor_label).toContain(f.exhibitors[0].email);
		expect(row.details).toMatchObject({ fee: 'none', after: { status: 'withdrawn' } });
		// A second withdrawal is refused (a sentence, nothing thrown) and writes nothing.
		await sequelize.transaction(async (t) =>
			expect(await withdrawEntry(f.exhibitors[0].id, entryId, { transaction: t })).not.toBeNull()
		);
		expect(await recorded('entry.withdraw', entryId)).toHaveLength(1);
	});

	it('removing an entry photo: one record', async () => {
		const f = await buildFixture();
		const photo = await EntryPhoto.create({
			entryId: f.entries[1].id,
			uploadedBy: f.exhibitors[1].id,
			fileName: `${randomUUID()}.jpg`,
			contentType: 'image/jpeg',
			bytes: 10,
			width: 1,
			height: 1
		} as never);
		await oneRecordWithTheChange(
			'entry_photo.delete',
			photo.id,
			(t) => deleteEntryPhoto(photo, { transaction: t, actor: f.exhibitors[1] }),
			async () => (await EntryPhoto.findByPk(photo.id)) !== null
		);
	});

	it('moving an entry at the desk: one record with both classes; a refused move writes none', async () => {
		// The demo spring show: a miniature measured at 7 in fits only as a semiminiature
		// (miniature up to 6 in, semiminiature up to 8 in: growers' references (DOMAIN.md)).
		const show = (await Show.findOne({ where: { slug: { [Op.like]: 'larkspur-spring-%' } } }))!;
		const classes = Object.fromEntries(
			(await ShowClass.findAll({ where: { showId: show.id } })).map((c) => [c.code, c.id])
		);
		const variety = (await Variety.findOne({
			where: { societyId: show.societyId, name: 'Crumb of Coral' }
		}))!;
		// exhibitor5 has no entry in class 15 and no other test of this folder enters for them.
		const exhibitor = (await User.findOne({ where: { email: 'exhibitor5@crownbench.test' } }))!;
		const clerk = (await User.findOne({ where: { email: 'clerk@crownbench.test' } }))!;
		const entry = await enterPlant(show.id, exhibitor.id, {
			showSlug: show.slug,
			classId: classes['15'],
			varietyId: variety.id,
			acquiredOn: addCalendarMonths(show.judgingDay, -12)
		});
		await sequelize.transaction((transaction) =>
			checkInEntry(
				show,
				entry.id,
				clerk.id,
				{ diameter: 7, crowns: 1, potSize: 3, unit: 'in' },
				{ transaction }
			)
		);
		await expect(
			sequelize.transaction((t) =>
				moveEntry(show, entry.id, classes['1'], { transaction: t, actor: clerk })
			)
		).rejects.toBeInstanceOf(DeskProblem);
		const row = await oneRecordWithTheChange(
			'entry.move',
			entry.id,
			(t) => moveEntry(show, entry.id, classes['12'], { transaction: t, actor: clerk }),
			async () => (await Entry.findByPk(entry.id))!.classId === classes['15']
		);
		expect(row.details).toMatchObject({
			before: { classId: classes['15'] },
			after: { classId: classes['12'] }
		});
		await Entry.destroy({ where: { id: entry.id } });
		await sequelize.query(`DELETE FROM audit_events WHERE target_id = :id`, {
			replacements: { id: entry.id }
		});
	});

	it('publishing results: one record; publishing again is refused with none', async () => {
		const f = await buildFixture();
		const actor = chairOf(f);
		await oneRecordWithTheChange(
			'results.publish',
			f.showId,
			(t) => publishResults(actor, f.showId, { transaction: t, allowIncomplete: true }),
			async () => (await showOf(f)).resultsPublishedAt === null
		);
		await noRecordWhenRefused('results.publish', f.showId, (t) =>
			publishResults(actor, f.showId, { transaction: t, allowIncomplete: true })
		);
	});
});

describe('society and the member’s own collection', () => {
	it('removing a dues period: one record; a period with payments stays and writes none', async () => {
		const f = await buildFixture();
		const actor = chairOf(f);
		const period = await DuesPeriod.create({
			societyId: f.societyId,
			label: 'Test year',
			amountCents: 1500,
			startsOn: '2027-01-01',
			endsOn: '2027-12-31'
		} as never);
		await oneRecordWithTheChange(
			'dues_period.remove',
			period.id,
			(t) =>
				removeDuesPeriod(
					{ societyId: f.societyId, periodId: period.id },
					{ transaction: t, actor }
				),
			async () => (await DuesPeriod.findByPk(period.id)) !== null
		);
		const used = await DuesPeriod.create({
			societyId: f.societyId,
			label: 'Paid year',
			amountCents: 1500,
			startsOn: '2028-01-01',
			endsOn: '2028-12-31'
		} as never);
		await Payment.create({
			societyId: f.societyId,
			userId: f.exhibitors[0].id,
			purpose: 'dues',
			duesPeriodId: used.id,
			amountCents: 1500,
			unitAmountCents: 1500,
			currency: 'USD',
			description: 'Dues'
		} as never);
		await sequelize.transaction(async (t) =>
			expect(
				await removeDuesPeriod(
					{ societyId: f.societyId, periodId: used.id },
					{ transaction: t, actor }
				)
			).toBe(false)
		);
		expect(await recorded('dues_period.remove', used.id)).toHaveLength(0);
	});

	it('taking a role away: one record with the roles before and after', async () => {
		const f = await buildFixture();
		const person = f.judges[2];
		const row = await oneRecordWithTheChange(
			'roles.change',
			person.id,
			(t) =>
				changeMemberRoles(
					{ societyId: f.societyId, userId: person.id, roles: ['member'], confirmed: true },
					{ transaction: t, actor: f.judges[0] }
				),
			async () =>
				(await countWhere('memberships', person.id, 'user_id', `'judge' = ANY(roles)`)) === 1
		);
		expect(row.details).toMatchObject({
			before: { roles: ['judge'] },
			after: { roles: ['member'] },
			removed: ['judge']
		});
	});

	it('a plant taken out of the collection, a log line and a photo removed: one record each, no society', async () => {
		const f = await buildFixture();
		const owner = f.exhibitors[0].id;
		const variety = await Variety.create({
			societyId: f.societyId,
			name: `Audit Test ${randomUUID().slice(0, 6)}`,
			habit: 'single_crown',
			sizeClass: 'standard',
			blossomType: 'single',
			blossomColours: ['blue'],
			foliage: 'plain',
			isSpecies: false
		} as never);
		const plant = await Plant.create({
			ownerId: owner,
			varietyId: variety.id,
			label: 'By the window',
			obtainedHow: 'bought',
			obtainedOn: '2026-01-05'
		} as never);
		const event = await PlantEvent.create({
			plantId: plant.id,
			kind: 'groomed',
			happenedOn: '2026-02-01'
		} as never);
		const photo = await PlantPhoto.create({
			plantId: plant.id,
			fileName: `${randomUUID()}.jpg`,
			mimeType: 'image/jpeg',
			byteSize: 10,
			caption: 'First bloom'
		} as never);
		try {
			await oneRecordWithTheChange(
				'plant_event.delete',
				event.id,
				(t) => deletePlantEvent(owner, plant.id, event.id, { transaction: t }),
				async () => (await PlantEvent.findByPk(event.id)) !== null
			);
			await oneRecordWithTheChange(
				'plant_photo.delete',
				photo.id,
				(t) => deletePlantPhoto(owner, plant.id, photo.id, { transaction: t }),
				async () => (await PlantPhoto.findByPk(photo.id)) !== null
			);
			await oneRecordWithTheChange(
				'plant.gone',
				plant.id,
				(t) => setPlantGone(owner, plant.id, '2026-03-01', { transaction: t }),
				async () => (await Plant.findByPk(plant.id))!.goneOn === null
			);
			// Putting it back removes nothing: no record.
			await sequelize.transaction((t) => setPlantGone(owner, plant.id, null, { transaction: t }));
			expect(await recorded('plant.gone', plant.id)).toHaveLength(1);
			const [row] = await sequelize.query<{ society_id: string | null }>(
				'SELECT society_id FROM audit_events WHERE target_id = :id',
				{ replacements: { id: plant.id }, type: QueryTypes.SELECT }
			);
			expect(row.society_id).toBeNull();
		} finally {
			await sequelize.query('DELETE FROM audit_events WHERE actor_id = :owner', {
				replacements: { owner }
			});
			await Plant.destroy({ where: { id: plant.id } });
		}
	});
});

describe('reading the log', () => {
	it('a society’s log holds its records and score changes, filtered and paged; another society sees none', async () => {
		const f = await buildFixture();
		const show = await showOf(f);
		const actor = chairOf(f);
		await sequelize.transaction((t) =>
			scratchEntry(show, f.entries[0].id, 'Pests seen', { transaction: t, actor })
		);
		await sequelize.transaction((t) => deletePanel(show, f.panelId, { transaction: t, actor }));
		await sequelize.query(
			`INSERT INTO score_audit (show_id, sheet_id, entry_id, actor_id, actor_email, before, after)
			 VALUES (:showId, :sheet, :entry, :judge, :email, NULL, CAST(:after AS jsonb))`,
			{
				replacements: {
					showId: f.showId,
					sheet: randomUUID(),
					entry: f.entries[1].id,
					judge: f.judges[0].id,
					email: f.judges[0].email,
					after: JSON.stringify({ total: 92, notJudged: null })
				}
			}
		);

		const all = await listAuditLog({ societyId: f.societyId }, { page: 1 });
		expect(all.total).toBe(3);
		expect(all.rows.map((r) => r.action).sort()).toEqual([
			'entry.scratch',
			'panel.delete',
			'score.change'
		]);
		expect(all.people.map((p) => p.id).sort()).toEqual([actor.id, f.judges[0].id].sort());
		const scores = await listAuditLog({ showId: f.showId }, { page: 1, action: 'score.change' });
		expect(scores.rows).toHaveLength(1);
		expect(scores.rows[0]).toMatchObject({ targetLabel: 'Entry 2', details: { after: 92 } });
		const byPerson = await listAuditLog({ societyId: f.societyId }, { page: 1, person: actor.id });
		expect(byPerson.total).toBe(2);
		const future = addCalendarDays(todayIn('UTC'), 2);
		expect((await listAuditLog({ societyId: f.societyId }, { page: 1, from: future })).total).toBe(
			0
		);
		expect((await listAuditLog({ societyId: f.societyId }, { page: 2 })).rows).toHaveLength(0);

		const other = await buildFixture();
		expect((await listAuditLog({ societyId: other.societyId }, { page: 1 })).total).toBe(0);
	});

	it('filters by the society’s own days, not by UTC days', async () => {
		const f = await buildFixture();
		await sequelize.query(`UPDATE societies SET time_zone = 'America/New_York' WHERE id = :id`, {
			replacements: { id: f.societyId }
		});
		// 03:00 UTC on 10 March 2026 is 23:00 on 9 March in New York: daylight time (UTC-4) starts
		// on the second Sunday of March, 8 March 2026 (IANA time zone database, America/New_York).
		await sequelize.query(
			`INSERT INTO audit_events (society_id, action, actor_id, actor_label, target_kind, target_id, target_label, details, at)
			 VALUES (:society, 'entry.scratch', :actor, 'chair', 'entry', '1', 'Entry 1', '{}', '2026-03-10T03:00:00Z')`,
			{ replacements: { society: f.societyId, actor: chairOf(f).id } }
		);
		const on = (day: string) =>
			listAuditLog({ societyId: f.societyId }, { page: 1, from: day, to: day });
		expect((await on('2026-03-09')).total).toBe(1);
		expect((await on('2026-03-10')).total).toBe(0);
		const show = await showOf(f);
		await sequelize.query(`UPDATE audit_events SET show_id = :show WHERE society_id = :society`, {
			replacements: { show: show.id, society: f.societyId }
		});
		expect(
			(await listAuditLog({ showId: show.id }, { page: 1, from: '2026-03-09', to: '2026-03-09' }))
				.total
		).toBe(1);
	});
});

async function countWhere(
	table: string,
	id: string,
	column = 'id',
	extra = 'TRUE'
): Promise<number> {
	const [row] = await sequelize.query<{ n: string }>(
		`SELECT count(*) AS n FROM ${table} WHERE ${column} = :id AND ${extra}`,
		{ replacements: { id }, type: QueryTypes.SELECT }
	);
	return Number(row.n);
}
