/**
 * A request the rules refuse: the caller turns it into a 4xx answer with the message (and the
 * field it concerns, for forms). Thrown before anything is written, or inside the transaction so
 * that nothing is kept.
 */
export class Refusal extends Error {
	constructor(
		message: string,
		readonly status: 400 | 403 | 404 | 409 | 423 = 400,
		readonly field?: string,
		readonly details?: unknown
	) {
		super(message);
		this.name = 'Refusal';
	}
}

/** True when the error is a Refusal. */
export function isRefusal(error: unknown): error is Refusal {
	return error instanceof Refusal;
}
