import { randomUUID } from 'node:crypto';
import { mkdir, readFile, rm, writeFile } from 'node:fs/promises';
import path from 'node:path';
import { fileTypeFromBuffer } from 'file-type';
import sharp from 'sharp';
import type { Transaction } from 'sequelize';
import { recordAudit } from '../audit';
import { Plant, PlantPhoto } from '../db';
import { PlantInputError } from './plants';
import { lockPhotosOf, PHOTO_LIMITS } from '../http/uploads';
import { config } from '$lib/server/config';

/** Largest photo accepted, before it is scaled down (PHOTO_LIMITS). */
export const PHOTO_MAX_BYTES = PHOTO_LIMITS.maxBytes;

/** Longest side of a stored photo, in pixels. */
export const PHOTO_MAX_SIDE = 1600;

/** The real file types accepted (read from the file's bytes, not its name). */
export const PHOTO_TYPES = ['image/jpeg', 'image/png', 'image/webp'] as const;

function photoPath(fileName: string): string {
	return path.join(config().uploadDir, 'plants', fileName);
}

async function ownsPlant(ownerId: string, plantId: string, transaction?: Transaction) {
	const plant = await Plant.findOne({
		where: { id: plantId, ownerId },
		attributes: ['id'],
		transaction
	});
	return plant !== null;
}

/**
 * Stores a photo of one of the member's plants. The real type must be JPEG, PNG or WebP; the
 * image is turned upright, scaled to at most PHOTO_MAX_SIDE and saved as JPEG without its
 * metadata (so no camera location is kept).
 */
export async function addPlantPhoto(
	ownerId: string,
	plantId: string,
	file: File,
	caption: string | null,
	options: { transaction: Transaction }
): Promise<PlantPhoto> {
	const { transaction } = options;
	if (!(await ownsPlant(ownerId, plantId, transaction))) {
		throw new PlantInputError('plant', 'This plant is not in your collection.');
	}
	if (file.size === 0) throw new PlantInputError('photo', 'Choose a photo to upload.');
	if (file.size > PHOTO_MAX_BYTES) {
		throw new PlantInputError(
			'photo',
			`This photo is ${(file.size / 1024 / 1024).toFixed(1)} MB; photos can be up to ${PHOTO_MAX_BYTES / 1024 / 1024} MB.`
		);
	}
	await lockPhotosOf('plant', plantId, transaction);
	const count = await PlantPhoto.count({ where: { plantId }, transaction });
	if (count >= PHOTO_LIMITS.perPlant) {
		throw new PlantInputError(
			'photo',
			`A plant may have at most ${PHOTO_LIMITS.perPlant} photos; delete one to add another.`
		);
	}
	const input = Buffer.from(await file.arrayBuffer());
	const type = await fileTypeFromBuffer(input);
	if (!type || !(PHOTO_TYPES as readonly string[]).includes(type.mime)) {
		throw new PlantInputError('photo', 'Upload a JPEG, PNG or WebP photo.');
	}
	let output: Buffer;
	try {
		output = await sharp(input, { limitInputPixels: 50_000_000 })
			.rotate()
			.resize({
				width: PHOTO_MAX_SIDE,
				height: PHOTO_MAX_SIDE,
				fit: 'inside',
				withoutEnlargement: true
			})
			.flatten({ background: '#ffffff' })
			.jpeg({ quality: 84 })
			.toBuffer();
	} catch {
		throw new PlantInputError('photo', 'This photo could not be read; try another one.');
	}
	const fileName = `${randomUUID()}.jpg`;
	await mkdir(path.dirname(photoPath(fileName)), { recursive: true });
	await writeFile(photoPath(fileName), output);
	try {
		return await PlantPhoto.create(
			{ plantId, fileName, mimeType: 'image/jpeg', byteSize: output.length, caption },
			{ transaction }
		);
	} catch (error) {
		await rm(photoPath(fileName), { force: true });
		throw error;
	}
}

/** The bytes of a photo of one of the member's plants; null when it is not theirs or is gone. */
export async function readPlantPhoto(
	ownerId: string,
	plantId: string,
	photoId: string
): Promise<{ data: Buffer; mimeType: string } | null> {
	const photo = await PlantPhoto.findOne({
		where: { id: photoId, plantId },
		include: [{ model: Plant, as: 'plant', where: { ownerId }, attributes: [] }]
	});
	if (!photo) return null;
	try {
		return { data: await readFile(photoPath(photo.fileName)), mimeType: photo.mimeType };
	} catch {
		return null;
	}
}

/** Deletes a photo of one of the member's plants, row and file (audited). */
export async function deletePlantPhoto(
	ownerId: string,
	plantId: string,
	photoId: string,
	options: { transaction: Transaction }
): Promise<boolean> {
	const photo = await PlantPhoto.findOne({
		where: { id: photoId, plantId },
		include: [{ model: Plant, as: 'plant', where: { ownerId }, attributes: [] }],
		transaction: options.transaction
	});
	if (!photo) return false;
	await photo.destroy({ transaction: options.transaction });
	// The member's own collection belongs to no society: the record has none.
	await recordAudit(
		{
			societyId: null,
			actor: { id: ownerId },
			action: 'plant_photo.delete',
			target: { kind: 'plant_photo', id: photo.id, label: photo.caption || 'Plant photo' },
			details: { before: { plantId, caption: photo.caption, byteSize: photo.byteSize } }
		},
		{ transaction: options.transaction }
	);
	await rm(photoPath(photo.fileName), { force: true });
	return true;
}
