import { requireShowRole } from '$lib/server/shows/policies';
import { loadStageView } from '$lib/server/shows/show-stage';
import type { LayoutServerLoad } from './$types';

/** The show's stage, shown above every page of the show. */
export const load: LayoutServerLoad = async (event) => {
	const { show } = await requireShowRole(event, event.params.slug, ['chair']);
	return { showStage: await loadStageView(show) };
};
