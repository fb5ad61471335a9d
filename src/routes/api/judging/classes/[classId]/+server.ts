import { error, json } from '@sveltejs/kit';
import { requireRole } from '$lib/server/policies';
import { loadJudgeClass } from '$lib/server/judging/judging';
import { isRefusal } from '$lib/server/http/refusal';
import type { RequestHandler } from './$types';

/** A class as a judge's tablet holds it: entries by number, the scale and the person's sheets. */
export const GET: RequestHandler = async (event) => {
	const user = requireRole(event, ['judge', 'clerk']);
	try {
		return json(await loadJudgeClass(user.id, event.params.classId));
	} catch (err) {
		if (isRefusal(err)) error(err.status, err.message);
		throw err;
	}
};
