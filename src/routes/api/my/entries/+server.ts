import { json } from '@sveltejs/kit';
import { readEntryRequest } from '$lib/server/entries/entry-api';
import { EntryRefused, enterPlant } from '$lib/server/entries/entries';
import type { RequestHandler } from './$types';
import { fieldErrorOf, refusalAnswer } from '$lib/server/http/refusals';

/** Enters a plant; 422 with every failed rule when the rules refuse it (nothing is written). */
export const POST: RequestHandler = async (event) => {
	const read = await readEntryRequest(event);
	if (read instanceof Response) return read;
	try {
		const entry = await enterPlant(read.show.id, read.user.id, read.input);
		return json({ entry: { id: entry.id, number: entry.number } }, { status: 201 });
	} catch (e) {
		if (e instanceof EntryRefused) {
			return json(
				{ message: 'This entry breaks the show’s rules.', failures: e.failures },
				{ status: 422 }
			);
		}
		const { status, body } = refusalAnswer(e, (r) => ({ errors: fieldErrorOf(r) }));
		return json(body, { status });
	}
};
