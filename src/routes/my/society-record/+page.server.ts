import { societyRecordFor } from '$lib/server/results/society-record';
import type { PageServerLoad } from './$types';

/** The society's own record of varieties across its published shows, for its members. */
export const load: PageServerLoad = async (event) => {
	const view = await societyRecordFor(event);
	return { ...view, top: view.entered.slice(0, 12) };
};
