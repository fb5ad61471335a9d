import { error, redirect } from '@sveltejs/kit';
import { hasRole, requireUser } from '$lib/server/policies';
import { findShowOr404 } from '$lib/server/shows/policies';
import { entryIdByNumber } from '$lib/server/entries/entries';
import { classOfEntry } from '$lib/server/judging/judging';
import { isRefusal } from '$lib/server/http/refusal';
import type { RequestHandler } from './$types';

/**
 * Where an entry tag's QR code leads: a judge of the society to the judging page of the entry,
 * a clerk or chair to the entry at the desk, anyone else to sign-in or a refusal.
 */
/** A refusal becomes the value; anything else (the database down, say) is thrown on. */
const refusedAs =
	<T>(value: T) =>
	(err: unknown): T => {
		if (isRefusal(err)) return value;
		throw err;
	};

export const GET: RequestHandler = async (event) => {
	const user = requireUser(event);
	const show = await findShowOr404(event.params.slug);
	const number = /^[1-9]\d{0,8}$/.test(event.params.number) ? Number(event.params.number) : NaN;
	if (Number.isNaN(number)) error(404, `There is no entry ${event.params.number} in this show.`);
	if (hasRole(user, ['clerk', 'chair'], show.societyId)) {
		redirect(303, `/desk/${show.slug}/entries/${number}`);
	}
	if (hasRole(user, ['judge'], show.societyId)) {
		const entryId = await entryIdByNumber(show.id, number);
		// An entry outside the judge's classes answers as one that does not exist.
		const open =
			entryId && (await classOfEntry(user.id, entryId).then(() => true, refusedAs(false)));
		if (!entryId || !open) error(404, `There is no entry ${event.params.number} in this show.`);
		redirect(303, `/judging/entry/${entryId}`);
	}
	error(403, 'Only the show’s clerks, chair and judges can open an entry from its tag.');
};
