import { randomUUID } from 'node:crypto';
import { QueryTypes } from 'sequelize';
import type { SheetChange } from '../../src/lib/schemas/judging';
import { sequelize } from '../../src/lib/server/db';

/** The published scale: 25/25/25/15/10 = 100 ("A Beginner's Guide to Judging", AVM 1993, rev. 2020 (DOMAIN.md)). */
export const PUBLISHED_CRITERIA = [
	{ key: 'symmetry', label: 'Symmetry or leaf pattern', maxPoints: 25 },
	{ key: 'condition', label: 'Condition', maxPoints: 25 },
	{ key: 'quantity_of_bloom', label: 'Quantity of bloom', maxPoints: 25 },
	{ key: 'size_and_type_of_blossom', label: 'Size and type of blossom', maxPoints: 15 },
	{ key: 'color_of_blossom', label: 'Color of blossom', maxPoints: 10 }
];

export interface Fixture {
	societyId: string;
	showId: string;
	classId: string;
	otherClassId: string;
	panelId: string;
	judges: { id: string; email: string }[];
	clerk: { id: string; email: string };
	exhibitors: { id: string; email: string; name: string }[];
	entries: { id: string; number: number }[];
	otherEntry: string;
}

const created = { societies: [] as string[], users: [] as string[] };

/** Deletes every society and person the fixtures made (the other tests expect only the demo seed). */
export async function removeFixtures(): Promise<void> {
	if (created.societies.length > 0) {
		await run('DELETE FROM societies WHERE id IN (:ids)', { ids: created.societies });
	}
	if (created.users.length > 0) {
		await run('DELETE FROM users WHERE id IN (:ids)', { ids: created.users });
	}
	created.societies = [];
	created.users = [];
}

async function run(sql: string, replacements: Record<string, unknown>): Promise<void> {
	await sequelize.query(sql, { replacements });
}

/**
 * A society of its own with three judges, a clerk and three exhibitors (one in the household of
 * judge 3), a show with one class of `entryCount` entries judged by a panel of judges 1 and 2,
 * and a second class outside the panel. Invented people; nothing shared with the demo seed.
 */
export async function buildFixture(
	options: { method?: 'mean' | 'consensus'; entryCount?: number; rules?: object } = {}
): Promise<Fixture> {
	const tag = randomUUID().slice(0, 8);
	const societyId = randomUUID();
	created.societies.push(societyId);
	await run(`INSERT INTO societies (id, name, slug) VALUES (:id, :name, :slug)`, {
		id: societyId,
		name: `Test society ${tag}`,
		slug: `test-${tag}`
	});
	const person = async (key: string, roles: string[], household: string | null, name?: string) => {
		const id = randomUUID();
		created.users.push(id);
		const email = `${key}-${tag}@judging.test`;
		await run(`INSERT INTO users (id, name, email) VALUES (:id, :name, :email)`, {
			id,
			name: name ?? `${key} ${tag}`,
			email
		});
		await run(
			`INSERT INTO memberships (society_id, user_id, roles, household)
			 VALUES (:societyId, :id, CAST(:roles AS varchar(16)[]), :household)`,
			{ societyId, id, roles: `{${roles.join(',')}}`, household }
		);
		return { id, email, name: name ?? `${key} ${tag}` };
	};
	const judges = [
		await person('judge1', ['judge'], null),
		await person('judge2', ['judge'], 'Quillfeather'),
		await person('judge3', ['judge'], 'Marrowgate')
	];
	const clerk = await person('clerk', ['clerk'], null);
	const exhibitors = [
		await person('ex1', ['member'], 'Thornbury', `Ottoline Thornbury ${tag}`),
		await person('ex2', ['member'], 'Ashgrove', `Cassius Ashgrove ${tag}`),
		await person('ex3', ['member'], 'Marrowgate', `Perpetua Marrowgate ${tag}`)
	];
	const scaleId = randomUUID();
	await run(
		`INSERT INTO scales (id, society_id, name, criteria) VALUES (:id, :s, 'Published', CAST(:c AS jsonb))`,
		{
			id: scaleId,
			s: societyId,
			c: JSON.stringify(PUBLISHED_CRITERIA)
		}
	);
	const showId = randomUUID();
	await run(
		`INSERT INTO shows (id, society_id, name, slug, entries_open, entries_close, entry_day, judging_day,
		                    panel_score_method, award_rules, schedule_published_at)
		 VALUES (:id, :s, :name, :slug, '2026-01-01', '2026-02-01', '2026-02-10', '2026-02-11', :method,
		         CAST(:rules AS jsonb), now())`,
		{
			id: showId,
			s: societyId,
			name: `Show ${tag}`,
			slug: `show-${tag}`,
			method: options.method ?? 'mean',
			rules: JSON.stringify(options.rules ?? {})
		}
	);
	const divisionId = randomUUID();
	await run(
		`INSERT INTO divisions (id, show_id, code, name) VALUES (:id, :showId, 'I', 'Standards')`,
		{
			id: divisionId,
			showId
		}
	);
	const classId = randomUUID();
	const otherClassId = randomUUID();
	for (const [id, code] of [
		[classId, '1'],
		[otherClassId, '2']
	]) {
		await run(
			`INSERT INTO classes (id, show_id, division_id, code, name, scale_id, position)
			 VALUES (:id, :showId, :divisionId, :code, :name, :scaleId, :position)`,
			{ id, showId, divisionId, code, name: `Class ${code}`, scaleId, position: Number(code) }
		);
	}
	const entries: { id: string; number: number }[] = [];
	const count = options.entryCount ?? 3;
	for (let i = 0; i < count; i++) {
		const id = randomUUID();
		await run(
			`INSERT INTO entries (id, show_id, class_id, exhibitor_id, title, number, status)
			 VALUES (:id, :showId, :classId, :ex, :title, :number, 'checked_in')`,
			{ id, showId, classId, ex: exhibitors[i % 2].id, title: `Plant ${i + 1}`, number: i + 1 }
		);
		entries.push({ id, number: i + 1 });
	}
	const otherEntry = randomUUID();
	await run(
		`INSERT INTO entries (id, show_id, class_id, exhibitor_id, title, number, status)
		 VALUES (:id, :showId, :classId, :ex, 'Household plant', :number, 'checked_in')`,
		{ id: otherEntry, showId, classId: otherClassId, ex: exhibitors[2].id, number: count + 100 }
	);
	const panelId = randomUUID();
	await run(
		`INSERT INTO panels (id, show_id, name, clerk_id) VALUES (:id, :showId, 'Panel 1', :clerk)`,
		{
			id: panelId,
			showId,
			clerk: clerk.id
		}
	);
	for (const j of judges.slice(0, 2)) {
		await run(`INSERT INTO panel_judges (panel_id, user_id) VALUES (:panelId, :userId)`, {
			panelId,
			userId: j.id
		});
	}
	await run(`INSERT INTO panel_classes (class_id, panel_id) VALUES (:classId, :panelId)`, {
		classId,
		panelId
	});
	return {
		societyId,
		showId,
		classId,
		otherClassId,
		panelId,
		judges,
		clerk,
		exhibitors,
		entries,
		otherEntry
	};
}

/** A change of an entry's sheet as a tablet sends it, with a new change id. */
export function sheetChange(
	entryId: string,
	baseVersion: number,
	d: Record<string, unknown>
): SheetChange {
	return {
		changeId: randomUUID(),
		entryId,
		baseVersion,
		deductions: d,
		comment: '',
		notJudged: null,
		judgesChoiceRank: null
	};
}

/** The versions of an entry's score sheets (one per sheet), lowest first. */
export async function sheetVersion(entryId: string): Promise<number[]> {
	const rows = await sequelize.query<{ version: number }>(
		'SELECT version FROM score_sheets WHERE entry_id = :entryId ORDER BY version',
		{ replacements: { entryId }, type: QueryTypes.SELECT }
	);
	return rows.map((r) => r.version);
}

/** Counts rows of a table for a show. */
export async function countFor(table: string, showId: string): Promise<number> {
	const [row] = await sequelize.query<{ n: string }>(
		`SELECT count(*) AS n FROM ${table} WHERE show_id = :showId`,
		{
			replacements: { showId },
			type: QueryTypes.SELECT
		}
	);
	return Number(row.n);
}

/** Deductions in the published scale's order. */
export function deductions(d: [number, number, number, number, number]): Record<string, number> {
	return Object.fromEntries(PUBLISHED_CRITERIA.map((c, i) => [c.key, d[i]]));
}
