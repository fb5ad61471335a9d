import { listAuditLog } from '$lib/server/audit';
import { readAuditQuery } from '$lib/schemas/audit';
import { requireShowRole } from '$lib/server/services/show-access';
import type { PageServerLoad } from './$types';

/** The show's audit log for its chair: score changes and every destructive action. */
export const load: PageServerLoad = async (event) => {
	const { show } = await requireShowRole(event, event.params.slug, ['chair']);
	const { query, ignored } = readAuditQuery(event.url.searchParams);
	const log = await listAuditLog({ showId: show.id }, query);
	return { show: { name: show.name, slug: show.slug }, query, ignored, log };
};
