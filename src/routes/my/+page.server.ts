import { requireRole } from '$lib/server/policies';
import { listEntriesOfExhibitor } from '$lib/server/services/shows';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	const user = requireRole(event, ['member']);
	return { entries: await listEntriesOfExhibitor(user.id) };
};
