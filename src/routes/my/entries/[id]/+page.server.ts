import { error, fail, type RequestEvent } from '@sveltejs/kit';
import { z } from 'zod';
import { sequelize, type Entry } from '$lib/server/db';
import { describeOwnEntry, findOwnEntry } from '$lib/server/entries/entries';
import { requireConfirmation } from '$lib/server/http/confirm';
import { requireRole } from '$lib/server/policies';
import {
	MAX_PHOTO_BYTES,
	MAX_PHOTOS_PER_ENTRY,
	addEntryPhoto,
	deleteEntryPhoto,
	findPhotoOfEntry,
	listEntryPhotos
} from '$lib/server/entries/photos';
import { loadMyEntryResult } from '$lib/server/results/my-results';
import { readOnePhoto } from '$lib/server/http/uploads';
import type { Actions, PageServerLoad } from './$types';
import { refusedForm } from '$lib/server/http/refusals';

/** The signed-in member's own entry, or 404 (another person's entry is never shown). */
async function ownEntry(event: Pick<RequestEvent, 'url' | 'locals'>, id: string): Promise<Entry> {
	const user = requireRole(event, ['member']);
	const entry = z.uuid().safeParse(id).success ? await findOwnEntry(user.id, id) : null;
	if (!entry) error(404, 'You have no entry at this address.');
	return entry;
}

export const load: PageServerLoad = async (event) => {
	const entry = await ownEntry(event, event.params.id);
	const [view, photos, result] = await Promise.all([
		describeOwnEntry(entry),
		listEntryPhotos(entry.id),
		loadMyEntryResult(entry.exhibitorId, entry.id)
	]);
	return {
		entry: view,
		result,
		photos,
		limits: { maxBytes: MAX_PHOTO_BYTES, maxPhotos: MAX_PHOTOS_PER_ENTRY }
	};
};

export const actions: Actions = {
	upload: async (event) => {
		const entry = await ownEntry(event, event.params.id);
		const user = requireRole(event, ['member']);
		const upload = readOnePhoto(await event.request.formData());
		if (!upload.ok) return fail(400, { message: upload.message });
		try {
			await sequelize.transaction((transaction) =>
				addEntryPhoto(entry, user.id, upload.file, { transaction })
			);
		} catch (e) {
			return refusedForm(e);
		}
		return { saved: 'The photo is added.' };
	},
	deletePhoto: async (event) => {
		const entry = await ownEntry(event, event.params.id);
		const user = requireRole(event, ['member']);
		const form = await event.request.formData();
		const id = z.uuid().safeParse(form.get('photoId'));
		const photo = id.success ? await findPhotoOfEntry(entry.id, id.data) : null;
		if (!photo) return fail(400, { message: 'That photo is not part of this entry.' });
		const unconfirmed = requireConfirmation(event, form, 'Remove this photo from the entry?');
		if (unconfirmed) return unconfirmed;
		await sequelize.transaction((transaction) =>
			deleteEntryPhoto(photo, { transaction, actor: user })
		);
		return { saved: 'The photo is removed.' };
	}
};
