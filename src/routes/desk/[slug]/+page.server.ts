import { requireShowRole } from '$lib/server/policies/show';
import { findDeskEntries } from '$lib/server/services/desk';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	const { show } = await requireShowRole(event, event.params.slug, ['clerk', 'chair']);
	const q = (event.url.searchParams.get('q') ?? '').slice(0, 80);
	return {
		show: { name: show.name, slug: show.slug, entryDay: show.entryDay },
		q,
		hits: await findDeskEntries(show.id, q)
	};
};
