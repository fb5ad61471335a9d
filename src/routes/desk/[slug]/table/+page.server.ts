import { requireShowRole } from '$lib/server/shows/policies';
import { loadSchedule } from '$lib/server/shows/schedule';
import { loadSocietySettings } from '$lib/server/people/society-settings';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	const { show } = await requireShowRole(event, event.params.slug, ['clerk', 'chair']);
	const [divisions, settings] = await Promise.all([
		loadSchedule(show.id),
		loadSocietySettings(show.societyId)
	]);
	return {
		show: { name: show.name, slug: show.slug },
		lengthUnit: settings.lengthUnit,
		timeZone: settings.timeZone,
		classes: divisions.flatMap((d) =>
			d.classes.map((c) => ({ value: c.id, label: `${c.code}. ${c.name}` }))
		)
	};
};
