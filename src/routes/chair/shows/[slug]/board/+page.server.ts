import { loadBoard } from '$lib/server/services/results';
import { requireShowRole } from '$lib/server/policies/show';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	const { show } = await requireShowRole(event, event.params.slug, ['chair']);
	return { show: { name: show.name, slug: show.slug }, board: await loadBoard(show.id) };
};
