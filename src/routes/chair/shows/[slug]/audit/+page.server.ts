import { listScoreAudit } from '$lib/server/services/results';
import { requireShowRole } from '$lib/server/services/show-access';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	const { show } = await requireShowRole(event, event.params.slug, ['chair']);
	return {
		show: { name: show.name, slug: show.slug },
		changes: await listScoreAudit(show.id, 200)
	};
};
