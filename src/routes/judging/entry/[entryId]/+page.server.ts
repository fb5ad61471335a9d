import { error } from '@sveltejs/kit';
import { requireRole } from '$lib/server/policies';
import { classOfEntry, loadJudgeClass } from '$lib/server/services/judging';
import { isRefusal } from '$lib/server/services/refusal';
import type { PageServerLoad } from './$types';

/** The scoresheet of one entry, with its whole class so the judge can go on scoring offline. */
export const load: PageServerLoad = async (event) => {
	const user = requireRole(event, ['judge', 'clerk']);
	try {
		const classId = await classOfEntry(user.id, event.params.entryId);
		return { entryId: event.params.entryId, judging: await loadJudgeClass(user.id, classId) };
	} catch (err) {
		if (isRefusal(err)) error(err.status, err.message);
		throw err;
	}
};
