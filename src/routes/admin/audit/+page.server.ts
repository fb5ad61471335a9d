import { requireRole } from '$lib/server/policies';
import { listAuditLog } from '$lib/server/audit';
import { readAuditQuery } from '$lib/schemas/audit';
import { chooseSociety } from '$lib/server/society-choice';
import type { PageServerLoad } from './$types';

/** The society's audit log: every destructive action and score change, newest first. */
export const load: PageServerLoad = async (event) => {
	const user = requireRole(event, ['admin']);
	const society = chooseSociety(user, ['admin'], event.url.searchParams.get('society'));
	const { query, ignored } = readAuditQuery(event.url.searchParams);
	const log = await listAuditLog({ societyId: society.societyId }, query);
	return { society, query, ignored, log };
};
