import { addCalendarDays, compareIsoDates, todayIn } from '$lib/domain/dates';
import { memberAndId } from '$lib/server/plants/plant-route';
import { listPlants, plantName } from '$lib/server/plants/plants';
import { loadMemberSettings } from '$lib/server/people/society-today';
import type { PageServerLoad } from './$types';

/** Plants got or potted this many days ago or later are ticked for labels. */
const NEW_DAYS = 30;

export const load: PageServerLoad = async (event) => {
	const { user } = memberAndId(event);
	const asked = new Set(event.url.searchParams.getAll('plant'));
	const [all, settings] = await Promise.all([listPlants(user.id), loadMemberSettings(user)]);
	const since = addCalendarDays(todayIn(settings.timeZone), -NEW_DAYS);
	const plants = all.filter((p) => !p.goneOn);
	return {
		newDays: NEW_DAYS,
		plants: plants
			.map((p) => ({
				id: p.id,
				name: plantName(p.varietyName, p.label),
				obtainedOn: p.obtainedOn,
				ticked: asked.size > 0 ? asked.has(p.id) : compareIsoDates(p.obtainedOn, since) >= 0
			}))
			.sort((a, b) => compareIsoDates(b.obtainedOn, a.obtainedOn))
	};
};
