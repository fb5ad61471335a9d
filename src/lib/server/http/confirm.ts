import { fail, type ActionFailure, type RequestEvent } from '@sveltejs/kit';

/** The form field a destructive action needs, with the value `yes`, before it does anything. */
export const CONFIRM_FIELD = 'confirm';

/** What a refused, unconfirmed request answers: the question, and the form to send again. */
export interface ConfirmNeeded {
	message: string;
	confirm: { question: string; action: string; fields: [string, string][] };
}

/** True when the form carries exactly one `confirm=yes`. */
export function isConfirmed(form: FormData): boolean {
	const values = form.getAll(CONFIRM_FIELD);
	return values.length === 1 && values[0] === 'yes';
}

/**
 * Refuses a destructive action that was not confirmed: fail(400) with the question and the form's
 * own text fields, so the page (without JavaScript: the layout's fallback) can ask and send the
 * same form again with `confirm=yes`. Returns null when the form is confirmed. Call it after the
 * input is checked and before anything is written.
 */
export function requireConfirmation(
	event: Pick<RequestEvent, 'url'>,
	form: FormData,
	question: string
): ActionFailure<ConfirmNeeded> | null {
	if (isConfirmed(form)) return null;
	const fields: [string, string][] = [];
	for (const [name, value] of form) {
		if (name === CONFIRM_FIELD || typeof value !== 'string') continue;
		if (fields.length < 20 && name.length <= 40 && value.length <= 500) fields.push([name, value]);
	}
	const search = /^\?\/[A-Za-z]{1,40}$/.test(event.url.search) ? event.url.search : '';
	return fail(400, {
		message: `${question} Nothing has changed yet: confirm to go ahead.`,
		confirm: { question, action: `${event.url.pathname}${search}`, fields }
	});
}
