import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { randomUUID } from 'node:crypto';
import { QueryTypes, type Transaction } from 'sequelize';
import type { Role } from '../../src/lib/roles';
import {
	Entry,
	Membership,
	Scale,
	Show,
	ShowClass,
	Society,
	User,
	sequelize
} from '../../src/lib/server/db';
import { setShowFee } from '../../src/lib/server/payments/dues';
import { addJudge, assignClass, createPanel, setClerk } from '../../src/lib/server/judging/panels';
import { isRefusal } from '../../src/lib/server/http/refusal';
import { saveAwardRules } from '../../src/lib/server/results/results';
import {
	ScheduleProblem,
	awardRulesOf,
	deleteClass,
	loadSchedule,
	saveClass,
	saveDivision,
	setSchedulePublished
} from '../../src/lib/server/shows/schedule';
import { copyShow, createShow, type SetupActor } from '../../src/lib/server/shows/show-setup';
import type { ClassInput } from '../../src/lib/schemas/show';
import { PUBLISHED_CRITERIA } from './judging-fixture';

/**
 * A society of its own starts a show from nothing through the services, fills it (divisions,
 * classes, a scale, award rules, fees, panels with judges), takes an entry, and copies it to next
 * year: the copy has the same schedule, rules, scales and award rules on the new dates, and
 * nothing of what people did in the earlier show. Refusals change nothing.
 */

const tag = randomUUID().slice(0, 8);
const made = { societies: [] as string[], users: [] as string[] };
const tx = <T>(work: (t: Transaction) => Promise<T>) => sequelize.transaction(work);

async function society(name: string) {
	const s = await Society.create({ name: `${name} ${tag}`, slug: `${name.toLowerCase()}-${tag}` });
	made.societies.push(s.id);
	return s;
}

async function person(key: string, societyRow: Society, roles: Role[]) {
	const user = await User.create({
		name: `${key} ${tag}`,
		email: `${key}-${tag}@setup.test`,
		emailVerified: null,
		image: null
	});
	made.users.push(user.id);
	await Membership.create({
		societyId: societyRow.id,
		userId: user.id,
		roles,
		household: null,
		duesPaidThrough: null
	});
	const actor: SetupActor & { email: string } = {
		id: user.id,
		email: user.email,
		memberships: [
			{
				societyId: societyRow.id,
				societySlug: societyRow.slug,
				societyName: societyRow.name,
				roles
			}
		]
	};
	return actor;
}

/** Rows of the tables a copy must or must not touch, counted over the whole database. */
async function counts(): Promise<Record<string, number>> {
	const tables = [
		'shows',
		'divisions',
		'classes',
		'panels',
		'panel_classes',
		'panel_judges',
		'entries',
		'score_sheets',
		'awards',
		'outbox_messages',
		'audit_events',
		'scales'
	];
	const out: Record<string, number> = {};
	for (const table of tables) {
		const [row] = await sequelize.query<{ n: string }>(`SELECT count(*) AS n FROM ${table}`, {
			type: QueryTypes.SELECT
		});
		out[table] = Number(row.n);
	}
	return out;
}

/** Expects the work to be refused with a message containing `words`, and nothing to change. */
async function refusedWithNothingChanged(work: () => Promise<unknown>, words: string) {
	const before = await counts();
	const error = await work().then(
		() => null,
		(e: unknown) => e
	);
	expect(error, `expected a refusal mentioning "${words}"`).not.toBeNull();
	expect(isRefusal(error) || error instanceof ScheduleProblem).toBe(true);
	expect((error as Error).message).toContain(words);
	expect(await counts()).toEqual(before);
}

/** Every column of a show's classes but its own ids, in schedule order, with the division code. */
async function classRows(showId: string) {
	const rows = await sequelize.query<Record<string, unknown>>(
		`SELECT c.*, d.code AS division_code FROM classes c JOIN divisions d ON d.id = c.division_id
		  WHERE c.show_id = :showId ORDER BY c.position`,
		{ replacements: { showId }, type: QueryTypes.SELECT }
	);
	return rows.map(({ id: _id, show_id: _show, division_id: _division, ...rest }) => rest);
}

const classInput = (divisionId: string, overrides: Partial<ClassInput>): ClassInput => ({
	divisionId,
	code: '1',
	name: 'Class',
	description: '',
	habit: 'any',
	sizeClasses: [],
	blossomTypes: [],
	blossomColours: [],
	foliage: 'any',
	minCrowns: null,
	maxCrowns: null,
	collectionSize: null,
	speciesOnly: false,
	maxDiameterIn: null,
	possessionMonths: null,
	maxEntriesPerExhibitor: null,
	maxEntriesPerVariety: null,
	maxPotIn: null,
	scaleId: null,
	...overrides
});

let home: Society;
let away: Society;
let chair: Awaited<ReturnType<typeof person>>;
let awayChair: Awaited<ReturnType<typeof person>>;
let judge: Awaited<ReturnType<typeof person>>;
let exhibitor: Awaited<ReturnType<typeof person>>;

beforeAll(async () => {
	home = await society('Larkspur');
	away = await society('Hollowmere');
	chair = await person('chair', home, ['chair', 'member']);
	judge = await person('judge', home, ['judge']);
	exhibitor = await person('grower', home, ['member']);
	awayChair = await person('away-chair', away, ['chair']);
});

afterAll(async () => {
	if (made.societies.length) {
		await sequelize.query('DELETE FROM societies WHERE id IN (:ids)', {
			replacements: { ids: made.societies }
		});
	}
	if (made.users.length) {
		await sequelize.query('DELETE FROM users WHERE id IN (:ids)', {
			replacements: { ids: made.users }
		});
	}
	await sequelize.close();
});

// The earlier show, in the trade's usual sequence (common practice): entries open about ten
// weeks ahead, close two weeks before, entry day the day before judging.
const SPRING = {
	entriesOpen: '2027-03-01',
	entriesClose: '2027-04-30',
	entryDay: '2027-05-14',
	judgingDay: '2027-05-15'
};

describe('a show from nothing, and its copy', () => {
	it('builds a show, publishes it only when every class has a scale, and copies it', async () => {
		const show = await tx((t) =>
			createShow(
				chair,
				{
					societyId: home.id,
					name: 'Larkspur Spring Show',
					slug: `larkspur-spring-${tag}`,
					venue: 'Grange hall',
					...SPRING,
					awardSystem: 'placement',
					panelScoreMethod: 'consensus'
				},
				{ transaction: t }
			)
		);
		expect(show.schedulePublishedAt).toBeNull();
		expect(awardRulesOf(show).system).toBe('placement');
		expect(show.panelScoreMethod).toBe('consensus');

		// Publishing an empty schedule is refused: entries would open with nothing to enter.
		await refusedWithNothingChanged(
			() => tx((t) => setSchedulePublished(show, true, { transaction: t, actor: chair })),
			'no class'
		);
		expect((await Show.findByPk(show.id))!.schedulePublishedAt).toBeNull();

		// Scale of points 25/25/25/15/10 ("A Beginner's Guide to Judging", AVM 1993, rev. 2020).
		const scale = await Scale.create({
			societyId: home.id,
			name: `Larkspur standard ${tag}`,
			criteria: PUBLISHED_CRITERIA
		} as never);
		const standards = await tx((t) =>
			saveDivision(
				show.id,
				null,
				{ code: 'I', name: 'Standards', kind: 'horticulture' },
				{ transaction: t }
			)
		);
		const trailers = await tx((t) =>
			saveDivision(
				show.id,
				null,
				{ code: 'II', name: 'Trailers', kind: 'horticulture' },
				{ transaction: t }
			)
		);
		const single = await tx((t) =>
			saveClass(
				show,
				null,
				classInput(standards.id, {
					code: '1',
					name: 'Single crown, blue blossoms',
					habit: 'single_crown',
					sizeClasses: ['standard'],
					blossomColours: ['blue'],
					maxCrowns: 1,
					scaleId: scale.id
				}),
				{ transaction: t }
			)
		);
		const mini = await tx((t) =>
			saveClass(
				show,
				null,
				classInput(standards.id, {
					code: '2',
					name: 'Miniatures, variegated',
					habit: 'single_crown',
					sizeClasses: ['miniature'],
					foliage: 'variegated',
					// miniature up to 6 in across (growers' references, DOMAIN.md)
					maxDiameterIn: 6,
					scaleId: scale.id
				}),
				{ transaction: t }
			)
		);
		const trailer = await tx((t) =>
			saveClass(
				show,
				null,
				classInput(trailers.id, {
					code: '10',
					name: 'Trailers, any size',
					habit: 'trailer',
					// a trailer has at least 3 crowns (provincial society show schedule 2014, DOMAIN.md)
					minCrowns: 3,
					description: 'Shown as grown, several crowns from one stem.'
				}),
				{ transaction: t }
			)
		);

		// Class 10 has no scale: publishing is refused with its reason, nothing changes.
		await refusedWithNothingChanged(
			() =>
				tx(async (t) =>
					setSchedulePublished((await Show.findByPk(show.id, { transaction: t }))!, true, {
						transaction: t,
						actor: chair
					})
				),
			'Class 10 has no scale of points'
		);
		await tx((t) =>
			saveClass(
				show,
				trailer.id,
				classInput(trailers.id, { ...trailerValues(), scaleId: scale.id }),
				{
					transaction: t
				}
			)
		);

		await tx((t) =>
			saveAwardRules(
				show,
				{
					...awardRulesOf(show),
					topAwards: [
						{ id: 'best-small', name: 'Best small plant', classIds: [mini.id], minScore: 90 },
						{
							id: 'best-grown',
							name: 'Best grown plant',
							classIds: [single.id, trailer.id],
							minScore: 92
						}
					]
				},
				'consensus',
				{ transaction: t }
			)
		);
		await tx((t) =>
			setShowFee(
				{
					societyId: home.id,
					showId: show.id,
					entryFeeCents: 150,
					entryFeeRefund: 'until_entries_close'
				},
				{ transaction: t }
			)
		);
		const panelA = await tx((t) => createPanel(show, 'Panel North', { transaction: t }));
		const panelB = await tx((t) => createPanel(show, 'Panel South', { transaction: t }));
		await tx(async (t) => {
			await assignClass(show, single.id, panelA.id, { transaction: t, actor: chair });
			await assignClass(show, mini.id, panelA.id, { transaction: t, actor: chair });
			await assignClass(show, trailer.id, panelB.id, { transaction: t, actor: chair });
			await addJudge(show, panelA.id, judge.id, { transaction: t });
			await setClerk(show, panelB.id, judge.id, { transaction: t, actor: chair });
		});

		const published = await tx(async (t) => {
			const current = (await Show.findByPk(show.id, { transaction: t }))!;
			await setSchedulePublished(current, true, { transaction: t, actor: chair });
			return current;
		});
		expect(published.schedulePublishedAt).not.toBeNull();
		await Entry.create({
			showId: show.id,
			classId: single.id,
			exhibitorId: exhibitor.id,
			number: 1,
			title: 'Seedling under number',
			varietyId: null,
			acquiredOn: null,
			measuredDiameterIn: null,
			measuredCrowns: null,
			potSizeIn: null,
			checkedInAt: null,
			checkedInBy: null
		});

		// The public schedule is fixed now, and with an entry it cannot be hidden either.
		await refusedWithNothingChanged(
			() => tx((t) => deleteClass(published, mini.id, { transaction: t, actor: chair })),
			'The schedule is public'
		);
		await refusedWithNothingChanged(
			() => tx((t) => setSchedulePublished(published, false, { transaction: t, actor: chair })),
			'entered plants'
		);

		// The copy, for next year: judging on 13 May 2028.
		const before = await counts();
		const copy = await tx((t) =>
			copyShow(
				chair,
				{
					societyId: home.id,
					sourceShowId: show.id,
					name: 'Larkspur Spring Show 2028',
					slug: `larkspur-spring-2028-${tag}`,
					venue: '',
					judgingDay: '2028-05-13'
				},
				{ transaction: t }
			)
		);
		const after = await counts();
		expect(after).toEqual({
			...before,
			shows: before.shows + 1,
			divisions: before.divisions + 2,
			classes: before.classes + 3,
			panels: before.panels + 2,
			panel_classes: before.panel_classes + 3
		});

		// New dates: each keeps its distance from judging day (75, 15 and 1 days before).
		expect([copy.entriesOpen, copy.entriesClose, copy.entryDay, copy.judgingDay]).toEqual([
			'2028-02-28',
			'2028-04-28',
			'2028-05-12',
			'2028-05-13'
		]);
		expect(copy.venue).toBe('Grange hall');
		expect(copy.schedulePublishedAt).toBeNull();
		expect(copy.resultsPublishedAt).toBeNull();
		expect(copy.nextEntryNumber).toBe(1);
		expect(copy.panelScoreMethod).toBe('consensus');
		expect([copy.entryFeeCents, copy.entryFeeRefund]).toEqual([150, 'until_entries_close']);

		// Same schedule, every class rule and scale.
		expect(await classRows(copy.id)).toEqual(await classRows(show.id));
		const strip = (divisions: Awaited<ReturnType<typeof loadSchedule>>) =>
			divisions.map(({ id: _id, classes, ...d }) => ({
				...d,
				classes: classes.map(({ id: _c, divisionId: _d, ...c }) => c)
			}));
		expect(strip(await loadSchedule(copy.id))).toEqual(strip(await loadSchedule(show.id)));
		const copiedClasses = await ShowClass.findAll({ where: { showId: copy.id } });
		const codeOf = new Map(copiedClasses.map((c) => [c.id, c.code]));
		expect(copiedClasses.every((c) => c.scaleId === scale.id)).toBe(true);

		// Same award rules; top awards name the copy's classes with the same codes.
		const rules = awardRulesOf(copy);
		const earlier = awardRulesOf((await Show.findByPk(show.id))!);
		expect({ ...rules, topAwards: [] }).toEqual({ ...earlier, topAwards: [] });
		expect(
			rules.topAwards.map((a) => ({ ...a, classIds: a.classIds.map((id) => codeOf.get(id)) }))
		).toEqual([
			{ id: 'best-small', name: 'Best small plant', classIds: ['2'], minScore: 90 },
			{ id: 'best-grown', name: 'Best grown plant', classIds: ['1', '10'], minScore: 92 }
		]);

		// Panels with their classes, without judges or clerk; nothing people did came along.
		const panels = await sequelize.query<{ name: string; clerk_id: string | null; codes: string }>(
			`SELECT p.name, p.clerk_id, string_agg(c.code, ',' ORDER BY c.position) AS codes
			   FROM panels p JOIN panel_classes pc ON pc.panel_id = p.id JOIN classes c ON c.id = pc.class_id
			  WHERE p.show_id = :showId GROUP BY p.id ORDER BY p.name`,
			{ replacements: { showId: copy.id }, type: QueryTypes.SELECT }
		);
		expect(panels).toEqual([
			{ name: 'Panel North', clerk_id: null, codes: '1,2' },
			{ name: 'Panel South', clerk_id: null, codes: '10' }
		]);
		for (const table of ['entries', 'score_sheets', 'awards', 'outbox_messages', 'audit_events']) {
			const [row] = await sequelize.query<{ n: string }>(
				`SELECT count(*) AS n FROM ${table} WHERE show_id = :showId`,
				{ replacements: { showId: copy.id }, type: QueryTypes.SELECT }
			);
			expect(Number(row.n), table).toBe(0);
		}

		// The copy is being planned: its schedule can change, unlike the earlier show's.
		const copiedTrailer = copiedClasses.find((c) => c.code === '10')!;
		await tx((t) =>
			saveClass(
				copy,
				copiedTrailer.id,
				classInput(copiedTrailer.divisionId, {
					...trailerValues(),
					minCrowns: 4,
					scaleId: scale.id
				}),
				{ transaction: t }
			)
		);
		expect((await ShowClass.findByPk(trailer.id))!.minCrowns).toBe(3);

		// Refusals: another society's show, another society's chair, dates out of order, a taken
		// short name. Nothing changes for any of them.
		const awayShow = await tx((t) =>
			createShow(
				awayChair,
				{
					societyId: away.id,
					name: 'Hollowmere Show',
					slug: `hollowmere-${tag}`,
					venue: '',
					...SPRING,
					awardSystem: 'merit',
					panelScoreMethod: 'mean'
				},
				{ transaction: t }
			)
		);
		const copyInput = {
			societyId: home.id,
			sourceShowId: awayShow.id,
			name: 'Borrowed show',
			slug: `borrowed-${tag}`,
			venue: '',
			judgingDay: '2028-05-13'
		};
		await refusedWithNothingChanged(
			() => tx((t) => copyShow(chair, copyInput, { transaction: t })),
			'only a show of this society'
		);
		await refusedWithNothingChanged(
			() =>
				tx((t) => copyShow(awayChair, { ...copyInput, sourceShowId: show.id }, { transaction: t })),
			'where you are a show chair'
		);
		await refusedWithNothingChanged(
			() =>
				tx((t) =>
					copyShow(
						awayChair,
						{ ...copyInput, societyId: away.id, sourceShowId: show.id },
						{ transaction: t }
					)
				),
			'only a show of this society'
		);
		await refusedWithNothingChanged(
			() =>
				tx((t) =>
					copyShow(
						chair,
						{ ...copyInput, sourceShowId: show.id, entryDay: '2028-05-20' },
						{ transaction: t }
					)
				),
			'Judging day must be on or after entry day.'
		);
		await refusedWithNothingChanged(
			() =>
				tx((t) =>
					createShow(
						chair,
						{
							societyId: home.id,
							name: 'Backwards show',
							slug: `backwards-${tag}`,
							venue: '',
							...SPRING,
							entriesClose: '2027-02-01',
							awardSystem: 'merit',
							panelScoreMethod: 'mean'
						},
						{ transaction: t }
					)
				),
			'Entries must close on or after the day they open.'
		);
		await refusedWithNothingChanged(
			() =>
				tx((t) =>
					copyShow(
						chair,
						{ ...copyInput, sourceShowId: show.id, slug: copy.slug },
						{ transaction: t }
					)
				),
			'already used by another show'
		);
	});
});

function trailerValues(): Partial<ClassInput> {
	return {
		code: '10',
		name: 'Trailers, any size',
		habit: 'trailer',
		minCrowns: 3,
		description: 'Shown as grown, several crowns from one stem.'
	};
}
