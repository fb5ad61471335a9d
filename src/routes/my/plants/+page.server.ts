import { memberAndId } from '$lib/server/plant-route';
import { listPlants } from '$lib/server/services/plants';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	const { user } = memberAndId(event);
	return { plants: await listPlants(user.id) };
};
