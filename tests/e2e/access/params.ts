import pg from 'pg';

/** Values for route params, looked up in the demo seed of the e2e database. */
export async function loadParams(): Promise<Record<string, string>> {
	const client = new pg.Client({ connectionString: process.env.DATABASE_URL });
	await client.connect();
	try {
		const show = await client.query<{ slug: string; id: string }>(
			`SELECT s.slug, s.id FROM shows s JOIN societies so ON so.id = s.society_id
			  WHERE so.slug = 'larkspur-valley' ORDER BY s.judging_day DESC LIMIT 1`
		);
		const entry = await client.query<{ id: string; number: number }>(
			`SELECT id, number FROM entries WHERE show_id = $1 ORDER BY number LIMIT 1`,
			[show.rows[0].id]
		);
		return {
			slug: show.rows[0].slug,
			showId: show.rows[0].id,
			entryId: entry.rows[0].id,
			number: String(entry.rows[0].number)
		};
	} finally {
		await client.end();
	}
}

/** Fills a route id's [params] from the values; fails loudly on a param with no value. */
export function fillRoute(route: string, values: Record<string, string>): string {
	return route.replace(/\[(?:\.\.\.)?([^\]=]+)(?:=[^\]]+)?\]/g, (_, name: string) => {
		const value = values[name];
		if (value === undefined)
			throw new Error(`no value for [${name}] in ${route}: add one to params.ts or the row`);
		return encodeURIComponent(value);
	});
}
