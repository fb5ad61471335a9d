import { requireRole, societiesWithRole } from '$lib/server/policies';
import { listShowsOfSocieties } from '$lib/server/shows/shows';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	const user = requireRole(event, ['clerk', 'chair']);
	return { shows: await listShowsOfSocieties(societiesWithRole(user, ['clerk', 'chair'])) };
};
