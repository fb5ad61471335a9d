import { json } from '@sveltejs/kit';
import { readEntryRequest } from '$lib/server/entries/entry-api';
import { previewEntry } from '$lib/server/entries/entries';
import type { RequestHandler } from './$types';
import { fieldErrorOf, refusalAnswer } from '$lib/server/http/refusals';

/** Whether an entry would fit its class, and every reason why not; writes nothing. */
export const POST: RequestHandler = async (event) => {
	const read = await readEntryRequest(event);
	if (read instanceof Response) return read;
	try {
		return json(await previewEntry(read.show, read.user.id, read.input));
	} catch (e) {
		const { status, body } = refusalAnswer(e, (r) => ({ errors: fieldErrorOf(r) }));
		return json(body, { status });
	}
};
