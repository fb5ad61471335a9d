import { requireRole } from '$lib/server/policies';
import { listAuditLog } from '$lib/server/audit';
import { readAuditQuery } from '$lib/schemas/audit';
import { chooseSociety } from '$lib/server/people/society-choice';
import { loadSocietySettings } from '$lib/server/people/society-settings';
import type { PageServerLoad } from './$types';

/** The society's audit log: every destructive action and score change, newest first. */
export const load: PageServerLoad = async (event) => {
	const user = requireRole(event, ['admin']);
	const society = chooseSociety(user, ['admin'], event.url.searchParams.get('society'));
	const { query, ignored } = readAuditQuery(event.url.searchParams);
	const [log, settings] = await Promise.all([
		listAuditLog({ societyId: society.societyId }, query),
		loadSocietySettings(society.societyId)
	]);
	return { society, query, ignored, log, timeZone: settings.timeZone };
};
