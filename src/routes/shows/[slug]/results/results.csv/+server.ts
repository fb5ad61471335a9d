import { error } from '@sveltejs/kit';
import { buildResultsCsv, csvResponse } from '$lib/server/results/csv';
import { loadPublicResults } from '$lib/server/results/show-results';
import type { RequestHandler } from './$types';

/** Every published result as CSV (no judges' comments: those go to each exhibitor). */
export const GET: RequestHandler = async ({ params }) => {
	const found = await loadPublicResults(params.slug);
	if (!found?.results) error(404, 'These results are not published.');
	return csvResponse(
		buildResultsCsv(found.results),
		`${found.show.slug}-results.csv`,
		'public, max-age=60'
	);
};
