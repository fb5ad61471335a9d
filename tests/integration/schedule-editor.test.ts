import { randomUUID } from 'node:crypto';
import { PDFParse } from 'pdf-parse';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { QueryTypes } from 'sequelize';
import { defaultScales } from '../../src/lib/domain/scales';
import { scaleSchema } from '../../src/lib/schemas/scale';
import { classSchema, scheduleTextSchema, type ClassInput } from '../../src/lib/schemas/show';
import { Scale, Show, ShowClass, sequelize } from '../../src/lib/server/db';
import { renderPdf } from '../../src/lib/server/pdf/render';
import { scheduleDocument } from '../../src/lib/server/shows/schedule-pdf';
import { EntryRefused, enterPlant, previewEntry } from '../../src/lib/server/entries/entries';
import {
	ScaleProblem,
	copyScale,
	createScale,
	listSocietyScales,
	updateScale
} from '../../src/lib/server/shows/scales';
import {
	ScheduleProblem,
	loadSchedule,
	moveClass,
	moveDivision,
	saveClass,
	saveDivision,
	saveScheduleText,
	settingsOf
} from '../../src/lib/server/shows/schedule';

const tag = randomUUID().slice(0, 8);
const made = { societies: [] as string[], users: [] as string[] };
const q = (sql: string, replacements: Record<string, unknown> = {}) =>
	sequelize.query(sql, { replacements });
const tx = <T>(work: (t: import('sequelize').Transaction) => Promise<T>) =>
	sequelize.transaction(work);

async function society(name: string): Promise<string> {
	const id = randomUUID();
	made.societies.push(id);
	await q('INSERT INTO societies (id, name, slug) VALUES (:id, :name, :slug)', {
		id,
		name: `${name} ${tag}`,
		slug: `${name.toLowerCase()}-${tag}`
	});
	return id;
}

async function member(societyId: string, key: string): Promise<string> {
	const id = randomUUID();
	made.users.push(id);
	await q('INSERT INTO users (id, name, email) VALUES (:id, :name, :email)', {
		id,
		name: `${key} ${tag}`,
		email: `${key}-${tag}@schedule.test`
	});
	await q(
		`INSERT INTO memberships (society_id, user_id, roles) VALUES (:societyId, :id, '{member}')`,
		{ societyId, id }
	);
	return id;
}

async function variety(societyId: string, name: string, habit = 'single_crown'): Promise<string> {
	const id = randomUUID();
	await q(
		`INSERT INTO varieties (id, society_id, name, habit, size_class, blossom_type, blossom_colours)
		 VALUES (:id, :societyId, :name, :habit, 'standard', 'double', '{pink}')`,
		{ id, societyId, name: `${name} ${tag}`, habit }
	);
	return id;
}

/** A show whose entries are open today: judging about half a year ahead. */
async function show(societyId: string, slug: string): Promise<Show> {
	const id = randomUUID();
	const today = new Date();
	const day = (months: number) => {
		const d = new Date(Date.UTC(today.getUTCFullYear(), today.getUTCMonth() + months, 15));
		return d.toISOString().slice(0, 10);
	};
	await q(
		`INSERT INTO shows (id, society_id, name, slug, entries_open, entries_close, entry_day, judging_day,
		                    require_good_standing, possession_months, max_entries_per_class, max_entries_per_variety)
		 VALUES (:id, :societyId, :name, :slug, :open, :close, :entryDay, :judgingDay, false, 3, 2, 1)`,
		{
			id,
			societyId,
			name: `Show ${slug}`,
			slug: `${slug}-${tag}`,
			open: day(-2),
			close: day(5),
			entryDay: day(6),
			judgingDay: day(6)
		}
	);
	return (await Show.findByPk(id))!;
}

function classInput(divisionId: string, over: Record<string, unknown>): ClassInput {
	return classSchema.parse(classForm(divisionId, over));
}

function classForm(divisionId: string, over: Record<string, unknown>): Record<string, unknown> {
	return {
		divisionId,
		code: '1',
		name: 'Standards, any color',
		description: '',
		habit: 'single_crown',
		sizeClasses: [],
		blossomTypes: '',
		blossomColours: '',
		foliage: 'any',
		minCrowns: '',
		maxCrowns: '',
		collectionSize: '',
		speciesOnly: false,
		maxDiameterIn: '',
		possessionMonths: '',
		maxEntriesPerExhibitor: '',
		maxEntriesPerVariety: '',
		maxPotIn: '',
		scaleId: '',
		...over
	};
}

async function scoreSheetIn(classId: string, exhibitorId: string, showId: string): Promise<void> {
	const entryId = randomUUID();
	const [{ n }] = await sequelize.query<{ n: number }>(
		'SELECT coalesce(max(number), 0) + 1000 AS n FROM entries WHERE show_id = :showId',
		{ replacements: { showId }, type: QueryTypes.SELECT }
	);
	await q(
		`INSERT INTO entries (id, show_id, class_id, exhibitor_id, title, number, status)
		 VALUES (:entryId, :showId, :classId, :exhibitorId, 'Judged plant', :n, 'checked_in')`,
		{ entryId, showId, classId, exhibitorId, n }
	);
	await q(
		`INSERT INTO score_sheets (show_id, entry_id, kind, deductions) VALUES (:showId, :entryId, 'consensus', '{"condition": 2}')`,
		{ showId, entryId }
	);
}

const snapshot = async (table: 'classes' | 'scales', where: string, p: Record<string, unknown>) =>
	sequelize.query(`SELECT * FROM ${table} WHERE ${where} ORDER BY id`, {
		replacements: p,
		type: QueryTypes.SELECT
	});

/**
 * Runs entry checks on the show with its schedule public (members enter only a published
 * schedule), then takes it back to planning, written directly so the schedule tests can go on.
 */
async function whilePublished<T>(run: () => Promise<T>): Promise<T> {
	await theShow.update({ schedulePublishedAt: new Date() });
	try {
		return await run();
	} finally {
		await theShow.update({ schedulePublishedAt: null });
	}
}

let societyA: string;
let societyB: string;
let exhibitor: string;
let plantA: string;
let plantB: string;
let theShow: Show;
let divisionId: string;

beforeAll(async () => {
	societyA = await society('Fernhollow');
	societyB = await society('Saltbarrow');
	exhibitor = await member(societyA, 'grower');
	plantA = await variety(societyA, 'Tinder Plume');
	plantB = await variety(societyA, 'Gable Frost');
	theShow = await show(societyA, 'fernhollow-spring');
	divisionId = (
		await tx((t) =>
			saveDivision(
				theShow.id,
				null,
				{ code: 'I', name: 'Standards', kind: 'horticulture' },
				{ transaction: t }
			)
		)
	).id;
});

afterAll(async () => {
	await q('DELETE FROM shows WHERE society_id IN (:ids)', { ids: made.societies });
	await q('DELETE FROM societies WHERE id IN (:ids)', { ids: made.societies });
	await q('DELETE FROM users WHERE id IN (:ids)', { ids: made.users });
});

describe('the class form saves every rule, and the entry check uses them', () => {
	it('saves and reads back every new rule', async () => {
		const saved = await tx((t) =>
			saveClass(
				theShow,
				null,
				classInput(divisionId, {
					code: '10',
					sizeClasses: ['standard'],
					blossomTypes: 'double, semidouble',
					blossomColours: 'pink',
					foliage: 'plain',
					maxCrowns: '1',
					maxDiameterIn: '14.5',
					possessionMonths: '6',
					maxEntriesPerExhibitor: '1',
					maxEntriesPerVariety: '2',
					maxPotIn: '5.5'
				}),
				{ transaction: t }
			)
		);
		const [division] = await loadSchedule(theShow.id);
		const read = division.classes.find((c) => c.id === saved.id)!;
		expect(read).toMatchObject({
			habit: 'single_crown',
			sizeClasses: ['standard'],
			blossomTypes: ['double', 'semidouble'],
			blossomColours: ['pink'],
			foliage: 'plain',
			maxCrowns: 1,
			maxDiameterIn: 14.5,
			possessionMonths: 6,
			maxEntriesPerExhibitor: 1,
			maxEntriesPerVariety: 2,
			maxPotIn: 5.5
		});
	});

	it('refuses a plant grown 4 months where the class asks 6 (the show asks 3)', async () => {
		const classId = (await ShowClass.findOne({ where: { showId: theShow.id, code: '10' } }))!.id;
		const judging = new Date(theShow.judgingDay);
		judging.setUTCMonth(judging.getUTCMonth() - 4);
		const acquiredOn = judging.toISOString().slice(0, 10);
		const request = { showSlug: theShow.slug, classId, varietyId: plantA, acquiredOn };
		const verdict = await whilePublished(() => previewEntry(theShow, exhibitor, request));
		expect(verdict.failures.map((f) => f.code)).toEqual(['possession_period_not_reached']);
		expect(verdict.failures[0].message).toMatch(/this class asks/i);
	});

	it('takes one entry per exhibitor where the class says 1 (the show allows 2)', async () => {
		const saved = await tx((t) =>
			saveClass(
				theShow,
				null,
				classInput(divisionId, { code: '11', maxEntriesPerExhibitor: '1' }),
				{
					transaction: t
				}
			)
		);
		const at = (varietyId: string) => ({
			showSlug: theShow.slug,
			classId: saved.id,
			varietyId,
			acquiredOn: '2020-01-01'
		});
		const verdict = await whilePublished(async () => {
			await enterPlant(theShow.id, exhibitor, at(plantA));
			await expect(enterPlant(theShow.id, exhibitor, at(plantB))).rejects.toThrow(EntryRefused);
			return previewEntry(theShow, exhibitor, at(plantB));
		});
		expect(verdict.failures.map((f) => f.code)).toEqual(['class_entry_limit_reached']);
	});

	it('refuses a bad rule with a clear message', () => {
		const bad = classSchema.safeParse(classForm(divisionId, { maxPotIn: '-2' }));
		expect(bad.success).toBe(false);
		expect(bad.error?.issues[0].message).toBe('The largest pot must be more than 0.');
		const months = classSchema.safeParse(classForm(divisionId, { possessionMonths: '30' }));
		expect(months.error?.issues[0].message).toBe(
			'The class’s possession period must be at most 24.'
		);
	});
});

describe('a class with entries keeps its rules', () => {
	it('refuses a rule change, with the reason, and changes nothing', async () => {
		const entered = (await ShowClass.findOne({ where: { showId: theShow.id, code: '11' } }))!;
		const before = await snapshot('classes', 'id = :id', { id: entered.id });
		const change = classInput(divisionId, {
			code: '11',
			maxEntriesPerExhibitor: '3',
			habit: 'trailer'
		});
		const attempt = tx((t) => saveClass(theShow, entered.id, change, { transaction: t }));
		await expect(attempt).rejects.toThrow(ScheduleProblem);
		await expect(attempt).rejects.toThrow(
			'This class already has 1 entry, so its rules are fixed: the habit and entries per exhibitor cannot change.'
		);
		expect(await snapshot('classes', 'id = :id', { id: entered.id })).toEqual(before);
	});

	it('still takes a new name and a move up or down', async () => {
		const entered = (await ShowClass.findOne({ where: { showId: theShow.id, code: '11' } }))!;
		await tx((t) =>
			saveClass(
				theShow,
				entered.id,
				classInput(divisionId, { code: '11', name: 'One plant each', maxEntriesPerExhibitor: '1' }),
				{ transaction: t }
			)
		);
		expect((await entered.reload()).name).toBe('One plant each');
		const order = async () => (await loadSchedule(theShow.id))[0].classes.map((c) => c.code);
		expect(await order()).toEqual(['10', '11']);
		await tx((t) => moveClass(theShow, { id: entered.id, direction: 'up' }, { transaction: t }));
		expect(await order()).toEqual(['11', '10']);
		await expect(
			tx((t) => moveClass(theShow, { id: entered.id, direction: 'up' }, { transaction: t }))
		).rejects.toThrow('This class is already first in its division.');
	});

	it('orders divisions too', async () => {
		await tx((t) =>
			saveDivision(
				theShow.id,
				null,
				{ code: 'II', name: 'Design', kind: 'design' },
				{ transaction: t }
			)
		);
		const codes = async () => (await loadSchedule(theShow.id)).map((d) => d.code);
		expect(await codes()).toEqual(['I', 'II']);
		const second = (await loadSchedule(theShow.id))[1];
		await tx((t) => moveDivision(theShow, { id: second.id, direction: 'up' }, { transaction: t }));
		expect(await codes()).toEqual(['II', 'I']);
	});
});

describe('scales of points kept by the society', () => {
	const draft = (name: string, points: number[]) =>
		scaleSchema.parse({
			name,
			criteria: points.map((p, i) => ({
				label: `Criterion ${String.fromCharCode(65 + i)}`,
				maxPoints: String(p)
			}))
		});

	it('makes a new version once a sheet is scored; the judged class keeps the old one', async () => {
		// The published standard scale (AVM 1993, rev. 2020), saved as the society's own.
		const standard = defaultScales()[0];
		const scale = await tx((t) => createScale(societyA, standard, { transaction: t }));
		const judged = await tx((t) =>
			saveClass(theShow, null, classInput(divisionId, { code: '20', scaleId: scale.id }), {
				transaction: t
			})
		);
		const waiting = await tx((t) =>
			saveClass(theShow, null, classInput(divisionId, { code: '21', scaleId: scale.id }), {
				transaction: t
			})
		);
		await scoreSheetIn(judged.id, exhibitor, theShow.id);

		const edited = {
			name: standard.name,
			criteria: standard.criteria.map((c) => (c.key === 'condition' ? { ...c, maxPoints: 30 } : c))
		};
		const result = await tx((t) => updateScale(societyA, scale.id, edited, { transaction: t }));
		expect(result).toMatchObject({ newVersion: true, movedClasses: 1, keptClasses: 1 });
		expect(result.scale.id).not.toBe(scale.id);
		expect(result.scale.version).toBe(2);
		expect(result.scale.replacesId).toBe(scale.id);

		await scale.reload();
		expect(scale.criteria.find((c) => c.key === 'condition')?.maxPoints).toBe(25);
		expect((await judged.reload()).scaleId).toBe(scale.id);
		expect((await waiting.reload()).scaleId).toBe(result.scale.id);
		const listed = await listSocietyScales(societyA);
		expect(listed.filter((s) => s.own && s.name === standard.name).map((s) => s.version)).toEqual([
			2
		]);
		expect(listed.find((s) => s.id === result.scale.id)?.total).toBe(105);

		// The judged class cannot be moved to another scale.
		await expect(
			tx((t) =>
				saveClass(
					theShow,
					judged.id,
					classInput(divisionId, { code: '20', scaleId: result.scale.id }),
					{
						transaction: t
					}
				)
			)
		).rejects.toThrow('Judges have already scored plants in this class');
	});

	it('changes an unused scale in place', async () => {
		const scale = await tx((t) =>
			createScale(societyA, draft(`Plain ${tag}`, [50, 50]), { transaction: t })
		);
		const result = await tx((t) =>
			updateScale(societyA, scale.id, draft(`Plain ${tag}`, [60, 40]), { transaction: t })
		);
		expect(result.newVersion).toBe(false);
		expect((await scale.reload()).criteria.map((c) => c.maxPoints)).toEqual([60, 40]);
	});

	it('refuses invalid scales with a clear message and changes nothing', () => {
		const cases: [unknown, string][] = [
			[{ name: 'Empty', criteria: [] }, 'A scale of points needs at least one criterion.'],
			[
				{ name: 'Zero', criteria: [{ label: 'Condition', maxPoints: '0' }] },
				'Criterion 1 must give more than 0 points.'
			],
			[
				{ name: 'Big', criteria: [{ label: 'Condition', maxPoints: '120' }] },
				'Criterion 1 may give at most 100 points.'
			],
			[{ name: 'Blank', criteria: [{ label: ' ', maxPoints: '20' }] }, 'Criterion 1 needs a name.'],
			[
				{
					name: 'Twice',
					criteria: [
						{ label: 'Condition', maxPoints: '20' },
						{ label: 'Condition', maxPoints: '20' }
					]
				},
				'“Condition” is already criterion 1; give each criterion its own name.'
			]
		];
		for (const [input, message] of cases) {
			const parsed = scaleSchema.safeParse(input);
			expect(parsed.success).toBe(false);
			expect(parsed.error?.issues[0].message).toBe(message);
		}
	});

	it('the service refuses them too, writing nothing', async () => {
		const before = await snapshot('scales', 'society_id = :s', { s: societyA });
		await expect(
			tx((t) => createScale(societyA, { name: 'Empty', criteria: [] }, { transaction: t }))
		).rejects.toThrow('A scale of points needs at least one criterion.');
		const some = before[0] as { id: string };
		await expect(
			tx((t) =>
				updateScale(
					societyA,
					some.id,
					{ name: 'Zero', criteria: [{ key: 'c', label: 'C', maxPoints: 0 }] },
					{ transaction: t }
				)
			)
		).rejects.toThrow(ScaleProblem);
		expect(await snapshot('scales', 'society_id = :s', { s: societyA })).toEqual(before);
	});

	it('keeps another society’s scale out of reach', async () => {
		const theirs = await tx((t) =>
			createScale(societyB, draft(`Theirs ${tag}`, [100]), { transaction: t })
		);
		const before = await snapshot('scales', 'id = :id', { id: theirs.id });
		await expect(
			tx((t) => updateScale(societyA, theirs.id, draft('Mine now', [50]), { transaction: t }))
		).rejects.toThrow('That scale is not one of the society’s.');
		await expect(tx((t) => copyScale(societyA, theirs.id, { transaction: t }))).rejects.toThrow(
			'That scale is not one of the society’s.'
		);
		await expect(
			tx((t) =>
				saveClass(theShow, null, classInput(divisionId, { code: '30', scaleId: theirs.id }), {
					transaction: t
				})
			)
		).rejects.toThrow('Choose one of the society’s scales.');
		expect(await snapshot('scales', 'id = :id', { id: theirs.id })).toEqual(before);
		expect(await ShowClass.count({ where: { showId: theShow.id, code: '30' } })).toBe(0);
		expect(await Scale.count({ where: { societyId: societyA, name: 'Mine now' } })).toBe(0);
	});
});

describe('the schedule PDF', () => {
	it('prints the general rules, the committee and the largest pot', async () => {
		const texts = [
			{
				part: 'generalRules',
				text: 'Plants must be clean and free of pests.\n\nNo supports or collars.'
			},
			{ part: 'committee', text: `Show chair: Hestia Varnum ${tag}` }
		];
		for (const input of texts) {
			await tx((t) =>
				saveScheduleText(theShow, scheduleTextSchema.parse(input), { transaction: t })
			);
		}
		const refused = scheduleTextSchema.safeParse({ part: 'committee', text: 'x'.repeat(2001) });
		expect(refused.error?.issues[0].message).toBe(
			'Keep the committee list under 2,000 characters.'
		);
		await theShow.reload();
		const pdf = await renderPdf(
			scheduleDocument(
				{ ...settingsOf(theShow), societyName: 'Fernhollow' },
				await loadSchedule(theShow.id),
				{ paperSize: 'letter', lengthUnit: 'in', currency: 'USD' }
			)
		);
		const parser = new PDFParse({ data: new Uint8Array(pdf) });
		const { text } = await parser.getText();
		await parser.destroy();
		expect(text).toContain('General rules');
		expect(text).toContain('No supports or collars.');
		expect(text).toContain('Show committee');
		expect(text).toContain(`Hestia Varnum ${tag}`);
		// Lengths print in the society's unit first, the other after (1 in = 2.54 cm, NIST SP 811).
		expect(text.replace(/\s+/g, ' ')).toContain('largest pot 5.5 in (14 cm)');
	});
});
