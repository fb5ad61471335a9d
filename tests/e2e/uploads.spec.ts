import { randomUUID } from 'node:crypto';
import { readdirSync } from 'node:fs';
import path from 'node:path';
import { expect, test, type APIRequestContext } from '@playwright/test';
import sharp from 'sharp';
import { PHOTO_LIMITS } from '../../src/lib/uploads';
import { VISITOR_KINDS, VISITORS, type Visitor } from './access/people';
import { enterNewPlant } from './support/entries';
import { withDb } from './support/judging-fixture';
import { cookieFor, requestAs } from './support/visitors';

// Photo uploads (entry photos and plant photos): what is refused, that nothing of a refused
// upload is kept, where files go, and who gets them back.

const UPLOAD_DIR = process.env.UPLOAD_DIR ?? path.join(process.cwd(), '.data', 'uploads');
const html = { accept: 'text/html' }; // as a plain form sends it: real status codes

async function jpeg(colour = '#3f7d5a'): Promise<Buffer> {
	return sharp({ create: { width: 64, height: 48, channels: 3, background: colour } })
		.jpeg()
		.toBuffer();
}

/** Every file under the upload folder, relative to it. */
function storedFiles(): string[] {
	try {
		return readdirSync(UPLOAD_DIR, { recursive: true, withFileTypes: true })
			.filter((d) => d.isFile())
			.map((d) => path.relative(UPLOAD_DIR, path.join(d.parentPath, d.name)));
	} catch {
		return [];
	}
}

/** Files under the upload folder that no photo row names (what a refused upload would leave). */
async function orphansAmong(files: string[]): Promise<string[]> {
	if (files.length === 0) return [];
	const known = await withDb(async (db) => {
		const r = await db.query<{ name: string }>(
			`SELECT file_name AS name FROM entry_photos UNION SELECT 'plants/' || file_name FROM plant_photos`
		);
		return new Set(r.rows.map((row) => row.name));
	});
	return files.filter((f) => !known.has(f));
}

/** A fresh entry (spring show) and plant of member@, so other tests' photos do not count. */
async function makeMemberEntryAndPlant(): Promise<{ entryId: string; plantId: string }> {
	const { entryId, plantId } = await enterNewPlant({
		email: 'member@crownbench.test',
		label: 'Upload test',
		daysOwned: 100
	});
	return { entryId, plantId };
}

async function photoCounts(ids: { entryId: string; plantId: string }) {
	return withDb(async (db) => ({
		entry: (
			await db.query(`SELECT count(*)::int AS n FROM entry_photos WHERE entry_id = $1`, [
				ids.entryId
			])
		).rows[0].n as number,
		plant: (
			await db.query(`SELECT count(*)::int AS n FROM plant_photos WHERE plant_id = $1`, [
				ids.plantId
			])
		).rows[0].n as number
	}));
}

/** Sends a form with files as the upload forms do; `files` may hold several under one name. */
async function upload(
	api: APIRequestContext,
	url: string,
	files: { field?: string; name: string; type: string; bytes: Buffer }[],
	fields: Record<string, string> = {}
) {
	const form = new FormData();
	for (const [k, v] of Object.entries(fields)) form.append(k, v);
	for (const f of files)
		form.append(f.field ?? 'photo', new Blob([new Uint8Array(f.bytes)], { type: f.type }), f.name);
	const response = await api.post(url, { multipart: form, headers: html, maxRedirects: 0 });
	return { status: response.status(), body: await response.text() };
}

test('bad photo uploads are refused with a clear message and leave nothing behind', async ({
	browser,
	baseURL
}) => {
	test.setTimeout(120_000);
	const ids = await makeMemberEntryAndPlant();
	const member = await requestAs(baseURL!, await cookieFor(browser, VISITORS.member));
	const good = await jpeg();
	const targets: { what: string; url: string; fields: Record<string, string> }[] = [
		{ what: 'entry', url: `/my/entries/${ids.entryId}?/upload`, fields: {} },
		{ what: 'plant', url: `/my/plants/${ids.plantId}?/photo`, fields: { caption: '' } }
	];
	// Over the limit: 8 MB (PHOTO_LIMITS), so 8 MB and one byte. A real JPEG start, then padding.
	const oversize = Buffer.concat([good, Buffer.alloc(PHOTO_LIMITS.maxBytes + 1 - good.length)]);
	const bad: { why: string; files: Parameters<typeof upload>[2]; message: RegExp }[] = [
		{
			why: 'over the size limit',
			files: [{ name: 'big.jpg', type: 'image/jpeg', bytes: oversize }],
			message: /8\.0 MB; a photo may be at most 8 MB/
		},
		{
			why: 'a script named .jpg',
			files: [
				{ name: 'plant.jpg', type: 'image/jpeg', bytes: Buffer.from('#!/bin/sh\necho hi\n') }
			],
			message: /JPEG, PNG or WebP/
		},
		{
			why: 'an SVG claiming PNG',
			files: [
				{ name: 'plant.png', type: 'image/png', bytes: Buffer.from('<svg onload="x()"></svg>') }
			],
			message: /JPEG, PNG or WebP/
		},
		{
			why: 'a PDF claiming JPEG',
			files: [{ name: 'plant.jpg', type: 'image/jpeg', bytes: Buffer.from('%PDF-1.4\n%âãÏÓ\n') }],
			message: /JPEG, PNG or WebP/
		},
		...['../../etc/plant.jpg', '/tmp/plant.jpg', '..\\..\\plant.jpg', 'C:\\Users\\plant.jpg'].map(
			(name) => ({
				why: `a real photo named ${name}`,
				files: [{ name, type: 'image/jpeg', bytes: good }],
				message: /name has folder parts or hidden characters/
			})
		),
		{
			why: 'two photos at once',
			files: [
				{ name: 'one.jpg', type: 'image/jpeg', bytes: good },
				{ name: 'two.jpg', type: 'image/jpeg', bytes: good }
			],
			message: /one photo at a time; this upload had 2 files/
		},
		{
			why: 'a second file in another field',
			files: [
				{ name: 'one.jpg', type: 'image/jpeg', bytes: good },
				{ field: 'caption', name: 'two.jpg', type: 'image/jpeg', bytes: good }
			],
			message: /one photo at a time/
		},
		{
			why: 'no file',
			files: [{ name: 'empty.jpg', type: 'image/jpeg', bytes: Buffer.alloc(0) }],
			message: /Choose a photo to upload/
		}
	];
	const before = storedFiles();
	const problems: string[] = [];
	for (const target of targets) {
		for (const b of bad) {
			const answer = await upload(member, target.url, b.files, target.fields);
			if (answer.status !== 400 || !b.message.test(answer.body))
				problems.push(`${target.what}, ${b.why}: ${answer.status} ${answer.body.slice(0, 120)}`);
		}
	}
	expect(problems).toEqual([]);
	expect(await photoCounts(ids)).toEqual({ entry: 0, plant: 0 });
	// No file of a refused upload stays in the upload folder (others' uploads get their row).
	const fresh = storedFiles().filter((f) => !before.includes(f));
	await expect.poll(() => orphansAmong(fresh), { timeout: 5_000 }).toEqual([]);

	// Too many for one entry (PHOTO_LIMITS.perEntry) or plant (perPlant): the next is refused.
	for (let i = 0; i < PHOTO_LIMITS.perEntry; i++) {
		const ok = await upload(member, targets[0].url, [
			{ name: 'p.jpg', type: 'image/jpeg', bytes: good }
		]);
		expect(ok.status).toBe(200);
	}
	await withDb(async (db) => {
		for (let i = 0; i < PHOTO_LIMITS.perPlant; i++)
			await db.query(
				`INSERT INTO plant_photos (plant_id, file_name, mime_type, byte_size) VALUES ($1, $2, 'image/jpeg', 1)`,
				[ids.plantId, `${randomUUID()}.jpg`]
			);
	});
	const fifth = await upload(member, targets[0].url, [
		{ name: 'p.jpg', type: 'image/jpeg', bytes: good }
	]);
	expect(fifth.status).toBe(400);
	expect(fifth.body).toContain(`An entry may have at most ${PHOTO_LIMITS.perEntry} photos.`);
	const thirteenth = await upload(
		member,
		targets[1].url,
		[{ name: 'p.jpg', type: 'image/jpeg', bytes: good }],
		targets[1].fields
	);
	expect(thirteenth.status).toBe(400);
	expect(thirteenth.body).toContain(`A plant may have at most ${PHOTO_LIMITS.perPlant} photos`);
	expect(await photoCounts(ids)).toEqual({
		entry: PHOTO_LIMITS.perEntry,
		plant: PHOTO_LIMITS.perPlant
	});
	await member.dispose();
});

test('stored photos get names of our own, outside the public folders, and reach only those allowed', async ({
	browser,
	baseURL
}) => {
	test.setTimeout(120_000);
	const ids = await makeMemberEntryAndPlant();
	const member = await requestAs(baseURL!, await cookieFor(browser, VISITORS.member));
	const bytes = await jpeg('#8a3b6e');
	const userName = `My Violet ${randomUUID().slice(0, 6)}.jpg`;
	for (const [url, fields] of [
		[`/my/entries/${ids.entryId}?/upload`, {}],
		[`/my/plants/${ids.plantId}?/photo`, { caption: '' }]
	] as const) {
		const answer = await upload(
			member,
			url,
			[{ name: userName, type: 'image/jpeg', bytes }],
			fields
		);
		expect(answer.status).toBe(200);
	}
	const stored = await withDb(async (db) => ({
		entry: (
			await db.query<{ id: string; file_name: string }>(
				`SELECT id, file_name FROM entry_photos WHERE entry_id = $1`,
				[ids.entryId]
			)
		).rows[0],
		plant: (
			await db.query<{ id: string; file_name: string }>(
				`SELECT id, file_name FROM plant_photos WHERE plant_id = $1`,
				[ids.plantId]
			)
		).rows[0]
	}));
	// Generated names (a random id), never the name the member's file had.
	for (const s of [stored.entry, stored.plant]) {
		expect(s.file_name).toMatch(
			/^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}\.jpg$/
		);
	}
	const files = storedFiles();
	expect(files).toContain(stored.entry.file_name);
	expect(files).toContain(`plants/${stored.plant.file_name}`);
	expect(files.filter((f) => f.includes('My Violet'))).toEqual([]);
	// The folder is outside what the server hands out as static files.
	for (const open of ['static', 'build/client']) {
		const rel = path.relative(path.resolve(open), path.resolve(UPLOAD_DIR));
		expect(rel.startsWith('..'), `${UPLOAD_DIR} is outside ${open}/`).toBe(true);
	}
	for (const guess of [
		`/${stored.entry.file_name}`,
		`/uploads/${stored.entry.file_name}`,
		`/.data/uploads/${stored.entry.file_name}`,
		`/uploads/plants/${stored.plant.file_name}`
	]) {
		expect((await member.get(guess)).status(), guess).toBe(404);
	}

	// Every file-serving route, every kind of visitor (and another exhibitor).
	const routes = {
		entry: `/api/photos/${stored.entry.id}`,
		plant: `/my/plants/${ids.plantId}/photos/${stored.plant.id}`
	};
	type Who = Visitor | 'exhibitor';
	// Entry photos: the exhibitor and the officers (admin, chair, clerk) of the show's society.
	// Plant photos: the owner only; members get 404 (not even a hint), a judge who is no member 403.
	const expected: Record<Who, { entry: number | 'signin'; plant: number | 'signin' }> = {
		anon: { entry: 401, plant: 'signin' },
		other: { entry: 403, plant: 404 },
		member: { entry: 200, plant: 200 },
		clerk: { entry: 200, plant: 404 },
		judge: { entry: 403, plant: 403 },
		chair: { entry: 200, plant: 404 },
		admin: { entry: 200, plant: 404 },
		exhibitor: { entry: 403, plant: 404 }
	};
	const got: Record<string, { entry: number | 'signin'; plant: number | 'signin' }> = {};
	const who: Who[] = [...VISITOR_KINDS, 'exhibitor'];
	for (const visitor of who) {
		const email = visitor === 'exhibitor' ? 'exhibitor1@crownbench.test' : VISITORS[visitor];
		const api = await requestAs(baseURL!, email ? await cookieFor(browser, email) : undefined);
		const answers: Record<string, number | 'signin'> = {};
		for (const [kind, url] of Object.entries(routes)) {
			const response = await api.get(url, { maxRedirects: 0 });
			const location = response.headers()['location'] ?? '';
			answers[kind] =
				response.status() === 303 && location.startsWith('/signin') ? 'signin' : response.status();
			const type = response.headers()['content-type'] ?? '';
			if (response.status() === 200) {
				expect(type).toBe('image/jpeg');
				expect((await response.body()).length).toBeGreaterThan(100);
				expect(response.headers()['cache-control']).toContain('private');
			} else {
				expect(type.startsWith('image/'), `${visitor} ${kind}: no image`).toBe(false);
			}
		}
		got[visitor] = answers as (typeof got)[string];
		await api.dispose();
	}
	expect(got).toEqual(expected);
	await member.dispose();
});
