import { requireRole, societiesWithRole } from '$lib/server/policies';
import { listShowsOfSocieties } from '$lib/server/services/shows';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	const user = requireRole(event, ['judge']);
	const shows = await listShowsOfSocieties(societiesWithRole(user, ['judge']));
	return { shows: shows.map((s) => ({ id: s.id, name: s.name, judgingDay: s.judgingDay })) };
};
