import { error } from '@sveltejs/kit';
import { z } from 'zod';
import { memberAndId } from '$lib/server/plants/plant-route';
import { readPlantPhoto } from '$lib/server/plants/plant-photos';
import type { RequestHandler } from './$types';

/** A plant photo, only for the plant's owner; anyone else gets 404 (not even a hint it exists). */
export const GET: RequestHandler = async (event) => {
	const { user, id } = memberAndId(event, event.params.plantId);
	if (!z.uuid().safeParse(event.params.photoId).success) error(404, 'This photo does not exist.');
	const photo = await readPlantPhoto(user.id, id, event.params.photoId);
	if (!photo) error(404, 'This photo does not exist.');
	return new Response(new Uint8Array(photo.data), {
		headers: {
			'content-type': photo.mimeType,
			'content-length': String(photo.data.length),
			'cache-control': 'private, max-age=3600',
			'x-content-type-options': 'nosniff'
		}
	});
};
