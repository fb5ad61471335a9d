/**
 * The two ways a refused rule (a `Refusal`, http/refusal.ts) becomes an answer: a form
 * action's failure and an API's JSON answer. Anything that is not a Refusal is thrown on, so an
 * unexpected error still reaches handleError.
 */
import { fail, type ActionFailure } from '@sveltejs/kit';
import { isRefusal, type Refusal } from './refusal';

/** What a form page reads from a refusal: the message and the field it concerns. */
export interface RefusedForm {
	message: string;
	field?: string;
}

/**
 * A form action's answer to a refusal: fail(status, { message, field, ...extra }), where `extra`
 * adds what the page needs to show the form again (its values, field errors). A refusal of
 * something locked after publishing (423) answers 409 on a form.
 */
export function refusedForm<E extends object = object>(
	err: unknown,
	extra?: (refusal: Refusal) => E
): ActionFailure<RefusedForm & E> {
	if (!isRefusal(err)) throw err;
	const body = { message: err.message, field: err.field, ...(extra?.(err) as E) };
	return fail(err.status === 423 ? 409 : err.status, body);
}

/** An API's answer to a refusal, as status and body: { message, ...extra }. */
export function refusalAnswer(
	err: unknown,
	extra?: (refusal: Refusal) => object
): { status: number; body: { message: string } } {
	if (!isRefusal(err)) throw err;
	return { status: err.status, body: { message: err.message, ...extra?.(err) } };
}

/** The refusal's message under the field it concerns, as the form pages show field errors. */
export function fieldErrorOf(refusal: Refusal): Record<string, string> {
	return refusal.field ? { [refusal.field]: refusal.message } : {};
}
