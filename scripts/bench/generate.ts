/**
 * The benchmark's shows, written straight into the benchmark database with bulk SQL.
 * - The convention show (generateShow): one society, 30 judges in 10 panels of three, 400
 *   exhibitors, 6 divisions of 10 classes (60), 2,000 checked-in entries, 6,000 complete score
 *   sheets (every judge of the panel on every entry of its classes).
 * - The busy Saturday (generateSaturday): 20 more societies, each judging a show of its own on the
 *   same day (30 judges in 10 panels, 3 divisions of 10 classes, 300 entries, 900 sheets, the
 *   second half of them still incomplete), and one more society whose show of the same size is
 *   published, for the public's results readers.
 * Every judge and chair has a database session so the load generator can send their cookies.
 * Everything is invented and generated from a fixed seed, so two runs build the same shows.
 */
import { randomBytes, randomUUID } from 'node:crypto';
import pg from 'pg';
import { createSequelize } from '../../src/lib/server/db/connection';
import { createMigrator } from '../../src/lib/server/db/migrator';

/** The size of one generated show. */
export interface ShowSize {
	entries: number;
	divisions: number;
	classesPerDivision: number;
	panels: number;
	judgesPerPanel: number;
	exhibitors: number;
	varieties: number;
}

/** The convention show. */
export const SIZE: ShowSize = {
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
	/** The chair's session, for the chair's board. */
	chairSessionToken: string;
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

/** Drops the benchmark database's schemas and migrates it afresh. */
async function resetDatabase(url: string): Promise<void> {
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
}

/** What tells one generated show from another: names, addresses, e-mails, size. */
interface ShowSpec {
	size: ShowSize;
	societyName: string;
	societySlug: string;
	showName: string;
	slug: string;
	/** Put before the people's e-mail addresses (`chair@bench.test` becomes `sat01.chair@…`). */
	emailPrefix: string;
	/** The share of entries (the last ones by number) whose sheets are still incomplete. */
	incompleteShare: number;
}

const session30Days = () => new Date(Date.now() + 30 * 86_400_000);

/** Writes one society and its show (people, classes, panels, entries, sheets, sessions). */
async function insertShow(
	client: pg.Client,
	rnd: () => number,
	spec: ShowSpec
): Promise<BenchShow> {
	const { size } = spec;
	const pick = <T>(list: T[]): T => list[Math.floor(rnd() * list.length)];
	const societyId = randomUUID();
	await client.query(`INSERT INTO societies (id, name, slug) VALUES ($1, $2, $3)`, [
		societyId,
		spec.societyName,
		spec.societySlug
	]);

	// People: a chair, the judges, the exhibitors.
	const chairId = randomUUID();
	const judgeIds = Array.from({ length: size.panels * size.judgesPerPanel }, () => randomUUID());
	const exhibitorIds = Array.from({ length: size.exhibitors }, () => randomUUID());
	const userIds = [chairId, ...judgeIds, ...exhibitorIds];
	const emails = [
		`${spec.emailPrefix}chair@bench.test`,
		...judgeIds.map(
			(_, i) => `${spec.emailPrefix}judge${String(i + 1).padStart(2, '0')}@bench.test`
		),
		...exhibitorIds.map(
			(_, i) => `${spec.emailPrefix}exhibitor${String(i + 1).padStart(3, '0')}@bench.test`
		)
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
	const varietyIds = Array.from({ length: size.varieties }, () => randomUUID());
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
	const divisionIds = Array.from({ length: size.divisions }, () => randomUUID());
	const classIds = Array.from({ length: size.divisions * size.classesPerDivision }, () =>
		randomUUID()
	);
	// Two thirds of the classes compete for best in show, a sixth for best design, the rest species.
	const designFrom = Math.round((classIds.length * 2) / 3);
	const speciesFrom = Math.round((classIds.length * 5) / 6);
	const rules = {
		system: 'merit',
		topAwards: [
			{
				id: 'best-in-show',
				name: 'Best in show',
				classIds: classIds.slice(0, designFrom),
				minScore: 90
			},
			{
				id: 'best-design',
				name: 'Best design',
				classIds: classIds.slice(designFrom, speciesFrom),
				minScore: 90
			},
			{
				id: 'best-species',
				name: 'Best species',
				classIds: classIds.slice(speciesFrom),
				minScore: 90
			}
		]
	};
	await client.query(
		`INSERT INTO shows (id, society_id, name, slug, venue, entries_open, entries_close, entry_day,
		                    judging_day, public_hours, panel_score_method, award_rules,
		                    next_entry_number, schedule_published_at)
		 VALUES ($1, $2, $3, $4, 'Convention hall (invented)',
		         '2027-03-01', '2027-04-20', '2027-04-29', '2027-04-30', 'Sat 1-5 pm, Sun 9-4',
		         'mean', $5::jsonb, $6, now())`,
		[showId, societyId, spec.showName, spec.slug, JSON.stringify(rules), size.entries + 1]
	);
	const romans = ['I', 'II', 'III', 'IV', 'V', 'VI', 'VII', 'VIII', 'IX', 'X'];
	await insertColumns(client, 'divisions', [
		['id', 'uuid', divisionIds],
		['show_id', 'uuid', divisionIds.map(() => showId)],
		['code', 'varchar', divisionIds.map((_, i) => romans[i] ?? String(i + 1))],
		['name', 'varchar', divisionIds.map((_, i) => `Division ${i + 1} (invented)`)],
		['position', 'int', divisionIds.map((_, i) => i)]
	]);
	await insertColumns(client, 'classes', [
		['id', 'uuid', classIds],
		['show_id', 'uuid', classIds.map(() => showId)],
		[
			'division_id',
			'uuid',
			classIds.map((_, i) => divisionIds[Math.floor(i / size.classesPerDivision)])
		],
		['code', 'varchar', classIds.map((_, i) => String(i + 1))],
		['name', 'varchar', classIds.map((_, i) => `Class ${i + 1}: ${pick(WORDS)} plants`)],
		['position', 'int', classIds.map((_, i) => i)],
		['scale_id', 'uuid', classIds.map(() => scaleId)]
	]);

	// Entries: spread over the classes, numbered from 1, all checked in.
	const entryIds = Array.from({ length: size.entries }, () => randomUUID());
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

	// Panels of judgesPerPanel judges, the classes dealt out among them.
	const panelIds = Array.from({ length: size.panels }, () => randomUUID());
	await insertColumns(client, 'panels', [
		['id', 'uuid', panelIds],
		['show_id', 'uuid', panelIds.map(() => showId)],
		['name', 'varchar', panelIds.map((_, i) => `Panel ${i + 1}`)]
	]);
	const panelOfJudge = judgeIds.map((_, i) => panelIds[Math.floor(i / size.judgesPerPanel)]);
	await insertColumns(client, 'panel_judges', [
		['panel_id', 'uuid', panelOfJudge],
		['user_id', 'uuid', judgeIds]
	]);
	const panelOfClass = classIds.map((_, i) => panelIds[i % size.panels]);
	await insertColumns(client, 'panel_classes', [
		['class_id', 'uuid', classIds],
		['panel_id', 'uuid', panelOfClass]
	]);

	// Score sheets: every judge of the panel on every entry of its classes; the sheets of the last
	// `incompleteShare` of the entries have only their first two criteria so far.
	const completeBelow = Math.round(entryIds.length * (1 - spec.incompleteShare));
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
			const criteria = i < completeBelow ? CRITERIA : CRITERIA.slice(0, 2);
			for (const c of criteria) deductions[c.key] = Math.floor(rnd() * 9) / 2;
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

	// A database session per judge and for the chair, as the e-mail link sign-in creates it.
	const tokens = judgeIds.map(() => randomBytes(32).toString('hex'));
	const chairToken = randomBytes(32).toString('hex');
	await insertColumns(client, 'sessions', [
		['session_token', 'varchar', [...tokens, chairToken]],
		['user_id', 'uuid', [...judgeIds, chairId]],
		['expires', 'timestamptz', [...judgeIds, chairId].map(session30Days)]
	]);

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
		slug: spec.slug,
		chairId,
		chairSessionToken: chairToken,
		classIds,
		judges,
		counts: {
			entries: entryIds.length,
			classes: classIds.length,
			judges: judgeIds.length,
			sheets: sheet.entry.length
		}
	};
}

/** Runs `write` in one transaction on a client of its own, then refreshes the planner's statistics. */
async function inTransaction<T>(url: string, write: (client: pg.Client) => Promise<T>): Promise<T> {
	const client = new pg.Client({ connectionString: url });
	await client.connect();
	try {
		await client.query('BEGIN');
		const result = await write(client);
		await client.query('COMMIT');
		await client.query('ANALYZE');
		return result;
	} catch (err) {
		await client.query('ROLLBACK').catch(() => {});
		throw err;
	} finally {
		await client.end();
	}
}

/** Drops and migrates the benchmark database, then writes the convention show into it. */
export async function generateShow(url: string): Promise<BenchShow> {
	await resetDatabase(url);
	return inTransaction(url, (client) =>
		insertShow(client, random(20261208), {
			size: SIZE,
			societyName: 'Benchmark Convention Society',
			societySlug: 'bench-convention-society',
			showName: 'Benchmark National Convention Show',
			slug: 'bench-convention-2027',
			emailPrefix: '',
			incompleteShare: 0
		})
	);
}

/** The shows of a busy Saturday: the ones being judged, and one published for the public. */
export interface BenchSaturday {
	shows: BenchShow[];
	published: BenchShow;
	counts: { shows: number; entries: number; judges: number; sheets: number; seedMs: number };
}

/**
 * Adds a busy Saturday to the benchmark database (after generateShow, or alone with `reset`):
 * `shows` societies each judging a show of their own with `judgesPerShow` judges in panels of
 * three and `entriesPerShow` entries in 30 classes, and one more society whose show of the same
 * size is then published (by the caller, through the app's own publishing).
 */
export async function generateSaturday(
	url: string,
	options: { shows: number; judgesPerShow: number; entriesPerShow: number; reset: boolean }
): Promise<BenchSaturday> {
	const started = Date.now();
	if (options.reset) await resetDatabase(url);
	const size: ShowSize = {
		entries: options.entriesPerShow,
		divisions: 3,
		classesPerDivision: 10,
		panels: Math.max(1, Math.floor(options.judgesPerShow / 3)),
		judgesPerPanel: 3,
		exhibitors: Math.max(10, Math.round(options.entriesPerShow / 5)),
		varieties: 50
	};
	const rnd = random(20261212);
	const spec = (n: number, what: string, incompleteShare: number): ShowSpec => {
		const nn = String(n).padStart(2, '0');
		return {
			size,
			societyName: `Benchmark Saturday Society ${nn}`,
			societySlug: `bench-saturday-society-${nn}`,
			showName: `Benchmark Saturday Show ${nn} (${what})`,
			slug: `bench-saturday-${nn}-2027`,
			emailPrefix: `sat${nn}.`,
			incompleteShare
		};
	};
	return inTransaction(url, async (client) => {
		const shows: BenchShow[] = [];
		for (let i = 1; i <= options.shows; i++) {
			shows.push(await insertShow(client, rnd, spec(i, 'judging', 0.5)));
		}
		const published = await insertShow(client, rnd, spec(options.shows + 1, 'published', 0));
		const all = [...shows, published];
		return {
			shows,
			published,
			counts: {
				shows: shows.length,
				entries: all.reduce((n, s) => n + s.counts.entries, 0),
				judges: all.reduce((n, s) => n + s.counts.judges, 0),
				sheets: all.reduce((n, s) => n + s.counts.sheets, 0),
				seedMs: Date.now() - started
			}
		};
	});
}
