import { requireRole, societiesWithRole } from '$lib/server/policies';
import { listEntriesOfExhibitor, listShowsTakingEntries } from '$lib/server/services/shows';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	const user = requireRole(event, ['member']);
	const [entries, openShows] = await Promise.all([
		listEntriesOfExhibitor(user.id),
		listShowsTakingEntries(societiesWithRole(user, ['member']))
	]);
	return { entries, openShows };
};
