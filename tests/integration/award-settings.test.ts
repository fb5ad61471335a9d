import { QueryTypes } from 'sequelize';
import { afterAll, describe, expect, it } from 'vitest';
import { PDFParse } from 'pdf-parse';
import { sequelize } from '../../src/lib/server/db';
import { saveSheet } from '../../src/lib/server/judging/judging';
import { renderAwardSheets } from '../../src/lib/server/results/documents/award-sheets';
import { awardsOf, loadShowJudging, publishResults } from '../../src/lib/server/results/results';
import { loadShowResults } from '../../src/lib/server/results/show-results';
import { buildFixture, deductions, removeFixtures, sheetChange } from './judging-fixture';

afterAll(removeFixtures);

// A show of its own with the three award settings changed from today's: placement judging with
// an honorable mention for every entry reaching the minimum, the panel's mean rounded half up
// to whole points, and one top award per plant. Place minimums 90/85/80/75 are our own values;
// the settings are common practice (see src/lib/domain/awards.test.ts for the sources found).
// Two judges score each plant; totals are 100 less the deductions on the published scale
// ("A Beginner's Guide to Judging", AVM 1993, rev. 2020 (DOMAIN.md)).
const SHEETS: [number, number, number, number, number][][] = [
	[
		[2, 2, 2, 1, 3], // 90
		[2, 2, 2, 1, 4] // 89: mean 89.5, whole points 90 (one decimal: 89.5)
	],
	[
		[3, 3, 3, 1, 2], // 88
		[3, 3, 3, 2, 2] // 87: mean 87.5 → 88
	],
	[
		[4, 4, 4, 2, 2], // 84
		[4, 4, 4, 2, 3] // 83: mean 83.5 → 84
	],
	[
		[5, 5, 5, 2, 3], // 80
		[5, 5, 5, 3, 3] // 79: mean 79.5 → 80
	],
	[
		[6, 6, 6, 3, 4], // 75
		[6, 6, 6, 3, 5] // 74: mean 74.5 → 75 (one decimal: 74.5, below the mention's 75)
	],
	[
		[7, 7, 7, 4, 5], // 70
		[7, 7, 7, 4, 5] // 70
	]
];

describe('a show with its own award settings, published', () => {
	it('stores the awards the engine gives under those settings, and prints them', async () => {
		const f = await buildFixture({ entryCount: SHEETS.length, rules: {} });
		const rules = {
			system: 'placement',
			placement: { first: 90, second: 85, third: 80, honourable: 75 },
			honorableMentions: { rule: 'all', count: 1 },
			meanRounding: 'whole',
			topAwardsPerPlant: 'one',
			topAwards: [
				{ id: 'bis', name: 'Best in show', classIds: [f.classId], minScore: 90 },
				{ id: 'std', name: 'Best standard', classIds: [f.classId], minScore: 85 }
			]
		};
		await sequelize.query('UPDATE shows SET award_rules = CAST(:rules AS jsonb) WHERE id = :id', {
			replacements: { rules: JSON.stringify(rules), id: f.showId }
		});
		for (const [i, [a, b]] of SHEETS.entries()) {
			await saveSheet(f.judges[0], sheetChange(f.entries[i].id, 0, deductions(a)));
			await saveSheet(f.judges[1], sheetChange(f.entries[i].id, 0, deductions(b)));
		}
		const judging = await loadShowJudging(f.showId);
		const scores = f.entries.map((e) => judging.entries.find((j) => j.id === e.id)?.score);
		expect(scores).toEqual([90, 88, 84, 80, 75, 70]);
		const expected = awardsOf(judging);

		await sequelize.transaction((t) =>
			publishResults(f.judges[0], f.showId, { transaction: t, allowIncomplete: true })
		);
		const stored = await sequelize.query<{
			kind: string;
			entry_id: string | null;
			level: string | null;
			top_award_id: string | null;
		}>(
			'SELECT kind, entry_id, level, top_award_id FROM awards WHERE show_id = :showId ORDER BY position',
			{ replacements: { showId: f.showId }, type: QueryTypes.SELECT }
		);
		const [e1, e2, e3, e4, e5] = f.entries.map((e) => e.id);
		const entryAwards = stored
			.filter((a) => a.kind !== 'sweepstakes')
			.map((a) => [a.kind, a.entry_id, a.level ?? a.top_award_id]);
		// Worked by hand: 90 first, 88 second, 84 third, 80 and 75 honorable mentions, 70 nothing;
		// best in class and best in show to entry 1; best standard not given, since entry 1 already
		// holds a top award and no other plant is best in its class.
		expect(entryAwards).toEqual([
			['placement', e1, 'first'],
			['placement', e2, 'second'],
			['placement', e3, 'third'],
			['placement', e4, 'honourable'],
			['placement', e5, 'honourable'],
			['best_in_class', e1, null],
			['top_award', e1, 'bis']
		]);
		// …which is what the engine gives for the show's judging.
		expect(stored.map((a) => [a.kind, a.entry_id ?? null])).toEqual(
			expected.awards.map((a) => [a.kind, a.entryId ?? null])
		);

		const results = await loadShowResults(f.showId);
		expect(results?.show.awardSettings).toEqual([
			'Honorable mentions: every entry reaching the minimum',
			'Panel score: mean of the judges, half up to whole points',
			'Top awards: one per plant, in the order listed'
		]);
		const parser = new PDFParse({
			data: new Uint8Array(await renderAwardSheets(results!, 'letter'))
		});
		const text = (await parser.getText()).text.replace(/\s+/g, ' ');
		await parser.destroy();
		expect(text).toContain(
			'Settings used: Honorable mentions: every entry reaching the minimum; Panel score: mean of the judges, half up to whole points; Top awards: one per plant, in the order listed.'
		);
	}, 60_000);

	it('keeps today’s rounding for a show whose rules predate the settings', async () => {
		// Rules stored without the new settings: one decimal, as before (89.5 stays 89.5)
		const f = await buildFixture({ entryCount: 1, rules: { system: 'merit' } });
		const [a, b] = SHEETS[0];
		await saveSheet(f.judges[0], sheetChange(f.entries[0].id, 0, deductions(a)));
		await saveSheet(f.judges[1], sheetChange(f.entries[0].id, 0, deductions(b)));
		const judging = await loadShowJudging(f.showId);
		expect(judging.entries.find((e) => e.id === f.entries[0].id)?.score).toBe(89.5);
		expect(judging.rules).toMatchObject({
			honorableMentions: { rule: 'one', count: 1 },
			meanRounding: 'tenth',
			topAwardsPerPlant: 'several'
		});
		// Merit marks blue 90, red 80: national handbook, from memory (DOMAIN.md)
		expect(awardsOf(judging).awards.find((x) => x.kind === 'ribbon')?.level).toBe('red');
	});
});
