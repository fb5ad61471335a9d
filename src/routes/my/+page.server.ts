import { requireRole, societiesWithRole } from '$lib/server/policies';
import { groupByShow, listMyEntries } from '$lib/server/results/my-results';
import { listShowsTakingEntries } from '$lib/server/shows/shows';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	const user = requireRole(event, ['member']);
	const [entries, openShows] = await Promise.all([
		listMyEntries(user.id),
		listShowsTakingEntries(societiesWithRole(user, ['member']))
	]);
	return { shows: groupByShow(entries), openShows };
};
