import { randomUUID } from 'node:crypto';
import { mkdir, readFile, rm, writeFile } from 'node:fs/promises';
import path from 'node:path';
import { fileTypeFromBuffer } from 'file-type';
import sharp from 'sharp';
import type { Transaction } from 'sequelize';
import { recordAudit, type AuditActor } from '../audit';
import { Entry, EntryPhoto, Show } from '../db';
import { lockPhotosOf, PHOTO_LIMITS } from '../http/uploads';
import { Refusal } from '../http/refusal';
import { config } from '$lib/server/config';

/** Largest photo we accept, in bytes (PHOTO_LIMITS). */
export const MAX_PHOTO_BYTES = PHOTO_LIMITS.maxBytes;

/** Most photos one entry may have (PHOTO_LIMITS). */
export const MAX_PHOTOS_PER_ENTRY = PHOTO_LIMITS.perEntry;

/** Longest side of a stored photo, in pixels. */
const MAX_SIDE = 2000;

/** The real image types we take, by what file-type reads from the bytes. */
const ACCEPTED: Record<string, { ext: string; format: 'jpeg' | 'png' | 'webp' }> = {
	'image/jpeg': { ext: 'jpg', format: 'jpeg' },
	'image/png': { ext: 'png', format: 'png' },
	'image/webp': { ext: 'webp', format: 'webp' }
};

/** A photo that is refused, in a plain sentence. */
export class PhotoProblem extends Refusal {}

/**
 * Stores a photo of an entry: checks the size and the real file type (from the bytes, not the
 * name), re-encodes it without its metadata (location, camera) at most 2000 px a side, saves it
 * under a generated name and records it. Throws PhotoProblem for a refused file.
 */
export async function addEntryPhoto(
	entry: Entry,
	uploaderId: string,
	file: File,
	options: { transaction: Transaction }
): Promise<EntryPhoto> {
	const { transaction } = options;
	if (file.size === 0) throw new PhotoProblem('Choose a photo to upload.');
	if (file.size > MAX_PHOTO_BYTES) {
		throw new PhotoProblem(
			`That file is ${(file.size / 1024 / 1024).toFixed(1)} MB; a photo may be at most ${MAX_PHOTO_BYTES / 1024 / 1024} MB.`
		);
	}
	await lockPhotosOf('entry', entry.id, transaction);
	const count = await EntryPhoto.count({ where: { entryId: entry.id }, transaction });
	if (count >= MAX_PHOTOS_PER_ENTRY) {
		throw new PhotoProblem(`An entry may have at most ${MAX_PHOTOS_PER_ENTRY} photos.`);
	}
	const input = Buffer.from(await file.arrayBuffer());
	const type = await fileTypeFromBuffer(input);
	const accepted = type ? ACCEPTED[type.mime] : undefined;
	if (!accepted) {
		throw new PhotoProblem('That file is not a JPEG, PNG or WebP photo (whatever its name says).');
	}
	let output: { data: Buffer; info: { width: number; height: number } };
	try {
		output = await sharp(input, { limitInputPixels: 50_000_000 })
			.rotate()
			.resize({ width: MAX_SIDE, height: MAX_SIDE, fit: 'inside', withoutEnlargement: true })
			.toFormat(accepted.format)
			.toBuffer({ resolveWithObject: true });
	} catch {
		throw new PhotoProblem('That photo cannot be read; it may be damaged.');
	}
	const fileName = `${randomUUID()}.${accepted.ext}`;
	const dir = config().uploadDir;
	await mkdir(dir, { recursive: true });
	const target = path.join(dir, fileName);
	await writeFile(target, output.data, { flag: 'wx' });
	try {
		return await EntryPhoto.create(
			{
				entryId: entry.id,
				uploadedBy: uploaderId,
				fileName,
				contentType: type!.mime,
				bytes: output.data.length,
				width: output.info.width,
				height: output.info.height
			},
			{ transaction }
		);
	} catch (e) {
		await rm(target, { force: true });
		throw e;
	}
}

/** The photos of an entry, oldest first. */
export async function listEntryPhotos(
	entryId: string
): Promise<{ id: string; width: number | null; height: number | null }[]> {
	const photos = await EntryPhoto.findAll({ where: { entryId }, order: [['createdAt', 'ASC']] });
	return photos.map((p) => ({ id: p.id, width: p.width, height: p.height }));
}

/** A stored photo's record and bytes, or null. The caller checks who may see its entry. */
export async function readEntryPhoto(
	photoId: string
): Promise<{ photo: EntryPhoto; entry: Entry; data: Buffer } | null> {
	const photo = await EntryPhoto.findByPk(photoId);
	if (!photo || !/^[0-9a-f-]{36}\.(jpg|png|webp)$/.test(photo.fileName)) return null;
	const entry = await Entry.findByPk(photo.entryId);
	if (!entry) return null;
	const data = await readFile(path.join(config().uploadDir, photo.fileName)).catch(() => null);
	return data ? { photo, entry, data } : null;
}

/** Removes a photo record and writes the audit record (in the transaction), then its file. */
export async function deleteEntryPhoto(
	photo: EntryPhoto,
	options: { transaction: Transaction; actor: AuditActor }
): Promise<void> {
	const { transaction } = options;
	const entry = await Entry.findByPk(photo.entryId, { transaction });
	const show = entry ? await Show.findByPk(entry.showId, { transaction }) : null;
	await photo.destroy({ transaction });
	await recordAudit(
		{
			societyId: show?.societyId ?? null,
			showId: show?.id ?? null,
			actor: options.actor,
			action: 'entry_photo.delete',
			target: {
				kind: 'entry_photo',
				id: photo.id,
				label: entry ? `Photo of entry ${entry.number}` : 'Photo of an entry'
			},
			details: { before: { entryId: photo.entryId, width: photo.width, height: photo.height } }
		},
		{ transaction }
	);
	await rm(path.join(config().uploadDir, photo.fileName), { force: true });
}

/** A photo of this entry by its id (null when the photo belongs to no such entry). */
export async function findPhotoOfEntry(
	entryId: string,
	photoId: string
): Promise<EntryPhoto | null> {
	return EntryPhoto.findOne({ where: { id: photoId, entryId } });
}
