import type { Transaction } from 'sequelize';
import { PHOTO_LIMITS } from '$lib/uploads';
import { sequelize } from '../db';

export { PHOTO_LIMITS };

/** Longest file name we take (most file systems stop at 255 bytes). */
const MAX_NAME_LENGTH = 255;

/**
 * The one photo of an upload form, or why it is refused: more files than PHOTO_LIMITS.perRequest
 * (in any field), no file, a name with folder parts (../, /absolute, C:\, backslashes) or hidden
 * characters, or a file over the size limit. The name is only checked, never used: stored files
 * get generated names. The real type is read from the bytes by the photo services.
 */
export function readOnePhoto(
	form: FormData,
	field = 'photo'
): { ok: true; file: File } | { ok: false; message: string } {
	const files = [...form.values()].filter((v): v is File => v instanceof File);
	if (files.length > PHOTO_LIMITS.perRequest) {
		return {
			ok: false,
			message: `Send one photo at a time; this upload had ${files.length} files. Nothing was saved.`
		};
	}
	const file = form.get(field);
	if (!(file instanceof File) || file.size === 0) {
		return { ok: false, message: 'Choose a photo to upload.' };
	}
	// eslint-disable-next-line no-control-regex
	if (/[/\\\u0000-\u001f\u007f]|^[a-zA-Z]:/.test(file.name) || file.name === '..') {
		return {
			ok: false,
			message:
				'The file’s name has folder parts or hidden characters; rename it (for example plant.jpg) and try again.'
		};
	}
	if (file.name.length > MAX_NAME_LENGTH) {
		return { ok: false, message: 'The file’s name is too long; rename it and try again.' };
	}
	if (file.size > PHOTO_LIMITS.maxBytes) {
		return {
			ok: false,
			message: `That file is ${(file.size / 1024 / 1024).toFixed(1)} MB; a photo may be at most ${PHOTO_LIMITS.maxBytes / 1024 / 1024} MB.`
		};
	}
	return { ok: true, file };
}

/**
 * Holds the photo count of one entry or plant until the transaction ends (a transaction-scoped
 * advisory lock): parallel uploads then count and insert one after another, so none passes the limit.
 */
export async function lockPhotosOf(
	kind: 'entry' | 'plant',
	id: string,
	transaction: Transaction
): Promise<void> {
	await sequelize.query('SELECT pg_advisory_xact_lock(hashtext(:key))', {
		replacements: { key: `photos:${kind}:${id}` },
		transaction
	});
}
