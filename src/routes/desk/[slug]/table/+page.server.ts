import { requireShowRole } from '$lib/server/policies/show';
import { loadSchedule } from '$lib/server/services/schedule';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	const { show } = await requireShowRole(event, event.params.slug, ['clerk', 'chair']);
	const divisions = await loadSchedule(show.id);
	return {
		show: { name: show.name, slug: show.slug },
		classes: divisions.flatMap((d) =>
			d.classes.map((c) => ({ value: c.id, label: `${c.code}. ${c.name}` }))
		)
	};
};
