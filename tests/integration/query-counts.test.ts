/**
 * No N+1 queries on lists: the services behind each list page and list API run the same number
 * of SQL statements for a show of 20 entries as for one of 200. Statements are counted through
 * the shared Sequelize instance's logging hook while the service runs.
 */
import { randomUUID } from 'node:crypto';
import { QueryTypes } from 'sequelize';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { entriesQuerySchema } from '../../src/lib/schemas/desk';
import { sequelize } from '../../src/lib/server/db';
import { entriesCsv, queryEntriesTable } from '../../src/lib/server/entries/entries-table';
import { loadPublicResults, loadShowResults } from '../../src/lib/server/results/show-results';
import {
	listJudgeAssignments,
	loadJudgeClass,
	saveSheet
} from '../../src/lib/server/judging/judging';
import {
	awardsOf,
	loadBoard,
	loadPublishedAwards,
	loadShowJudging,
	publishResults
} from '../../src/lib/server/results/results';
import { buildFixture, deductions, removeFixtures, type Fixture } from './judging-fixture';

/** Runs `work` and returns how many SQL statements it sent. */
async function countQueries(work: () => Promise<unknown>): Promise<number> {
	// Sequelize reads `options.logging` on every query; its typings leave `options` out.
	const settings = (sequelize as unknown as { options: { logging: unknown } }).options;
	const before = settings.logging;
	let count = 0;
	settings.logging = () => {
		count++;
	};
	try {
		await work();
	} finally {
		settings.logging = before;
	}
	return count;
}

/** Every entry gets a complete sheet from both judges of the panel (bulk, outside the count). */
async function scoreAll(f: Fixture): Promise<void> {
	await sequelize.query(
		`INSERT INTO score_sheets (show_id, entry_id, kind, judge_id, deductions, updated_by)
		 SELECT :showId, e.id, 'judge', j.id, CAST(:d AS jsonb), j.id
		   FROM entries e CROSS JOIN unnest(CAST(:judges AS uuid[])) AS j(id)
		  WHERE e.class_id = :classId`,
		{
			replacements: {
				showId: f.showId,
				classId: f.classId,
				judges: `{${f.judges[0].id},${f.judges[1].id}}`,
				d: JSON.stringify(deductions([1, 1, 0.5, 0, 0]))
			}
		}
	);
}

interface Counts {
	entriesTable: number;
	entriesCsv: number;
	judgeClass: number;
	judgeAssignments: number;
	board: number;
	save: number;
	showJudging: number;
	publish: number;
	publishedAwards: number;
	showResults: number;
	publicResults: number;
}

async function measure(entryCount: number): Promise<{ fixture: Fixture; counts: Counts }> {
	const f = await buildFixture({ entryCount });
	await scoreAll(f);
	const judge = f.judges[0];
	const query = entriesQuerySchema.parse({ sort: 'exhibitor', size: '100' });
	const counts = {
		entriesTable: await countQueries(() => queryEntriesTable(f.showId, query)),
		entriesCsv: await countQueries(() => entriesCsv(f.showId, query)),
		judgeClass: await countQueries(() => loadJudgeClass(judge.id, f.classId)),
		judgeAssignments: await countQueries(() => listJudgeAssignments(judge.id)),
		board: await countQueries(() => loadBoard(f.showId)),
		save: await countQueries(() =>
			saveSheet(f.judges[1], {
				changeId: randomUUID(),
				entryId: f.entries[0].id,
				baseVersion: 1,
				deductions: deductions([0, 0, 0, 0, 0]),
				comment: 'Recounted',
				notJudged: null,
				judgesChoiceRank: null
			})
		),
		showJudging: await countQueries(async () => awardsOf(await loadShowJudging(f.showId))),
		publish: await countQueries(() =>
			sequelize.transaction((transaction) =>
				publishResults({ id: judge.id }, f.showId, { transaction, allowIncomplete: true })
			)
		),
		publishedAwards: await countQueries(() => loadPublishedAwards(f.showId)),
		showResults: await countQueries(() => loadShowResults(f.showId)),
		publicResults: await countQueries(async () => {
			const [{ slug }] = await sequelize.query<{ slug: string }>(
				'SELECT slug FROM shows WHERE id = :id',
				{ replacements: { id: f.showId }, type: QueryTypes.SELECT }
			);
			return loadPublicResults(slug);
		})
	};
	return { fixture: f, counts };
}

describe('statements per list do not grow with the show (no N+1)', () => {
	let small: { fixture: Fixture; counts: Counts };
	let large: { fixture: Fixture; counts: Counts };

	beforeAll(async () => {
		small = await measure(20);
		large = await measure(200);
	});
	afterAll(removeFixtures);

	it('built the shows it compares: 20 and 200 entries in the judged class', async () => {
		const small20 = await loadJudgeClass(small.fixture.judges[0].id, small.fixture.classId);
		const large200 = await loadJudgeClass(large.fixture.judges[0].id, large.fixture.classId);
		expect(small20.entries).toHaveLength(20);
		expect(large200.entries).toHaveLength(200);
		expect(Object.values(large200.sheets).every((s) => s.version === 1)).toBe(true);
		const table = await queryEntriesTable(
			large.fixture.showId,
			entriesQuerySchema.parse({ size: '100' })
		);
		expect(table.total).toBe(201);
		expect(table.rows).toHaveLength(100);
	});

	it.each([
		['the entries table (API, a page of 100 rows)', 'entriesTable'],
		['the entries table as CSV (every row)', 'entriesCsv'],
		['the judge’s class (page and API)', 'judgeClass'],
		['the judge’s list of classes', 'judgeAssignments'],
		['the chair’s progress board', 'board'],
		['a score sheet save', 'save'],
		['the awards of the whole show', 'showJudging'],
		['publishing the results', 'publish'],
		['the published awards', 'publishedAwards'],
		['the results of the show (documents, e-mails, the page when not cached)', 'showResults'],
		['the public results page', 'publicResults']
	] as const)('%s', (_label, key) => {
		expect(small.counts[key]).toBeGreaterThan(0);
		expect(large.counts[key]).toBe(small.counts[key]);
	});
});
