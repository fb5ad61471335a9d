import { error } from '@sveltejs/kit';
import { requireRole } from '$lib/server/policies';
import { classOfEntry, loadJudgeClass } from '$lib/server/judging/judging';
import { isRefusal } from '$lib/server/http/refusal';
import { loadStageViewOfShow } from '$lib/server/shows/show-stage';
import type { PageServerLoad } from './$types';

/** The scoresheet of one entry, with its whole class so the judge can go on scoring offline. */
export const load: PageServerLoad = async (event) => {
	const user = requireRole(event, ['judge', 'clerk']);
	try {
		const classId = await classOfEntry(user.id, event.params.entryId);
		const judging = await loadJudgeClass(user.id, classId);
		const showStage = await loadStageViewOfShow(judging.show.id);
		return { entryId: event.params.entryId, judging, showStage };
	} catch (err) {
		if (isRefusal(err)) error(err.status, err.message);
		throw err;
	}
};
