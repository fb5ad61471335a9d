import pg from 'pg';

/** Values for route params, looked up in the demo seed of the e2e database. */
export async function loadParams(): Promise<Record<string, string>> {
	const client = new pg.Client({ connectionString: process.env.DATABASE_URL });
	await client.connect();
	try {
		const show = await client.query<{ slug: string; id: string; society_id: string }>(
			`SELECT s.slug, s.id, s.society_id FROM shows s JOIN societies so ON so.id = s.society_id
			  WHERE so.slug = 'larkspur-valley' ORDER BY s.judging_day DESC LIMIT 1`
		);
		// An entry in a class that judge1's panel judges (demo seed: panel A, clerk@ as its clerk).
		const entry = await client.query<{ id: string; number: number; class_id: string }>(
			`SELECT e.id, e.number, e.class_id FROM entries e
			   JOIN panel_classes pc ON pc.class_id = e.class_id
			   JOIN panel_judges pj ON pj.panel_id = pc.panel_id
			   JOIN users u ON u.id = pj.user_id AND u.email = 'judge1@crownbench.test'
			  WHERE e.show_id = $1 ORDER BY e.number LIMIT 1`,
			[show.rows[0].id]
		);
		const plant = await client.query<{ id: string }>(
			`SELECT p.id FROM plants p JOIN users u ON u.id = p.owner_id
			  WHERE u.email = 'member@crownbench.test' ORDER BY p.obtained_on, p.id LIMIT 1`
		);
		const mine = await client.query<{ id: string }>(
			`SELECT e.id FROM entries e JOIN users u ON u.id = e.exhibitor_id
			  WHERE u.email = 'member@crownbench.test' AND e.show_id = $1 ORDER BY e.number LIMIT 1`,
			[show.rows[0].id]
		);
		return {
			memberEntryId: mine.rows[0].id,
			societyId: show.rows[0].society_id,
			plantId: plant.rows[0].id,
			slug: show.rows[0].slug,
			showId: show.rows[0].id,
			entryId: entry.rows[0].id,
			classId: entry.rows[0].class_id,
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
