import pg from 'pg';

/** Row count and md5 checksum of every table of the app's database, by table name. */
export type DbSnapshot = Record<string, { rows: number; md5: string }>;

export async function snapshotDb(
	client: pg.Client,
	options: { except?: readonly string[] } = {}
): Promise<DbSnapshot> {
	const tables = await client.query<{ name: string }>(
		`SELECT table_name AS name FROM information_schema.tables
		  WHERE table_schema = 'public' AND table_type = 'BASE TABLE' ORDER BY table_name`
	);
	const snapshot: DbSnapshot = {};
	for (const { name } of tables.rows) {
		if (options.except?.includes(name)) continue;
		const quoted = `"${name.replace(/"/g, '""')}"`;
		const r = await client.query<{ rows: string; md5: string | null }>(
			`SELECT count(*) AS rows, md5(coalesce(string_agg(t::text, E'\\n' ORDER BY t::text), '')) AS md5
			   FROM ${quoted} t`
		);
		snapshot[name] = { rows: Number(r.rows[0].rows), md5: r.rows[0].md5 ?? '' };
	}
	return snapshot;
}

/** The tables whose count or checksum differ between two snapshots, described. */
export function diffSnapshots(before: DbSnapshot, after: DbSnapshot): string[] {
	const names = new Set([...Object.keys(before), ...Object.keys(after)]);
	const changes: string[] = [];
	for (const name of names) {
		const a = before[name];
		const b = after[name];
		if (!a || !b || a.rows !== b.rows || a.md5 !== b.md5)
			changes.push(
				`${name}: ${a?.rows ?? '-'} rows -> ${b?.rows ?? '-'} rows${a && b && a.rows === b.rows ? ' (contents changed)' : ''}`
			);
	}
	return changes;
}
