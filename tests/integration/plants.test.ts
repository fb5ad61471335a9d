import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { mkdtemp, readdir } from 'node:fs/promises';
import os from 'node:os';
import path from 'node:path';
import { QueryTypes } from 'sequelize';
import sharp from 'sharp';
import { addCalendarDays, addCalendarMonths, todayIn } from '$lib/domain/dates';
import { plantSchema } from '$lib/schemas/plants';
import { useConfig } from '$lib/server/config';
import { sequelize } from '$lib/server/db';
import { PlantEntryRefused, createEntryFromPlant } from '$lib/server/plants/plant-entries';
import { addPlantPhoto, readPlantPhoto } from '$lib/server/plants/plant-photos';
import {
	PlantInputError,
	addPlantEvent,
	createPlant,
	getLineage,
	getPlant,
	listPlants,
	potUpSucker,
	updatePlant
} from '$lib/server/plants/plants';
import { setMailPreferences } from '$lib/server/people/mail-preferences';
import { assessCollections, loadShowForReadiness } from '$lib/server/plants/readiness';
import {
	REMINDER_KIND,
	queueDueReminders,
	queueEntryReminders
} from '$lib/server/plants/reminders';

const today = todayIn('UTC');
let societyId: string;
let showId: string;
let member: string;
let other: string;
let variety: Record<string, string>;

async function one<T extends object>(sql: string, bind: unknown[] = []): Promise<T> {
	const [row] = await sequelize.query<T>(sql, { bind, type: QueryTypes.SELECT });
	return row;
}

async function userId(email: string): Promise<string> {
	return (await one<{ id: string }>('SELECT id FROM users WHERE email = $1', [email])).id;
}

function input(overrides: Record<string, unknown>) {
	return plantSchema.parse({
		varietyId: variety['Dovecote Posy'],
		obtainedHow: 'bought',
		obtainedOn: addCalendarMonths(today, -8),
		potSize: { value: '4', unit: 'in' },
		...overrides
	});
}

const tx = <T>(run: (transaction: import('sequelize').Transaction) => Promise<T>) =>
	sequelize.transaction(run);

beforeAll(async () => {
	// Settings are read once: the test's upload folder goes in as a setting, as a host sets it.
	process.env.UPLOAD_DIR = await mkdtemp(path.join(os.tmpdir(), 'cb-uploads-'));
	useConfig(process.env);
	societyId = (await one<{ id: string }>(`SELECT id FROM societies WHERE slug = 'larkspur-valley'`))
		.id;
	// The demo spring show by its short name: other test files add shows to this society (the
	// judged autumn show among them), and a row's place in the table moves when it is updated.
	showId = (
		await one<{ id: string }>(
			`SELECT id FROM shows WHERE society_id = $1 AND slug LIKE 'larkspur-spring-%'`,
			[societyId]
		)
	).id;
	member = await userId('exhibitor7@crownbench.test');
	other = await userId('exhibitor6@crownbench.test');
	const rows = await sequelize.query<{ id: string; name: string }>(
		'SELECT id, name FROM varieties WHERE society_id = $1',
		{ bind: [societyId], type: QueryTypes.SELECT }
	);
	variety = Object.fromEntries(rows.map((r) => [r.name, r.id]));
});

afterAll(() => sequelize.close());

describe('a member collection', () => {
	it('pots a sucker as a new plant in one step, and the lineage shows three generations', async () => {
		const mother = await tx((t) => createPlant(member, [societyId], input({}), { transaction: t }));
		const child = await tx((t) =>
			potUpSucker(
				member,
				mother.id,
				{ happenedOn: today, potSize: 2.25, label: 'first sucker' },
				{ transaction: t }
			)
		);
		expect(child.parentId).toBe(mother.id);
		expect(child.obtainedHow).toBe('sucker');
		expect(child.obtainedOn).toBe(today);
		expect(child.varietyId).toBe(mother.varietyId);
		const grandchild = await tx((t) =>
			createPlant(
				member,
				[societyId],
				input({ obtainedHow: 'leaf', obtainedOn: today, parentId: child.id }),
				{ transaction: t }
			)
		);

		const motherDetail = await getPlant(member, mother.id);
		expect(motherDetail?.events.map((e) => [e.kind, e.childPlantId])).toEqual([
			['sucker_potted', child.id]
		]);
		const lineage = await getLineage(member, grandchild.id);
		expect(lineage?.ancestors.map((a) => [a.id, a.generation])).toEqual([
			[child.id, -1],
			[mother.id, -2]
		]);
		const down = await getLineage(member, mother.id);
		expect(down?.offspring.map((o) => [o.id, o.generation])).toEqual([
			[child.id, 1],
			[grandchild.id, 2]
		]);

		// A plant cannot become the child of its own offspring.
		await expect(
			tx((t) =>
				updatePlant(
					member,
					[societyId],
					mother.id,
					input({ obtainedHow: 'division', parentId: grandchild.id }),
					{ transaction: t }
				)
			)
		).rejects.toBeInstanceOf(PlantInputError);
	});

	it('keeps plants private: another member can neither read nor write them', async () => {
		const plant = await tx((t) => createPlant(member, [societyId], input({}), { transaction: t }));
		expect(await getPlant(other, plant.id)).toBeNull();
		expect(await getLineage(other, plant.id)).toBeNull();
		expect((await listPlants(other)).some((p) => p.id === plant.id)).toBe(false);
		await expect(
			tx((t) =>
				addPlantEvent(
					other,
					plant.id,
					{
						kind: 'groomed',
						happenedOn: today,
						diameter: null,
						crowns: null,
						potSize: null,
						note: null
					},
					{ transaction: t }
				)
			)
		).rejects.toBeInstanceOf(PlantInputError);
		// Not as a parent of their own plant either, neither by the service nor by the database.
		await expect(
			tx((t) =>
				createPlant(other, [societyId], input({ obtainedHow: 'leaf', parentId: plant.id }), {
					transaction: t
				})
			)
		).rejects.toBeInstanceOf(PlantInputError);
		await expect(
			sequelize.query(
				`INSERT INTO plants (owner_id, variety_id, obtained_how, obtained_on, parent_id)
				 VALUES ($1, $2, 'leaf', $3, $4)`,
				{ bind: [other, variety['Dovecote Posy'], today, plant.id] }
			)
		).rejects.toThrow(/plants_parent_same_owner/);
	});

	it('refuses a variety from a registry the member does not belong to', async () => {
		const foreign = await one<{ id: string }>(
			`SELECT v.id FROM varieties v JOIN societies s ON s.id = v.society_id WHERE s.slug = 'cedar-ridge' LIMIT 1`
		);
		await expect(
			tx((t) =>
				createPlant(member, [societyId], input({ varietyId: foreign.id }), { transaction: t })
			)
		).rejects.toThrow("Choose a variety from your society's registry.");
	});

	// i-sec: many uploads at once still keep PHOTO_LIMITS.perPlant (12, common practice).
	it('keeps the per-plant limit under parallel uploads: count and insert are locked', async () => {
		const plant = await tx((t) => createPlant(member, [societyId], input({}), { transaction: t }));
		const png = await sharp({
			create: { width: 40, height: 40, channels: 3, background: '#6a4a9c' }
		})
			.png()
			.toBuffer();
		const outcomes = await Promise.allSettled(
			Array.from({ length: 16 }, (_, i) =>
				tx((t) =>
					addPlantPhoto(member, plant.id, new File([new Uint8Array(png)], `p${i}.png`), null, {
						transaction: t
					})
				)
			)
		);
		expect(outcomes.filter((o) => o.status === 'fulfilled')).toHaveLength(12);
		const [row] = await sequelize.query<{ n: string }>(
			'SELECT count(*) AS n FROM plant_photos WHERE plant_id = :id',
			{ replacements: { id: plant.id }, type: QueryTypes.SELECT }
		);
		expect(Number(row.n)).toBe(12);
	});

	it('stores photos by their real type, and shows them only to the owner', async () => {
		const plant = await tx((t) => createPlant(member, [societyId], input({}), { transaction: t }));
		const png = await sharp({
			create: { width: 2400, height: 1200, channels: 3, background: '#6a4a9c' }
		})
			.png()
			.toBuffer();
		const photo = await tx((t) =>
			addPlantPhoto(member, plant.id, new File([new Uint8Array(png)], 'x.png'), 'Side view', {
				transaction: t
			})
		);
		const stored = await readPlantPhoto(member, plant.id, photo.id);
		expect(stored?.mimeType).toBe('image/jpeg');
		const meta = await sharp(stored!.data).metadata();
		expect([meta.width, meta.height]).toEqual([1600, 800]);
		expect(await readPlantPhoto(other, plant.id, photo.id)).toBeNull();
		const folder = path.join(process.env.UPLOAD_DIR!, 'plants');
		expect(await readdir(folder)).toContain(photo.fileName);

		const text = new File([new TextEncoder().encode('<svg onload=alert(1)>')], 'photo.jpg', {
			type: 'image/jpeg'
		});
		await expect(
			tx((t) => addPlantPhoto(member, plant.id, text, null, { transaction: t }))
		).rejects.toThrow('Upload a JPEG, PNG or WebP photo.');
	});
});

describe('readiness, entries and reminders against the demo show', () => {
	it('turns a ready plant into an entry with the next number, and re-checks the rules', async () => {
		const ready = await tx((t) => createPlant(member, [societyId], input({}), { transaction: t }));
		await tx((t) =>
			addPlantEvent(
				member,
				ready.id,
				{
					kind: 'in_bloom',
					happenedOn: today,
					diameter: null,
					crowns: null,
					potSize: null,
					note: null
				},
				{ transaction: t }
			)
		);
		// possession period 3 months: state council show rules 2018 (DOMAIN.md); a plant got a
		// month ago cannot reach it by judging day (41 days after the seed)
		const young = await tx((t) =>
			createPlant(member, [societyId], input({ obtainedOn: addCalendarDays(today, -30) }), {
				transaction: t
			})
		);
		const show = (await loadShowForReadiness(showId, today))!;
		const mine = (await assessCollections(show, [member])).get(member)!;
		const byId = new Map(mine.map((p) => [p.plantId, p]));
		expect(byId.get(ready.id)?.readiness.status).toBe('ready');
		expect(byId.get(young.id)?.readiness.status).toBe('cannot_enter');
		const class3 = show.classes.find((c) => c.code === '3')!;
		expect(byId.get(ready.id)?.readiness.matches.map((m) => m.classId)).toEqual([class3.id]);

		const before = await one<{ n: number }>(
			'SELECT next_entry_number AS n FROM shows WHERE id = $1',
			[showId]
		);
		const entry = await tx((t) =>
			createEntryFromPlant(
				member,
				{ showId, classId: class3.id, plantId: ready.id },
				{ transaction: t }
			)
		);
		expect(entry.number).toBe(before.n);
		const row = await one<{ plant_id: string; variety_id: string; acquired_on: string }>(
			'SELECT plant_id, variety_id, acquired_on FROM entries WHERE id = $1',
			[entry.id]
		);
		expect(row).toEqual({
			plant_id: ready.id,
			variety_id: variety['Dovecote Posy'],
			acquired_on: ready.obtainedOn
		});

		await expect(
			tx((t) =>
				createEntryFromPlant(
					member,
					{ showId, classId: class3.id, plantId: young.id },
					{ transaction: t }
				)
			)
		).rejects.toBeInstanceOf(PlantEntryRefused);
		// Someone else's plant is never entered.
		await expect(
			tx((t) =>
				createEntryFromPlant(
					other,
					{ showId, classId: class3.id, plantId: ready.id },
					{ transaction: t }
				)
			)
		).rejects.toBeInstanceOf(PlantEntryRefused);
	});

	it('queues one reminder per member with plants that fit, once, and not to those who turned them off', async () => {
		const memberEmail = 'member@crownbench.test';
		const ex1 = await userId('exhibitor1@crownbench.test');
		await tx((t) =>
			setMailPreferences(ex1, { reminders: false, results: true }, { transaction: t })
		);

		const first = await tx((t) => queueEntryReminders(showId, { transaction: t, today }));
		expect(first).toBeGreaterThan(0);
		const rows = await sequelize.query<{ to_address: string; text_body: string }>(
			'SELECT to_address, text_body FROM outbox_messages WHERE kind = $1 AND show_id = $2',
			{ bind: [REMINDER_KIND, showId], type: QueryTypes.SELECT }
		);
		const toMember = rows.filter((r) => r.to_address === memberEmail);
		expect(toMember).toHaveLength(1);
		// The demo member's Lantern Cove shows 2 crowns in its last log: remove the sucker.
		expect(toMember[0].text_body).toContain('Lantern Cove (east window)');
		expect(toMember[0].text_body).toContain('remove the sucker before entry day');
		expect(toMember[0].text_body).toContain('follow the product label');
		expect(rows.some((r) => r.to_address === 'exhibitor1@crownbench.test')).toBe(false);
		// judge1 is no member and has no plants
		expect(rows.some((r) => r.to_address === 'judge1@crownbench.test')).toBe(false);

		const second = await tx((t) => queueEntryReminders(showId, { transaction: t, today }));
		expect(second).toBe(0);
	});

	it('the daily check picks only shows whose entries close within 7 days', async () => {
		const close = await one<{ d: string }>('SELECT entries_close AS d FROM shows WHERE id = $1', [
			showId
		]);
		// 30 days before closing: nothing due. (Reminders for the show were queued above, so a
		// run inside the window adds nothing new either: dedupe per show and member.)
		expect(await queueDueReminders(() => addCalendarDays(close.d, -30))).toBe(0);
		expect(await queueDueReminders(() => addCalendarDays(close.d, -3))).toBe(0);
		const count = await one<{ n: string }>(
			'SELECT count(*) AS n FROM outbox_messages WHERE kind = $1 AND show_id = $2',
			[REMINDER_KIND, showId]
		);
		expect(Number(count.n)).toBeGreaterThan(0);
	});
});
