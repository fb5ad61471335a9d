import { json } from '@sveltejs/kit';
import { readEntryRequest } from '$lib/server/entries/entry-api';
import { EntryInputProblem, previewEntry } from '$lib/server/entries/entries';
import type { RequestHandler } from './$types';

/** Whether an entry would fit its class, and every reason why not; writes nothing. */
export const POST: RequestHandler = async (event) => {
	const read = await readEntryRequest(event);
	if (read instanceof Response) return read;
	try {
		return json(await previewEntry(read.show, read.user.id, read.input));
	} catch (e) {
		if (!(e instanceof EntryInputProblem)) throw e;
		return json({ message: e.message, errors: { [e.field]: e.message } }, { status: 400 });
	}
};
