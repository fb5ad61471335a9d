import { error, json } from '@sveltejs/kit';
import { z } from 'zod';
import { requireRole } from '$lib/server/policies';
import { sendEntryRemindersNow } from '$lib/server/plants/reminders';
import { societyOfShow } from '$lib/server/shows/shows';
import type { RequestHandler } from './$types';

/**
 * The chair sends the entry reminders of a show now (members with plants that fit, reminders
 * on). Members who already got this show's reminder are skipped, so it is safe to repeat.
 */
export const POST: RequestHandler = async (event) => {
	requireRole(event, ['chair']);
	if (!z.uuid().safeParse(event.params.showId).success) error(404, 'This show does not exist.');
	const societyId = await societyOfShow(event.params.showId);
	if (!societyId) error(404, 'This show does not exist.');
	requireRole(event, ['chair'], societyId);
	return json({ queued: await sendEntryRemindersNow(event.params.showId, societyId) });
};
