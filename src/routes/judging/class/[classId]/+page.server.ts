import { error } from '@sveltejs/kit';
import { requireRole } from '$lib/server/policies';
import { loadJudgeClass } from '$lib/server/judging/judging';
import { isRefusal } from '$lib/server/http/refusal';
import { loadStageViewOfShow } from '$lib/server/shows/show-stage';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	const user = requireRole(event, ['judge', 'clerk']);
	try {
		const judging = await loadJudgeClass(user.id, event.params.classId);
		return { judging, showStage: await loadStageViewOfShow(judging.show.id) };
	} catch (err) {
		if (isRefusal(err)) error(err.status, err.message);
		throw err;
	}
};
