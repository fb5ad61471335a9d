import { loadBoard } from '$lib/server/results/results';
import { requireShowRole } from '$lib/server/shows/policies';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	const { show } = await requireShowRole(event, event.params.slug, ['chair']);
	return { show: { name: show.name, slug: show.slug }, board: await loadBoard(show.id) };
};
