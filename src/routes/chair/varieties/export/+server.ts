import { requireRole } from '$lib/server/policies';
import { chooseSociety } from '$lib/server/society-choice';
import { exportVarietiesCsv } from '$lib/server/services/varieties';
import type { RequestHandler } from './$types';

/** The society's variety registry as a CSV file, in the columns the import reads. */
export const GET: RequestHandler = async (event) => {
	const user = requireRole(event, ['chair']);
	const society = chooseSociety(user, ['chair'], event.url.searchParams.get('society'));
	requireRole(event, ['chair'], society.societyId);
	const csv = await exportVarietiesCsv(society.societyId);
	return new Response(`\uFEFF${csv}\r\n`, {
		headers: {
			'content-type': 'text/csv; charset=utf-8',
			'content-disposition': `attachment; filename="varieties-${society.societySlug.replace(/[^a-z0-9-]/gi, '')}.csv"`,
			'cache-control': 'private, no-store'
		}
	});
};
