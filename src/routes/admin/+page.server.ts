import { requireRole } from '$lib/server/policies';
import { listDuesPeriods } from '$lib/server/payments/dues';
import { listMembers } from '$lib/server/people/members';
import { chooseSociety } from '$lib/server/people/society-choice';
import { memberQuerySchema } from '$lib/schemas/members';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	const user = requireRole(event, ['admin']);
	const society = chooseSociety(user, ['admin'], event.url.searchParams.get('society'));
	const [members, periods] = await Promise.all([
		listMembers(society.societyId, memberQuerySchema.parse({ pageSize: 5 })),
		listDuesPeriods(society.societyId)
	]);
	return { society, counts: members.counts, total: members.total, periodCount: periods.length };
};
