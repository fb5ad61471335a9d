import { json, type RequestEvent } from '@sveltejs/kit';
import { entryRequestSchema, type EntryRequest } from '$lib/schemas/entry';
import { fieldErrors } from '../http/forms';
import { requireShowRole } from '../shows/policies';
import type { Show } from '../db';

/**
 * Reads and checks an entry request sent as JSON by the entry form or another client; answers
 * 400 with a message per field for bad input, and checks that the sender is a member of the
 * society that runs the show.
 */
export async function readEntryRequest(
	event: RequestEvent
): Promise<{ input: EntryRequest; show: Show; user: App.SignedInUser } | Response> {
	let body: unknown;
	try {
		body = await event.request.json();
	} catch {
		return json({ message: 'Send the entry as JSON.' }, { status: 400 });
	}
	const parsed = entryRequestSchema.safeParse(body);
	if (!parsed.success) {
		return json(
			{ message: 'Check the entry’s fields.', errors: fieldErrors(parsed.error) },
			{ status: 400 }
		);
	}
	const { show, user } = await requireShowRole(event, parsed.data.showSlug, ['member']);
	return { input: parsed.data, show, user };
}
