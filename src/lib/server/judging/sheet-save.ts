import type { Role } from '$lib/roles';
import { sheetChangeSchema } from '$lib/schemas/judging';
import { saveSheet } from '$lib/server/judging/judging';
import { refusalAnswer } from '$lib/server/http/refusals';

/** Who may save score sheets: judges, and clerks writing down their panel's sheets. */
export const SHEET_SAVERS: readonly Role[] = ['judge', 'clerk'];

/** What the save API answers: an HTTP status and a JSON body. */
export interface SheetSaveAnswer {
	status: number;
	body: unknown;
}

/**
 * The answer to one change of a score sheet (the request's JSON, not yet checked) from a person
 * holding one of SHEET_SAVERS: 200 { status, sheet }; 400 bad input with problems; 403 not your
 * entry; 409 { current } when someone else saved first; 423 after results are published. The
 * answer of the API route (`PUT /api/judging/sheets`).
 */
export async function answerSheetChange(
	user: App.SignedInUser,
	body: unknown
): Promise<SheetSaveAnswer> {
	const parsed = sheetChangeSchema.safeParse(body);
	if (!parsed.success) {
		return {
			status: 400,
			body: {
				message: parsed.error.issues.map((i) => i.message).join(' '),
				problems: parsed.error.issues.map((i) => ({ field: i.path.join('.'), message: i.message }))
			}
		};
	}
	try {
		return { status: 200, body: await saveSheet({ id: user.id, email: user.email }, parsed.data) };
	} catch (err) {
		return refusalAnswer(err, (r) =>
			r.status === 409 && r.details
				? { current: r.details }
				: r.status === 400
					? { problems: r.details }
					: {}
		);
	}
}
