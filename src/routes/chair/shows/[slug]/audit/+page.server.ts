import { listAuditLog } from '$lib/server/audit';
import { readAuditQuery } from '$lib/schemas/audit';
import { requireShowRole } from '$lib/server/shows/policies';
import { loadSocietySettings } from '$lib/server/people/society-settings';
import type { PageServerLoad } from './$types';

/** The show's audit log for its chair: score changes and every destructive action. */
export const load: PageServerLoad = async (event) => {
	const { show } = await requireShowRole(event, event.params.slug, ['chair']);
	const { query, ignored } = readAuditQuery(event.url.searchParams);
	const [log, settings] = await Promise.all([
		listAuditLog({ showId: show.id }, query),
		loadSocietySettings(show.societyId)
	]);
	return {
		show: { name: show.name, slug: show.slug },
		query,
		ignored,
		log,
		timeZone: settings.timeZone
	};
};
