import { error } from '@sveltejs/kit';
import { z } from 'zod';
import { hasRole, requireUser } from '$lib/server/policies';
import { readEntryPhoto } from '$lib/server/entries/photos';
import { societyOfShow } from '$lib/server/shows/shows';
import type { RequestHandler } from './$types';

/** A photo of an entry, only for its exhibitor and the officers of the show's society. */
export const GET: RequestHandler = async (event) => {
	const user = requireUser(event);
	if (!z.uuid().safeParse(event.params.id).success) error(404, 'No such photo.');
	const found = await readEntryPhoto(event.params.id);
	if (!found) error(404, 'No such photo.');
	const societyId = await societyOfShow(found.entry.showId);
	const allowed =
		found.entry.exhibitorId === user.id ||
		(societyId !== null && hasRole(user, ['admin', 'chair', 'clerk'], societyId));
	if (!allowed) error(403, 'You may not see this photo.');
	return new Response(new Uint8Array(found.data), {
		headers: {
			'content-type': found.photo.contentType,
			'cache-control': 'private, max-age=3600',
			'content-disposition': 'inline'
		}
	});
};
