import { error } from '@sveltejs/kit';
import { loadPublicResults } from '$lib/server/results/show-results';
import type { PageServerLoad } from './$types';

/** Public results: only once the chair has published them; before that, nothing about scores. */
export const load: PageServerLoad = async ({ params }) => {
	const found = await loadPublicResults(params.slug);
	if (!found || (!found.show.schedulePublished && !found.results)) {
		error(404, 'This page does not exist.');
	}
	const { show, results } = found;
	return {
		show: {
			slug: show.slug,
			name: show.name,
			societyName: show.societyName,
			judgingDay: show.judgingDay,
			venue: show.venue
		},
		results
	};
};
