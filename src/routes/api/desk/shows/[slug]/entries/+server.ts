import { json } from '@sveltejs/kit';
import { entriesQuerySchema } from '$lib/schemas/desk';
import { requireShowRole } from '$lib/server/shows/policies';
import { entriesCsv, queryEntriesTable } from '$lib/server/entries/entries-table';
import type { RequestHandler } from './$types';

/**
 * The entries of a show for the chair's and clerks' table: sorted, filtered and paged by the
 * server (?sort=&dir=&q=&classId=&status=&page=&size=), or all matching rows as CSV (?format=csv).
 */
export const GET: RequestHandler = async (event) => {
	const { show } = await requireShowRole(event, event.params.slug, ['clerk', 'chair']);
	const params = Object.fromEntries(event.url.searchParams);
	const query = entriesQuerySchema.parse(params);
	if (params.format === 'csv') {
		return new Response(await entriesCsv(show.id, query), {
			headers: {
				'content-type': 'text/csv; charset=utf-8',
				'content-disposition': `attachment; filename="entries-${show.slug.replace(/[^a-z0-9-]/gi, '')}.csv"`,
				'cache-control': 'private, no-store'
			}
		});
	}
	return json(await queryEntriesTable(show.id, query));
};
