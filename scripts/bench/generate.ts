/**
 * The benchmark's convention show, written straight into the benchmark database with bulk SQL:
 * one society, 30 judges in 10 panels of three, 400 exhibitors, 6 divisions of 10 classes (60),
 * 2,000 checked-in entries, 6,000 complete score sheets (every judge of the panel on every entry
 * of its classes), and a database session per judge so the load generator can send their cookies.
 * Everything is invented and generated from a fixed seed, so two runs build the same show.
 */
import { randomBytes, randomUUID } from 'node:crypto';
import pg from 'pg';
import { createSequelize } from '../../src/lib/server/db/connection';
import { createMigrator } from '../../src/lib/server/db/migrator';

export const SIZE = {
	entries: 2000,
	divisions: 6,
	classesPerDivision: 10,
	panels: 10,
	judgesPerPanel: 3,
	exhibitors: 400,
	varieties: 300
};

/** The published scale: 25/25/25/15/10 ("A Beginner's Guide to Judging", AVM 1993, rev. 2020). */
export const CRITERIA = [
	{ key: 'symmetry', label: 'Symmetry or leaf pattern', maxPoints: 25 },
	{ key: 'condition', label: 'Condition', maxPoints: 25 },
	{ key: 'quantity_of_bloom', label: 'Quantity of bloom', maxPoints: 25 },
	{ key: 'size_and_type_of_blossom', label: 'Size and type of blossom', maxPoints: 15 },
	{ key: 'color_of_blossom', label: 'Color of blossom', maxPoints: 10 }
];

export interface BenchJudge {
	id: string;
	email: string;
	sessionToken: string;
	/** The entries of the judge's panel, in order of number. */
	entryIds: string[];
	/** The first class of the judge's panel (for the page-size measurement). */
	firstClassId: string;
}

export interface BenchShow {
	societyId: string;
	showId: string;
	slug: string;
	chairId: string;
	classIds: string[];
	judges: BenchJudge[];
	counts: { entries: number; classes: number; judges: number; sheets: number };
}

/** A small seeded generator (mulberry32): the same show on every run. */
function random(seed: number): () => number {
	let a = seed >>> 0;
	return () => {
		a = (a + 0x6d2b79f5) >>> 0;
		let t = a;
		t = Math.imul(t ^ (t >>> 15), t | 1);
		t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
		return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
	};
}

const FIRST = [
	'Aurelia',
	'Bram',
	'Celestine',
	'Dorian',
	'Elspeth',
	'Fennick',
	'Griselda',
	'Hollis'
];
const LAST = ['Quillby', 'Marrowfield', 'Thistlewood', 'Pennymere', 'Ashcombe', 'Larkspur'];
const WORDS = ['Velvet', 'Moonlit', 'Frosted', 'Ruby', 'Harbor', 'Lilac', 'Ember', 'Silver'];
const NOUNS = ['Cascade', 'Whisper', 'Lantern', 'Meadow', 'Promise', 'Tide', 'Sparrow', 'Crown'];

/** Inserts rows column-wise with unnest: one statement per table. */
async function insertColumns(
	client: pg.Client,
	table: string,
	columns: [name: string, type: string, values: unknown[]][]
): Promise<void> {
	const names = columns.map((c) => c[0]).join(', ');
	const unnest = columns.map((c, i) => `$${i + 1}::${c[1]}[]`).join(', ');
	await client.query(
		`INSERT INTO ${table} (${names}) SELECT * FROM unnest(${unnest})`,
		columns.map((c) => c[2])
	);
}

/** Drops and migrates the benchmark database, then writes the convention show into it. */
export async function generateShow(url: string): Promise<BenchShow> {
	if (!/bench/.test(new URL(url).pathname)) {
		throw new Error(`The benchmark only writes to a database whose name contains "bench": ${url}`);
	}
	const sequelize = createSequelize(url);
	try {
		await sequelize.query(
			'DROP SCHEMA IF EXISTS pgboss CASCADE; DROP SCHEMA public CASCADE; CREATE SCHEMA public;'
		);
		await createMigrator(sequelize).up();
	} finally {
		await sequelize.close();
	}

	const rnd = random(20261208);
	const pick = <T>(list: T[]): T => list[Math.floor(rnd() * list.length)];
	const client = new pg.Client({ connectionString: url });
	await client.connect();
	try {
		await client.query('BEGIN');
		const societyId = randomUUID();
		await client.query(`INSERT INTO societies (id, name, slug) VALUES ($1, $2, $3)`, [
			societyId,
			'Benchmark Convention Society',
			'bench-convention-society'
		]);

		// People: a chair, 30 judges, 400 exhibitors.
		const chairId = randomUUID();
		const judgeIds = Array.from({ length: SIZE.panels * SIZE.judgesPerPanel }, () => randomUUID());
		const exhibitorIds = Array.from({ length: SIZE.exhibitors }, () => randomUUID());
		const userIds = [chairId, ...judgeIds, ...exhibitorIds];
		const emails = [
			'chair@bench.test',
			...judgeIds.map((_, i) => `judge${String(i + 1).padStart(2, '0')}@bench.test`),
			...exhibitorIds.map((_, i) => `exhibitor${String(i + 1).padStart(3, '0')}@bench.test`)
		];
		const names = userIds.map(() => `${pick(FIRST)} ${pick(LAST)}`);
		await insertColumns(client, 'users', [
			['id', 'uuid', userIds],
			['email', 'varchar', emails],
			['name', 'varchar', names]
		]);
		const roles = userIds.map((_, i) =>
			i === 0 ? '{chair,admin}' : i <= judgeIds.length ? '{judge,member}' : '{member}'
		);
		await client.query(
			`INSERT INTO memberships (society_id, user_id, roles, dues_paid_through)
			 SELECT $1, u, CAST(r AS varchar(16)[]), DATE '2030-12-31' FROM unnest($2::uuid[], $3::text[]) AS t(u, r)`,
			[societyId, userIds, roles]
		);

		// Varieties and the scale.
		const varietyIds = Array.from({ length: SIZE.varieties }, () => randomUUID());
		await insertColumns(client, 'varieties', [
			['id', 'uuid', varietyIds],
			['society_id', 'uuid', varietyIds.map(() => societyId)],
			['name', 'varchar', varietyIds.map((_, i) => `Bench ${pick(WORDS)} ${pick(NOUNS)} ${i + 1}`)],
			['habit', 'varchar', varietyIds.map(() => 'single_crown')],
			['size_class', 'varchar', varietyIds.map(() => pick(['standard', 'semiminiature']))],
			['blossom_type', 'varchar', varietyIds.map(() => pick(['single', 'double', 'semidouble']))]
		]);
		const scaleId = randomUUID();
		await client.query(
			`INSERT INTO scales (id, society_id, name, criteria) VALUES ($1, $2, 'Published scale', $3::jsonb)`,
			[scaleId, societyId, JSON.stringify(CRITERIA)]
		);

		// The show, its divisions and classes.
		const showId = randomUUID();
		const slug = 'bench-convention-2027';
		const divisionIds = Array.from({ length: SIZE.divisions }, () => randomUUID());
		const classIds = Array.from({ length: SIZE.divisions * SIZE.classesPerDivision }, () =>
			randomUUID()
		);
		const rules = {
			system: 'merit',
			topAwards: [
				{ id: 'best-in-show', name: 'Best in show', classIds: classIds.slice(0, 40), minScore: 90 },
				{
					id: 'best-design',
					name: 'Best design',
					classIds: classIds.slice(40, 50),
					minScore: 90
				},
				{ id: 'best-species', name: 'Best species', classIds: classIds.slice(50), minScore: 90 }
			]
		};
		await client.query(
			`INSERT INTO shows (id, society_id, name, slug, venue, entries_open, entries_close, entry_day,
			                    judging_day, public_hours, panel_score_method, award_rules,
			                    next_entry_number, schedule_published_at)
			 VALUES ($1, $2, 'Benchmark National Convention Show', $3, 'Convention hall (invented)',
			         '2027-03-01', '2027-04-20', '2027-04-29', '2027-04-30', 'Sat 1-5 pm, Sun 9-4',
			         'mean', $4::jsonb, $5, now())`,
			[showId, societyId, slug, JSON.stringify(rules), SIZE.entries + 1]
		);
		await insertColumns(client, 'divisions', [
			['id', 'uuid', divisionIds],
			['show_id', 'uuid', divisionIds.map(() => showId)],
			['code', 'varchar', divisionIds.map((_, i) => ['I', 'II', 'III', 'IV', 'V', 'VI'][i])],
			['name', 'varchar', divisionIds.map((_, i) => `Division ${i + 1} (invented)`)],
			['position', 'int', divisionIds.map((_, i) => i)]
		]);
		await insertColumns(client, 'classes', [
			['id', 'uuid', classIds],
			['show_id', 'uuid', classIds.map(() => showId)],
			[
				'division_id',
				'uuid',
				classIds.map((_, i) => divisionIds[Math.floor(i / SIZE.classesPerDivision)])
			],
			['code', 'varchar', classIds.map((_, i) => String(i + 1))],
			['name', 'varchar', classIds.map((_, i) => `Class ${i + 1}: ${pick(WORDS)} plants`)],
			['position', 'int', classIds.map((_, i) => i)],
			['scale_id', 'uuid', classIds.map(() => scaleId)]
		]);

		// Entries: spread over the classes, numbered 1..2000, all checked in.
		const entryIds = Array.from({ length: SIZE.entries }, () => randomUUID());
		const entryClass = entryIds.map((_, i) => classIds[i % classIds.length]);
		await insertColumns(client, 'entries', [
			['id', 'uuid', entryIds],
			['show_id', 'uuid', entryIds.map(() => showId)],
			['class_id', 'uuid', entryClass],
			['exhibitor_id', 'uuid', entryIds.map(() => pick(exhibitorIds))],
			['variety_id', 'uuid', entryIds.map(() => pick(varietyIds))],
			['number', 'int', entryIds.map((_, i) => i + 1)],
			['status', 'varchar', entryIds.map(() => 'checked_in')],
			['checked_in_at', 'timestamptz', entryIds.map(() => new Date('2027-04-29T10:00:00Z'))]
		]);

		// Panels: 10 of three judges, six classes each.
		const panelIds = Array.from({ length: SIZE.panels }, () => randomUUID());
		await insertColumns(client, 'panels', [
			['id', 'uuid', panelIds],
			['show_id', 'uuid', panelIds.map(() => showId)],
			['name', 'varchar', panelIds.map((_, i) => `Panel ${i + 1}`)]
		]);
		const panelOfJudge = judgeIds.map((_, i) => panelIds[Math.floor(i / SIZE.judgesPerPanel)]);
		await insertColumns(client, 'panel_judges', [
			['panel_id', 'uuid', panelOfJudge],
			['user_id', 'uuid', judgeIds]
		]);
		const panelOfClass = classIds.map((_, i) => panelIds[i % SIZE.panels]);
		await insertColumns(client, 'panel_classes', [
			['class_id', 'uuid', classIds],
			['panel_id', 'uuid', panelOfClass]
		]);

		// Score sheets: every judge of the panel on every entry of its classes, complete.
		const panelByClass = new Map(classIds.map((c, i) => [c, panelOfClass[i]]));
		const judgesByPanel = new Map<string, string[]>();
		judgeIds.forEach((j, i) =>
			judgesByPanel.set(panelOfJudge[i], [...(judgesByPanel.get(panelOfJudge[i]) ?? []), j])
		);
		const sheet = { entry: [] as string[], judge: [] as string[], deductions: [] as string[] };
		const entriesOfJudge = new Map<string, string[]>(judgeIds.map((j) => [j, []]));
		entryIds.forEach((e, i) => {
			for (const j of judgesByPanel.get(panelByClass.get(entryClass[i])!)!) {
				const deductions: Record<string, number> = {};
				for (const c of CRITERIA) deductions[c.key] = Math.floor(rnd() * 9) / 2;
				sheet.entry.push(e);
				sheet.judge.push(j);
				sheet.deductions.push(JSON.stringify(deductions));
				entriesOfJudge.get(j)!.push(e);
			}
		});
		await insertColumns(client, 'score_sheets', [
			['show_id', 'uuid', sheet.entry.map(() => showId)],
			['entry_id', 'uuid', sheet.entry],
			['kind', 'varchar', sheet.entry.map(() => 'judge')],
			['judge_id', 'uuid', sheet.judge],
			['deductions', 'jsonb', sheet.deductions],
			['updated_by', 'uuid', sheet.judge]
		]);

		// A database session per judge, as the e-mail link sign-in creates it (30 days).
		const tokens = judgeIds.map(() => randomBytes(32).toString('hex'));
		await insertColumns(client, 'sessions', [
			['session_token', 'varchar', tokens],
			['user_id', 'uuid', judgeIds],
			['expires', 'timestamptz', judgeIds.map(() => new Date(Date.now() + 30 * 86_400_000))]
		]);
		await client.query('COMMIT');
		await client.query('ANALYZE');

		const judges: BenchJudge[] = judgeIds.map((id, i) => ({
			id,
			email: emails[i + 1],
			sessionToken: tokens[i],
			entryIds: entriesOfJudge.get(id)!,
			firstClassId: classIds[panelIds.indexOf(panelOfJudge[i])]
		}));
		return {
			societyId,
			showId,
			slug,
			chairId,
			classIds,
			judges,
			counts: {
				entries: entryIds.length,
				classes: classIds.length,
				judges: judgeIds.length,
				sheets: sheet.entry.length
			}
		};
	} catch (err) {
		await client.query('ROLLBACK').catch(() => {});
		throw err;
	} finally {
		await client.end();
	}
}
