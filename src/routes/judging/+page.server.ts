import { requireRole } from '$lib/server/policies';
import { listJudgeAssignments } from '$lib/server/judging/judging';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	const user = requireRole(event, ['judge', 'clerk']);
	return { assignments: await listJudgeAssignments(user.id) };
};
