import { requireRole } from '$lib/server/policies';
import { listJudgingPagesToKeep } from '$lib/server/judging/judging';
import { PERSON_HEADER } from '$lib/judging/tablet-names';
import type { LayoutServerLoad } from './$types';

/**
 * Whose judging pages these are (the service worker keeps them per person, by this header) and
 * which pages the tablet keeps for working offline.
 */
export const load: LayoutServerLoad = async (event) => {
	const user = requireRole(event, ['judge', 'clerk']);
	event.setHeaders({ [PERSON_HEADER]: user.id });
	return { person: user.id, keep: await listJudgingPagesToKeep(user.id) };
};
