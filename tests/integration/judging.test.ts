import { QueryTypes } from 'sequelize';
import { afterAll, describe, expect, it } from 'vitest';
import { sequelize, Show } from '../../src/lib/server/db';
import {
	listJudgingPagesToKeep,
	loadJudgeClass,
	saveSheet
} from '../../src/lib/server/judging/judging';
import { addJudge, assignClass, setClerk } from '../../src/lib/server/judging/panels';
import { Refusal } from '../../src/lib/server/http/refusal';
import {
	awardsOf,
	loadBoard,
	loadShowJudging,
	publishResults
} from '../../src/lib/server/results/results';
import {
	buildFixture,
	countFor,
	deductions,
	removeFixtures,
	sheetChange,
	sheetVersion
} from './judging-fixture';

afterAll(removeFixtures);

async function refusalOf(promise: Promise<unknown>): Promise<Refusal> {
	const err = await promise.then(
		() => null,
		(e: unknown) => e
	);
	expect(err).toBeInstanceOf(Refusal);
	return err as Refusal;
}

describe('panels refuse a judge with an entry in the class', () => {
	it('refuses a judge whose household has an entry, with the reason, and changes nothing', async () => {
		const f = await buildFixture();
		const show = (await Show.findByPk(f.showId)) as Show;
		// judge3's household (Marrowgate) has the entry in class 2 (a judge must not judge their own: DOMAIN.md)
		await sequelize.transaction((t) =>
			assignClass(show, f.otherClassId, f.panelId, { transaction: t, actor: f.judges[0] })
		);
		const refused = await refusalOf(
			sequelize.transaction((t) => addJudge(show, f.panelId, f.judges[2].id, { transaction: t }))
		);
		expect(refused.message).toMatch(
			/cannot judge class 2: someone of their household has an entry/
		);
		const [row] = await sequelize.query<{ n: string }>(
			'SELECT count(*) AS n FROM panel_judges WHERE panel_id = :p',
			{ replacements: { p: f.panelId }, type: QueryTypes.SELECT }
		);
		expect(Number(row.n)).toBe(2);
	});

	it('refuses a class where a panel member has an entry, and a clerk likewise', async () => {
		const f = await buildFixture();
		const show = (await Show.findByPk(f.showId)) as Show;
		await sequelize.transaction((t) =>
			addJudge(show, f.panelId, f.judges[2].id, { transaction: t })
		);
		const refused = await refusalOf(
			sequelize.transaction((t) =>
				assignClass(show, f.otherClassId, f.panelId, { transaction: t, actor: f.judges[0] })
			)
		);
		expect(refused.message).toMatch(/household has an entry/);
		const own = await refusalOf(
			sequelize.transaction((t) =>
				setClerk(show, f.panelId, f.exhibitors[0].id, { transaction: t, actor: f.judges[0] })
			)
		);
		expect(own.message).toMatch(/clerk or judge/);
	});
});

describe('saving sheets', () => {
	it('saves, versions and audits every change (who, when, before, after)', async () => {
		const f = await buildFixture();
		const [judge] = f.judges;
		const entry = f.entries[0].id;
		const first = await saveSheet(judge, sheetChange(entry, 0, { symmetry: 1.5 }));
		expect(first).toMatchObject({ status: 'saved', sheet: { version: 1, total: 98.5 } });
		const second = await saveSheet(judge, sheetChange(entry, 1, deductions([1.5, 1, 0, 0, 0.5])));
		expect(second.sheet).toMatchObject({ version: 2, total: 97, complete: true });
		const audit = await sequelize.query<{
			actor_email: string;
			before: { total: number } | null;
			after: { total: number };
			at: Date;
		}>(
			'SELECT actor_email, before, after, at FROM score_audit WHERE entry_id = :entry ORDER BY id',
			{
				replacements: { entry },
				type: QueryTypes.SELECT
			}
		);
		expect(audit.map((a) => [a.actor_email, a.before?.total ?? null, a.after.total])).toEqual([
			[judge.email, null, 98.5],
			[judge.email, 98.5, 97]
		]);
		expect(audit[0].at).toBeInstanceOf(Date);
	});

	it.each<[string, Record<string, unknown>, RegExp]>([
		['over its maximum', { color_of_blossom: 10.5 }, /cannot deduct more than the 10 points/],
		['negative', { condition: -1 }, /cannot be negative/],
		['not a number', { symmetry: 'two' }, /enter a number/],
		['not a half point', { symmetry: 0.3 }, /whole or half points/],
		['an unknown criterion', { fragrance: 1 }, /not a criterion/]
	])(
		'refuses a deduction %s with a clear reason and changes nothing',
		async (_what, d, message) => {
			const f = await buildFixture();
			const entry = f.entries[0].id;
			await saveSheet(f.judges[0], sheetChange(entry, 0, { symmetry: 1 }));
			const refused = await refusalOf(saveSheet(f.judges[0], sheetChange(entry, 1, d)));
			expect(refused.status).toBe(400);
			expect(refused.message).toMatch(message);
			expect(await sheetVersion(entry)).toEqual([1]);
			expect(await countFor('score_audit', f.showId)).toBe(1);
		}
	);

	it('refuses an entry outside the judge’s classes, and a judge not on the panel', async () => {
		const f = await buildFixture();
		const outside = await refusalOf(
			saveSheet(f.judges[0], sheetChange(f.otherEntry, 0, { symmetry: 1 }))
		);
		expect(outside).toMatchObject({ status: 403, message: 'This entry is not in your classes.' });
		const notOnPanel = await refusalOf(saveSheet(f.judges[2], sheetChange(f.entries[0].id, 0, {})));
		expect(notOnPanel.status).toBe(403);
		expect(await countFor('score_sheets', f.showId)).toBe(0);
	});

	it('refuses a judge once their household has an entry in the class (moved in after the panel was set)', async () => {
		// A judge must not judge a class with their own or their household's entry (DOMAIN.md).
		const f = await buildFixture();
		const [judge1, judge2] = f.judges;
		const household = (userId: string, name: string | null) =>
			sequelize.query(
				`UPDATE memberships SET household = :name WHERE user_id = :userId AND society_id = :s`,
				{ replacements: { name, userId, s: f.societyId } }
			);
		// The household entry of class 2 is moved to class 1, as the entry desk moves a misclassified plant.
		await sequelize.query(`UPDATE entries SET class_id = :classId WHERE id = :id`, {
			replacements: { classId: f.classId, id: f.otherEntry }
		});
		// Judge 2's household is written differently (case, spaces) from the exhibitor's: still one household.
		await household(judge2.id, '  marrowGATE ');
		const refused = await refusalOf(
			saveSheet(judge2, sheetChange(f.entries[0].id, 0, { symmetry: 1 }))
		);
		expect(refused).toMatchObject({ status: 403, message: expect.stringMatching(/household/) });
		await expect(loadJudgeClass(judge2.id, f.classId)).rejects.toMatchObject({ status: 403 });
		// Judge 1 has no household; blank households are nobody's household.
		expect((await saveSheet(judge1, sheetChange(f.entries[0].id, 0, { symmetry: 1 }))).status).toBe(
			'saved'
		);
		await household(judge1.id, ' ');
		await household(f.exhibitors[0].id, '');
		expect((await saveSheet(judge1, sheetChange(f.entries[0].id, 1, { symmetry: 2 }))).status).toBe(
			'saved'
		);
		// The judge's own entry in the class.
		await sequelize.query(`UPDATE entries SET exhibitor_id = :judge WHERE id = :id`, {
			replacements: { judge: judge1.id, id: f.entries[1].id }
		});
		const own = await refusalOf(
			saveSheet(judge1, sheetChange(f.entries[0].id, 2, { symmetry: 1 }))
		);
		expect(own.status).toBe(403);
		expect(await sheetVersion(f.entries[0].id)).toEqual([2]);
	});

	it('keeps two judges saving the same consensus sheet at once from losing an update', async () => {
		const f = await buildFixture({ method: 'consensus' });
		const entry = f.entries[0].id;
		const [a, b] = await Promise.allSettled([
			saveSheet(f.judges[0], sheetChange(entry, 0, { symmetry: 1 })),
			saveSheet(f.judges[1], sheetChange(entry, 0, { symmetry: 2 }))
		]);
		const outcomes = [a, b].map((r) => r.status);
		expect(outcomes.sort()).toEqual(['fulfilled', 'rejected']);
		const loser = [a, b].find((r) => r.status === 'rejected') as PromiseRejectedResult;
		const winner = [a, b].find((r) => r.status === 'fulfilled') as PromiseFulfilledResult<{
			sheet: { deductions: Record<string, number> };
		}>;
		expect(loser.reason).toMatchObject({ status: 409 });
		// The loser is handed the sheet the winner saved, to show instead of overwriting it.
		expect((loser.reason as Refusal).details).toMatchObject({
			version: 1,
			deductions: winner.value.sheet.deductions
		});
		expect(await sheetVersion(entry)).toEqual([1]);
		// The loser re-applies on the current version: both changes are kept in the audit log.
		await saveSheet(f.judges[1], sheetChange(entry, 1, { symmetry: 2, condition: 1 }));
		expect(await sheetVersion(entry)).toEqual([2]);
		expect(await countFor('score_audit', f.showId)).toBe(2);
	});

	it('applies a replayed offline queue once (no double count)', async () => {
		const f = await buildFixture();
		const entry = f.entries[1].id;
		const judge = f.judges[1];
		const queue = [
			sheetChange(entry, 0, { symmetry: 1 }),
			sheetChange(entry, 1, { symmetry: 1, condition: 2 }),
			sheetChange(entry, 2, deductions([1, 2, 0.5, 0, 0]))
		];
		for (const c of queue) expect((await saveSheet(judge, c)).status).toBe('saved');
		// The network dropped the replies: the tablet sends the whole queue again, twice at once.
		const replays = await Promise.all([...queue, ...queue].map((c) => saveSheet(judge, c)));
		expect(replays.map((r) => r.status)).toEqual(Array(6).fill('replayed'));
		expect(replays[2].sheet).toMatchObject({ version: 3, total: 96.5 });
		expect(await sheetVersion(entry)).toEqual([3]);
		expect(await countFor('score_audit', f.showId)).toBe(3);
	});

	it('applies one change sent twice at once (a retry while the first is on its way) once', async () => {
		const f = await buildFixture();
		const entry = f.entries[0].id;
		const judge = f.judges[0];
		const first = sheetChange(entry, 0, { symmetry: 1, condition: 0.5 });
		const both = await Promise.all([saveSheet(judge, first), saveSheet(judge, first)]);
		expect(both.map((r) => r.status).sort()).toEqual(['replayed', 'saved']);
		expect(both[0].sheet).toEqual(both[1].sheet);
		expect(both[0].sheet).toMatchObject({
			version: 1,
			deductions: { symmetry: 1, condition: 0.5 }
		});
		expect(await sheetVersion(entry)).toEqual([1]);
		expect(await countFor('score_audit', f.showId)).toBe(1);
	});

	it('answers a change that alters nothing as unchanged: no new version, no audit row', async () => {
		const f = await buildFixture();
		const entry = f.entries[0].id;
		const judge = f.judges[0];
		await saveSheet(judge, sheetChange(entry, 0, { symmetry: 2 }));
		const again = await saveSheet(judge, sheetChange(entry, 1, { symmetry: 2 }));
		expect(again.status).toBe('unchanged');
		expect(again.sheet).toMatchObject({ version: 1, deductions: { symmetry: 2 }, total: 98 });
		expect(await sheetVersion(entry)).toEqual([1]);
		expect(await countFor('score_audit', f.showId)).toBe(1);
	});

	it('never sends a judge anything naming the exhibitor', async () => {
		const f = await buildFixture();
		const saved = await saveSheet(f.judges[0], sheetChange(f.entries[0].id, 0, { symmetry: 1 }));
		const seen = JSON.stringify([await loadJudgeClass(f.judges[0].id, f.classId), saved]);
		for (const x of f.exhibitors) {
			expect(seen).not.toContain(x.name);
			expect(seen).not.toContain(x.email);
			expect(seen).not.toContain(x.id);
		}
		expect(seen).not.toMatch(/Thornbury|Ashgrove|household/i);
	});
});

describe('panel scores, board, awards and publishing', () => {
	it('averages the judges (rounding stated in scoring.ts) and gives the ribbons', async () => {
		const f = await buildFixture({ entryCount: 2 });
		const [e1, e2] = f.entries.map((e) => e.id);
		const [j1, j2] = f.judges;
		// 92.5 and 93 → 92.75 → 92.8 (half up to one decimal); 85 and 84.5 → 84.75 → 84.8
		await saveSheet(j1, sheetChange(e1, 0, deductions([2, 2, 2, 1, 0.5])));
		expect((await loadBoard(f.showId)).classes[0]).toMatchObject({
			scored: 0,
			left: 2,
			missingSheets: 3
		});
		await saveSheet(j2, sheetChange(e1, 0, deductions([2, 2, 2, 1, 0])));
		await saveSheet(j1, sheetChange(e2, 0, deductions([5, 5, 3, 1, 1])));
		await saveSheet(j2, sheetChange(e2, 0, deductions([5, 5, 3, 1, 1.5])));
		const judging = await loadShowJudging(f.showId);
		const inClass = judging.entries.filter((e) => e.classId === f.classId);
		expect(inClass.map((e) => e.score)).toEqual([92.8, 84.8]);
		// Class 2 has an entry but no panel yet: it stays on the board as left to judge.
		const board = await loadBoard(f.showId);
		expect(board).toMatchObject({
			classesJudged: 1,
			classesWithEntries: 2,
			entriesLeft: 1,
			sheetsMissing: 0
		});
		expect(board.classes.map((c) => c.state)).toEqual(['judged', 'no_panel']);
		// Merit marks blue 90 / red 80: national handbook, from memory (DOMAIN.md)
		const awards = awardsOf(judging).awards;
		expect(awards.filter((a) => a.kind === 'ribbon').map((a) => [a.entryId, a.level])).toEqual([
			[e1, 'blue'],
			[e2, 'red']
		]);
		expect(awards.find((a) => a.kind === 'best_in_class')?.entryId).toBe(e1);
	});

	it('publishes in one transaction, then refuses every score and award change', async () => {
		const f = await buildFixture({ entryCount: 1 });
		const entry = f.entries[0].id;
		await saveSheet(f.judges[0], sheetChange(entry, 0, deductions([1, 1, 1, 1, 1])));
		const early = await refusalOf(
			sequelize.transaction((t) => publishResults(f.judges[0], f.showId, { transaction: t }))
		);
		// entry 1 waits for judge 2; entry 100 waits in class 2, which has no panel
		expect(early.message).toMatch(/2 entries still have no score/);
		expect(await countFor('awards', f.showId)).toBe(0);
		await saveSheet(f.judges[1], sheetChange(entry, 0, deductions([1, 1, 1, 1, 0])));
		const outcome = await sequelize.transaction((t) =>
			publishResults(f.judges[0], f.showId, { transaction: t, allowIncomplete: true })
		);
		// 95.5: a blue ribbon, best in class, and the division's sweepstakes for its exhibitor
		expect(outcome.awards).toBe(3);
		const stored = await sequelize.query<{ kind: string }>(
			'SELECT kind FROM awards WHERE show_id = :showId ORDER BY position',
			{ replacements: { showId: f.showId }, type: QueryTypes.SELECT }
		);
		expect(stored.map((a) => a.kind)).toEqual(['ribbon', 'best_in_class', 'sweepstakes']);

		const locked = await refusalOf(saveSheet(f.judges[0], sheetChange(entry, 1, { symmetry: 0 })));
		expect(locked.status).toBe(423);
		// i-sec: a judge outside the class is refused by the access check, and hears nothing of the lock.
		const outsider = await refusalOf(
			saveSheet(f.judges[2], sheetChange(entry, 1, { symmetry: 0 }))
		);
		expect([outsider.status, outsider.message]).toEqual([
			403,
			'This entry is not in your classes.'
		]);
		await expect(
			sequelize.query(`UPDATE score_sheets SET comment = 'late' WHERE entry_id = :entry`, {
				replacements: { entry }
			})
		).rejects.toThrow(/published/);
		await expect(
			sequelize.query(`UPDATE awards SET reason = 'changed' WHERE show_id = :showId`, {
				replacements: { showId: f.showId }
			})
		).rejects.toThrow(/published/);
		const again = await refusalOf(
			sequelize.transaction((t) => publishResults(f.judges[0], f.showId, { transaction: t }))
		);
		expect(again.message).toMatch(/already published/);
	});
});

describe('the judging pages a tablet keeps for working offline', () => {
	it('lists the class and every active entry of the person’s panels, until results are public', async () => {
		const f = await buildFixture();
		const expected = [
			'/judging',
			`/judging/class/${f.classId}`,
			...f.entries.map((e) => `/judging/entry/${e.id}`)
		];
		expect((await listJudgingPagesToKeep(f.judges[0].id)).sort()).toEqual(expected.sort());
		// The panel's clerk keeps the same pages; someone on no panel only the list.
		expect((await listJudgingPagesToKeep(f.clerk.id)).sort()).toEqual(expected.sort());
		expect(await listJudgingPagesToKeep(f.exhibitors[0].id)).toEqual(['/judging']);
		// A withdrawn entry is not judged (common practice): its scoresheet is not kept.
		await sequelize.query(`UPDATE entries SET status = 'withdrawn' WHERE id = :id`, {
			replacements: { id: f.entries[0].id }
		});
		expect(await listJudgingPagesToKeep(f.judges[0].id)).not.toContain(
			`/judging/entry/${f.entries[0].id}`
		);
		await sequelize.query(`UPDATE shows SET results_published_at = now() WHERE id = :id`, {
			replacements: { id: f.showId }
		});
		expect(await listJudgingPagesToKeep(f.judges[0].id)).toEqual(['/judging']);
	});
});
