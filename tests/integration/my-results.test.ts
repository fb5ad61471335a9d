import { afterAll, describe, expect, it } from 'vitest';
import { sequelize } from '../../src/lib/server/db';
import { saveSheet } from '../../src/lib/server/judging/judging';
import {
	listMyEntries,
	loadMyEntryResult,
	loadMyRecord,
	loadSocietyRecord,
	setSharePointsLost
} from '../../src/lib/server/results/my-results';
import { publishResults } from '../../src/lib/server/results/results';
import { buildFixture, deductions, removeFixtures, sheetChange } from './judging-fixture';

afterAll(async () => {
	await removeFixtures();
	await sequelize.close();
});

// A show of its own (judging-fixture.ts): a panel of two judges on the published scale (25/25/25/
// 15/10), mean of the judges' totals, default merit ribbons (blue 90 and over; national
// handbook, from memory). Entry 1 (exhibitor 1): judge 1 takes 2 off symmetry and 1 off
// condition (97), judge 2 takes 3 and 2 (95): mean 96, a blue ribbon; points lost per criterion
// are the judges' mean: symmetry 2.5, condition 1.5. Entry 2 (exhibitor 2): 85 from both, red.
describe('an exhibitor’s own results', () => {
	it('shows nothing before publishing, then only their own, with points lost once shared', async () => {
		const f = await buildFixture({ entryCount: 2 });
		const [own, other] = f.entries;
		const [me, rival] = f.exhibitors;
		const sheets: [number, [number, number, number, number, number], string][] = [
			[0, [2, 1, 0, 0, 0], 'Even rosette'],
			[1, [3, 2, 0, 0, 0], 'Leaf pattern slightly off'],
			[0, [5, 5, 5, 0, 0], 'Rival remark one'],
			[1, [5, 5, 5, 0, 0], 'Rival remark two']
		];
		for (const [i, [judge, d, comment]] of sheets.entries()) {
			const entryId = i < 2 ? own.id : other.id;
			await saveSheet(f.judges[judge], { ...sheetChange(entryId, 0, deductions(d)), comment });
		}

		expect(await loadMyEntryResult(me.id, own.id)).toBeNull();
		expect((await listMyEntries(me.id)).map((e) => e.result)).toEqual([null]);
		expect(await loadMyRecord(me.id)).toEqual([]);
		expect(await loadSocietyRecord(f.societyId)).toEqual([]);

		await sequelize.transaction((transaction) =>
			publishResults(f.judges[0], f.showId, { transaction, allowIncomplete: true })
		);
		const result = await loadMyEntryResult(me.id, own.id);
		expect(result).toMatchObject({
			score: 96,
			state: 'scored',
			level: 'blue',
			comments: ['Even rosette', 'Leaf pattern slightly off'],
			pointsLost: null
		});
		// Another exhibitor's entry is never read for me.
		expect(await loadMyEntryResult(me.id, other.id)).toBeNull();
		expect((await loadMyEntryResult(rival.id, other.id))?.level).toBe('red');

		await sequelize.transaction((transaction) =>
			setSharePointsLost(f.showId, true, { transaction })
		);
		const shared = await loadMyEntryResult(me.id, own.id);
		expect(shared?.pointsLost?.map((p) => [p.key, p.lost])).toEqual([
			['symmetry', 2.5],
			['condition', 1.5],
			['quantity_of_bloom', 0],
			['size_and_type_of_blossom', 0],
			['color_of_blossom', 0]
		]);

		const record = await loadMyRecord(me.id);
		expect(record.map((r) => [r.plant, r.score, r.level])).toEqual([['Plant 1', 96, 'blue']]);
		// The society's record has every entry of the show (the household plant was not judged),
		// and no exhibitor or comment.
		const society = await loadSocietyRecord(f.societyId);
		expect(society.map((r) => [r.plant, r.score]).sort()).toEqual([
			['Household plant', null],
			['Plant 1', 96],
			['Plant 2', 85]
		]);
		expect(JSON.stringify(society)).not.toMatch(/remark|rosette|exhibitor/i);
	});
});
