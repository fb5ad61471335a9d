import { memberAndId } from '$lib/server/plants/plant-route';
import { listPlants } from '$lib/server/plants/plants';
import { loadMemberSettings } from '$lib/server/people/society-today';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	const { user } = memberAndId(event);
	const [plants, settings] = await Promise.all([listPlants(user.id), loadMemberSettings(user)]);
	return { plants, lengthUnit: settings.lengthUnit };
};
