import { bestScores, levelsIn, recordByVariety, recordByYear } from '$lib/domain/record';
import { requireRole } from '$lib/server/policies';
import { loadMyRecord } from '$lib/server/results/my-results';
import type { PageServerLoad } from './$types';

/** The exhibitor's results across every published show they entered. */
export const load: PageServerLoad = async (event) => {
	const user = requireRole(event, ['member']);
	const entries = await loadMyRecord(user.id);
	return {
		levels: levelsIn(entries),
		years: recordByYear(entries),
		varieties: recordByVariety(entries),
		best: bestScores(entries, 10),
		entries: entries.length
	};
};
