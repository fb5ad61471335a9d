import { json } from '@sveltejs/kit';
import { z } from 'zod';
import { requireRole } from '$lib/server/policies';
import { chooseSociety } from '$lib/server/people/society-choice';
import { exportVarietiesCsv } from '$lib/server/plants/varieties';
import type { RequestHandler } from './$types';

const query = z.object({
	society: z
		.string()
		.regex(
			/^[a-z0-9-]{1,80}$/,
			'Say which society’s registry to download (?society=its-short-name).'
		)
});

/** The society's variety registry as a CSV file (?society=slug), in the columns the import reads. */
export const GET: RequestHandler = async (event) => {
	const user = requireRole(event, ['chair']);
	const params = event.url.searchParams;
	const parsed = query.safeParse({ society: params.get('society') ?? '' });
	if (!parsed.success || params.getAll('society').length > 1) {
		const message = parsed.success ? 'Name one society.' : parsed.error.issues[0].message;
		return json({ message }, { status: 400 });
	}
	const society = chooseSociety(user, ['chair'], parsed.data.society);
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
