import { randomUUID } from 'node:crypto';
import pg from 'pg';

/** A show of its own for one browser test, in the demo society, so tests never share scores. */
export interface JudgingShow {
	showId: string;
	slug: string;
	classId: string;
	otherClassId: string;
	entries: { id: string; number: number }[];
	otherEntryId: string;
	/** Names and addresses of the exhibitors, which a judge's browser must never receive. */
	exhibitorWords: string[];
}

/** Runs SQL against the database of the browser tests (DATABASE_URL, set by scripts/test.sh). */
export async function withDb<T>(work: (client: pg.Client) => Promise<T>): Promise<T> {
	const client = new pg.Client({ connectionString: process.env.DATABASE_URL });
	await client.connect();
	try {
		return await work(client);
	} finally {
		await client.end();
	}
}

/**
 * Creates a show of Larkspur Valley with class 1 (entries by exhibitor1..4, `count` of them)
 * judged by a panel of judge1 alone (or the judges given), and class 2 (one entry by exhibitor5, of judge3's
 * household) with no panel. Scores are the judge's to enter: nothing is pre-scored.
 */
export async function createJudgingShow(
	count = 4,
	options: { method?: 'mean' | 'consensus'; judges?: string[] } = {}
): Promise<JudgingShow> {
	const judges = options.judges ?? ['judge1'];
	return withDb(async (db) => {
		const one = async (sql: string, params: unknown[] = []) =>
			(await db.query(sql, params)).rows[0];
		const tag = randomUUID().slice(0, 8);
		const society = await one(`SELECT id FROM societies WHERE slug = 'larkspur-valley'`);
		const scale = await one(
			`SELECT id FROM scales WHERE society_id IS NULL ORDER BY created_at LIMIT 1`
		);
		const users = (
			await db.query(`SELECT id, email, name FROM users WHERE email = ANY($1::text[])`, [
				[
					'judge1@crownbench.test',
					'judge2@crownbench.test',
					'exhibitor1@crownbench.test',
					'exhibitor2@crownbench.test',
					'exhibitor3@crownbench.test',
					'exhibitor4@crownbench.test',
					'exhibitor5@crownbench.test'
				]
			])
		).rows as { id: string; email: string; name: string }[];
		const user = (key: string) =>
			users.find((u) => u.email.startsWith(`${key}@`)) as (typeof users)[0];
		const showId = randomUUID();
		const slug = `judging-test-${tag}`;
		await db.query(
			`INSERT INTO shows (id, society_id, name, slug, entries_open, entries_close, entry_day, judging_day,
			                    panel_score_method, award_rules, schedule_published_at, next_entry_number)
			 VALUES ($1, $2, $3, $4, current_date - 30, current_date - 5, current_date - 1, current_date,
			         $6, $5::jsonb, now(), 200)`,
			[
				showId,
				society.id,
				`Judging test show ${tag}`,
				slug,
				JSON.stringify({
					system: 'merit',
					merit: { blue: 90, red: 80, white: 70 },
					bestInClassMin: null,
					tieBreak: { criterionKey: 'condition', useJudgesChoice: true },
					sweepstakesTieBreak: 'none',
					topAwards: []
				}),
				options.method ?? 'mean'
			]
		);
		const division = randomUUID();
		await db.query(
			`INSERT INTO divisions (id, show_id, code, name, position) VALUES ($1, $2, 'I', 'Standards', 1)`,
			[division, showId]
		);
		const classId = randomUUID();
		const otherClassId = randomUUID();
		for (const [id, code, name] of [
			[classId, '1', 'Standards, any blossom'],
			[otherClassId, '2', 'Semiminiatures, any blossom']
		]) {
			await db.query(
				`INSERT INTO classes (id, show_id, division_id, code, name, position, scale_id)
				 VALUES ($1, $2, $3, $4, $5, $6, $7)`,
				[id, showId, division, code, name, Number(code), scale.id]
			);
		}
		const varieties = (
			await db.query(
				`SELECT id FROM varieties WHERE society_id = $1 AND size_class = 'standard' ORDER BY name LIMIT $2`,
				[society.id, count + 1]
			)
		).rows as { id: string }[];
		const entries: { id: string; number: number }[] = [];
		for (let i = 0; i < count; i++) {
			const id = randomUUID();
			const number = 11 + i * 3;
			await db.query(
				`INSERT INTO entries (id, show_id, class_id, exhibitor_id, variety_id, number, status)
				 VALUES ($1, $2, $3, $4, $5, $6, 'checked_in')`,
				[id, showId, classId, user(`exhibitor${(i % 4) + 1}`).id, varieties[i].id, number]
			);
			entries.push({ id, number });
		}
		const otherEntryId = randomUUID();
		await db.query(
			`INSERT INTO entries (id, show_id, class_id, exhibitor_id, variety_id, number, status)
			 VALUES ($1, $2, $3, $4, $5, 99, 'checked_in')`,
			[otherEntryId, showId, otherClassId, user('exhibitor5').id, varieties[count].id]
		);
		const panel = randomUUID();
		await db.query(`INSERT INTO panels (id, show_id, name) VALUES ($1, $2, 'Bench One')`, [
			panel,
			showId
		]);
		for (const judge of judges) {
			await db.query(`INSERT INTO panel_judges (panel_id, user_id) VALUES ($1, $2)`, [
				panel,
				user(judge).id
			]);
		}
		await db.query(`INSERT INTO panel_classes (class_id, panel_id) VALUES ($1, $2)`, [
			classId,
			panel
		]);
		const exhibitorWords = users
			.filter((u) => u.email.startsWith('exhibitor'))
			.flatMap((u) => [u.name, u.email]);
		return { showId, slug, classId, otherClassId, entries, otherEntryId, exhibitorWords };
	});
}
