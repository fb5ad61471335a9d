import { error, json } from '@sveltejs/kit';
import { sheetChangeSchema } from '$lib/schemas/judging';
import { requireRole } from '$lib/server/policies';
import { saveSheet } from '$lib/server/services/judging';
import { isRefusal } from '$lib/server/services/refusal';
import type { RequestHandler } from './$types';

/**
 * Saves one change to a score sheet (the tablet sends the whole sheet, the version it edited and
 * a change id). 200 { status, sheet }; 400 bad input with problems; 403 not your entry;
 * 409 { current } when someone else saved first; 423 after results are published.
 */
export const PUT: RequestHandler = async (event) => {
	const user = requireRole(event, ['judge', 'clerk']);
	let body: unknown;
	try {
		body = await event.request.json();
	} catch {
		error(400, 'Send the change as JSON.');
	}
	const parsed = sheetChangeSchema.safeParse(body);
	if (!parsed.success) {
		return json(
			{
				message: parsed.error.issues.map((i) => i.message).join(' '),
				problems: parsed.error.issues.map((i) => ({ field: i.path.join('.'), message: i.message }))
			},
			{ status: 400 }
		);
	}
	try {
		const result = await saveSheet({ id: user.id, email: user.email }, parsed.data);
		return json(result);
	} catch (err) {
		if (!isRefusal(err)) throw err;
		const extra =
			err.status === 409 && err.details
				? { current: err.details }
				: err.status === 400
					? { problems: err.details }
					: {};
		return json({ message: err.message, ...extra }, { status: err.status });
	}
};
