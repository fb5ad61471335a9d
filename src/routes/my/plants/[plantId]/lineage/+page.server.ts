import { error } from '@sveltejs/kit';
import { memberAndId } from '$lib/server/plants/plant-route';
import { getLineage } from '$lib/server/plants/plants';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	const { user, id } = memberAndId(event, event.params.plantId);
	const lineage = await getLineage(user.id, id);
	if (!lineage) error(404, 'This plant does not exist.');
	return lineage;
};
