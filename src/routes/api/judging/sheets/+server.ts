import { error, json } from '@sveltejs/kit';
import { requireRole } from '$lib/server/policies';
import { answerSheetChange, SHEET_SAVERS } from '$lib/server/judging/sheet-save';
import type { RequestHandler } from './$types';

/**
 * Saves one change to a score sheet (the tablet sends the whole sheet, the version it edited and
 * a change id); the answers are listed at answerSheetChange.
 */
export const PUT: RequestHandler = async (event) => {
	const user = requireRole(event, SHEET_SAVERS);
	let body: unknown;
	try {
		body = await event.request.json();
	} catch {
		error(400, 'Send the change as JSON.');
	}
	const answer = await answerSheetChange(user, body);
	return json(answer.body, { status: answer.status });
};
