import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { mkdtemp, readdir, rm } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { Op } from 'sequelize';
import { addCalendarMonths, addCalendarDays } from '../../src/lib/domain/dates';
import {
	Entry,
	EntryPhoto,
	Membership,
	Show,
	ShowClass,
	User,
	Variety,
	sequelize
} from '../../src/lib/server/db';
import {
	EntryInputProblem,
	EntryRefused,
	createEntry,
	enterPlant,
	previewEntry
} from '../../src/lib/server/entries/entries';
import {
	DeskProblem,
	checkInEntry,
	loadDeskEntry,
	moveEntry
} from '../../src/lib/server/entries/desk';
import { queryEntriesTable } from '../../src/lib/server/entries/entries-table';
import { useConfig } from '../../src/lib/server/config';
import { PhotoProblem, addEntryPhoto } from '../../src/lib/server/entries/photos';
import { isInGoodStanding } from '../../src/lib/server/people/standing';
import { importVarietiesCsv } from '../../src/lib/server/plants/varieties';
import { entriesQuerySchema } from '../../src/lib/schemas/desk';

let show: Show;
const classId: Record<string, string> = {};
const varietyId: Record<string, string> = {};
const userId: Record<string, string> = {};

async function counts(): Promise<{ entries: number; next: number }> {
	const fresh = await Show.findByPk(show.id);
	return {
		entries: await Entry.count({ where: { showId: show.id } }),
		next: fresh!.nextEntryNumber
	};
}

function request(
	klass: string,
	variety: string,
	acquiredOn = addCalendarMonths(show.judgingDay, -12)
) {
	return {
		showSlug: show.slug,
		classId: classId[klass],
		varietyId: varietyId[variety],
		acquiredOn
	};
}

async function refusal(promise: Promise<unknown>): Promise<string[]> {
	const error = await promise.then(
		() => null,
		(e: unknown) => e
	);
	expect(error).toBeInstanceOf(EntryRefused);
	return (error as EntryRefused).failures.map((f) => f.code);
}

beforeAll(async () => {
	show = (await Show.findOne({ where: { slug: { [Op.like]: 'larkspur-spring-%' } } }))!;
	for (const c of await ShowClass.findAll({ where: { showId: show.id } })) classId[c.code] = c.id;
	for (const v of await Variety.findAll({ where: { societyId: show.societyId } }))
		varietyId[v.name] = v.id;
	for (const u of await User.findAll()) userId[u.email.split('@')[0]] = u.id;
});

afterAll(() => sequelize.close());

describe('entering a plant', () => {
	it('takes a fitting entry with the next number and counts on', async () => {
		const before = await counts();
		const entry = await enterPlant(show.id, userId.exhibitor6, request('15', 'Wicker Robin'));
		expect(entry.number).toBe(before.next);
		expect(entry.status).toBe('entered');
		expect(await counts()).toEqual({ entries: before.entries + 1, next: before.next + 1 });
	});

	it('refuses a standard in a miniature class and writes nothing', async () => {
		const before = await counts();
		const codes = await refusal(
			enterPlant(show.id, userId.exhibitor6, request('15', 'Lantern Cove'))
		);
		expect(codes).toEqual(['size_class_not_allowed']);
		expect(await counts()).toEqual(before);
	});

	it('refuses a trailer in a single-crown class, and a single crown in a trailer class', async () => {
		const before = await counts();
		expect(
			await refusal(enterPlant(show.id, userId.exhibitor6, request('16', "Wren's Ladder")))
		).toContain('habit_not_allowed');
		expect(
			await refusal(enterPlant(show.id, userId.exhibitor6, request('20', 'Pocket Sleet')))
		).toContain('habit_not_allowed');
		expect(await counts()).toEqual(before);
	});

	it('refuses a plant grown for under three months by the show date', async () => {
		// possession period 3 months: state council show rules 2018 (DOMAIN.md)
		const before = await counts();
		const twoMonths = addCalendarMonths(show.judgingDay, -2);
		const codes = await refusal(
			enterPlant(show.id, userId.exhibitor6, request('17', 'Tidepool Ember', twoMonths))
		);
		expect(codes).toEqual(['possession_period_not_reached']);
		const threeMonths = addCalendarMonths(show.judgingDay, -3);
		const ok = await enterPlant(
			show.id,
			userId.exhibitor6,
			request('17', 'Tidepool Ember', threeMonths)
		);
		expect(ok.number).toBe(before.next);
	});

	it('refuses a member whose dues have lapsed, saying where to renew', async () => {
		const before = await counts();
		const error = (await enterPlant(show.id, userId.lapsed, request('15', 'Crumb of Coral')).catch(
			(e) => e
		)) as EntryRefused;
		expect(error.failures.map((f) => f.code)).toEqual(['not_in_good_standing']);
		expect(error.failures[0].message).toContain('/my/membership');
		expect(await counts()).toEqual(before);
	});

	it('refuses a third entry in a class and a second of the same variety', async () => {
		// member@ holds two entries in class 15 in the demo seed; the show allows two per class
		const before = await counts();
		expect(
			await refusal(enterPlant(show.id, userId.member, request('15', 'Hazel Thistle')))
		).toEqual(['class_entry_limit_reached']);
		expect(await refusal(enterPlant(show.id, userId.member, request('2', 'Harbor Dusk')))).toEqual([
			'variety_entry_limit_reached',
			'variety_already_in_class'
		]);
		expect(await counts()).toEqual(before);
	});

	it('refuses entries once entries have closed', async () => {
		const closed = await Show.findByPk(show.id);
		const saved = { entriesOpen: closed!.entriesOpen, entriesClose: closed!.entriesClose };
		const yesterday = addCalendarDays(new Date().toISOString().slice(0, 10), -1);
		await closed!.update({ entriesOpen: addCalendarDays(yesterday, -10), entriesClose: yesterday });
		try {
			const before = await counts();
			expect(
				await refusal(enterPlant(show.id, userId.exhibitor6, request('15', 'Hazel Thistle')))
			).toEqual(['entries_closed']);
			expect(await counts()).toEqual(before);
		} finally {
			await closed!.update(saved);
		}
	});

	// i-sec: the API takes what the form offers, no more.
	it('refuses entries into a show whose schedule is not published, and into a design class', async () => {
		const draft = (await Show.findByPk(show.id))!;
		const published = draft.schedulePublishedAt;
		await draft.update({ schedulePublishedAt: null });
		try {
			const before = await counts();
			for (const attempt of [
				() => enterPlant(show.id, userId.exhibitor6, request('15', 'Hazel Thistle')),
				() => previewEntry(draft, userId.exhibitor6, request('15', 'Hazel Thistle'))
			]) {
				const err = await attempt().then(
					() => null,
					(e: unknown) => e
				);
				expect(err).toBeInstanceOf(EntryInputProblem);
				expect((err as EntryInputProblem).field).toBe('showSlug');
			}
			expect(await counts()).toEqual(before);
		} finally {
			await draft.update({ schedulePublishedAt: published });
		}
		// Class 24 is in the demo show's design division.
		const before = await counts();
		const design = await enterPlant(
			show.id,
			userId.exhibitor6,
			request('24', 'Hazel Thistle')
		).then(
			() => null,
			(e: unknown) => e
		);
		expect(design).toBeInstanceOf(EntryInputProblem);
		expect((design as EntryInputProblem).message).toMatch(/does not take plant entries/);
		expect(await counts()).toEqual(before);
	});

	it('a refused entry rolls back inside a larger transaction too', async () => {
		const before = await counts();
		await expect(
			sequelize.transaction((transaction) =>
				createEntry(show.id, userId.exhibitor6, request('15', 'Harbor Dusk'), { transaction })
			)
		).rejects.toBeInstanceOf(EntryRefused);
		expect(await counts()).toEqual(before);
	});

	it('gives simultaneous entries different numbers', async () => {
		const before = await counts();
		const [a, b] = await Promise.all([
			enterPlant(show.id, userId.exhibitor3, request('16', 'Pocket Sleet')),
			enterPlant(show.id, userId.exhibitor4, request('16', 'Pocket Sleet'))
		]);
		expect(new Set([a.number, b.number])).toEqual(new Set([before.next, before.next + 1]));
	});

	it('previews without writing', async () => {
		const before = await counts();
		const preview = await previewEntry(show, userId.exhibitor6, request('15', 'Lantern Cove'));
		expect(preview.fits).toBe(false);
		expect(await counts()).toEqual(before);
	});
});

describe('good standing', () => {
	it('holds when dues are paid through the judging day, not a day short', async () => {
		const membership = (await Membership.findOne({
			where: { userId: userId.exhibitor7, societyId: show.societyId }
		}))!;
		const saved = membership.duesPaidThrough;
		try {
			await membership.update({ duesPaidThrough: show.judgingDay });
			expect(await isInGoodStanding(userId.exhibitor7, show.societyId, show.judgingDay)).toBe(true);
			await membership.update({ duesPaidThrough: addCalendarDays(show.judgingDay, -1) });
			expect(await isInGoodStanding(userId.exhibitor7, show.societyId, show.judgingDay)).toBe(
				false
			);
		} finally {
			await membership.update({ duesPaidThrough: saved });
		}
	});
});

describe('the entry desk', () => {
	it('measures in centimeters, finds a miniature over its limit, and moves it to a class that fits', async () => {
		const entry = await enterPlant(show.id, userId.exhibitor7, request('15', 'Thimble Harbor'));
		// 1 in = 2.54 cm exactly, NIST SP 811: 17.78 cm is 7 in, over a miniature's 6 in (growers' references)
		await sequelize.transaction((transaction) =>
			checkInEntry(
				show,
				entry.id,
				userId.clerk,
				{ diameter: 17.78, crowns: 1, potSize: 7.62, unit: 'cm' },
				{ transaction }
			)
		);
		const measured = (await loadDeskEntry(show, entry.number))!;
		expect(measured.measuredDiameterIn).toBe(7);
		expect(measured.potSizeIn).toBe(3);
		expect(measured.verdict!.failures.map((f) => f.code)).toEqual(['diameter_over_limit']);
		const proposed = measured.proposals.map((p) => p.label.split(' ')[0]);
		expect(proposed).toContain('12');
		expect(proposed).not.toContain('24'); // design classes are never proposed for a plant

		await expect(
			sequelize.transaction((transaction) =>
				moveEntry(show, entry.id, classId['1'], { transaction, actor: { id: entry.exhibitorId } })
			)
		).rejects.toBeInstanceOf(DeskProblem);
		await sequelize.transaction((transaction) =>
			moveEntry(show, entry.id, classId['12'], { transaction, actor: { id: entry.exhibitorId } })
		);
		const moved = (await loadDeskEntry(show, entry.number))!;
		expect(moved.classId).toBe(classId['12']);
		expect(moved.shownSizeClass).toBe('semiminiature');
		expect(moved.verdict!.fits).toBe(true);
	});

	it('finds a single-crown plant with a sucker', async () => {
		const entry = await enterPlant(show.id, userId.exhibitor7, request('17', 'Ladle of Plums'));
		await sequelize.transaction((transaction) =>
			checkInEntry(
				show,
				entry.id,
				userId.clerk,
				{ diameter: 5, crowns: 2, potSize: 2.5, unit: 'in' },
				{ transaction }
			)
		);
		const desk = (await loadDeskEntry(show, entry.number))!;
		// single crown: every entry except trailers and species (state council show rules 2018)
		expect(desk.verdict!.failures.map((f) => f.code)).toEqual(['too_many_crowns']);
	});
});

describe('the entries table', () => {
	it('sorts, filters and pages in the database', async () => {
		const page0 = await queryEntriesTable(
			show.id,
			entriesQuerySchema.parse({ size: '5', sort: 'number', dir: 'desc' })
		);
		expect(page0.rows).toHaveLength(5);
		expect(page0.total).toBe(await Entry.count({ where: { showId: show.id } }));
		const numbers = page0.rows.map((r) => r.number);
		expect(numbers).toEqual([...numbers].sort((a, b) => b - a));
		const page1 = await queryEntriesTable(
			show.id,
			entriesQuerySchema.parse({ size: '5', sort: 'number', dir: 'desc', page: '1' })
		);
		expect(page1.rows[0].number).toBeLessThan(numbers[4]);
		const checked = await queryEntriesTable(
			show.id,
			entriesQuerySchema.parse({ status: 'checked_in', size: '100' })
		);
		expect(checked.rows.every((r) => r.status === 'checked_in')).toBe(true);
		const bad = entriesQuerySchema.parse({
			sort: 'exhibitor_id; drop table entries',
			size: 'lots'
		});
		expect(bad).toMatchObject({ sort: 'number', size: 25 });
	});
});

describe('registry import', () => {
	const header =
		'name,hybridizer,habit,size_class,blossom_type,blossom_colours,foliage,species,description';

	it('reports every bad line and imports nothing, unless asked for the good rows only', async () => {
		const csv = [
			header,
			'Import Good One,X,single crown,miniature,single,pink;white,plain,no,ok',
			'Import Bad Habit,X,bush,miniature,single,pink,plain,no,bad',
			'"Import Broken,X,trailer,standard,single,pink,plain,no,unclosed'
		].join('\n');
		const before = await Variety.count({ where: { societyId: show.societyId } });
		const report = await sequelize.transaction((transaction) =>
			importVarietiesCsv(show.societyId, csv, { goodRowsOnly: false, transaction })
		);
		expect(report.imported).toBe(0);
		expect(report.problems.map((p) => p.line)).toEqual([3, 4]);
		expect(report.problems[0].reason).toMatch(/^habit:/);
		expect(await Variety.count({ where: { societyId: show.societyId } })).toBe(before);

		const dup = [header, 'Harbor Dusk,X,single crown,standard,double,purple,plain,no,'].join('\n');
		const dupReport = await sequelize.transaction((transaction) =>
			importVarietiesCsv(show.societyId, dup, { goodRowsOnly: false, transaction })
		);
		expect(dupReport.problems[0]).toEqual({
			line: 2,
			reason: '“Harbor Dusk” is already in the registry.'
		});

		const good = await sequelize.transaction((transaction) =>
			importVarietiesCsv(show.societyId, csv, { goodRowsOnly: true, transaction })
		);
		expect(good.imported).toBe(1);
		const added = await Variety.findOne({ where: { name: 'Import Good One' } });
		expect(added?.blossomColours).toEqual(['pink', 'white']);
	});

	it('refuses a file without the needed header', async () => {
		const report = await sequelize.transaction((transaction) =>
			importVarietiesCsv(show.societyId, 'a,b\n1,2', { goodRowsOnly: true, transaction })
		);
		expect(report).toMatchObject({ imported: 0, problems: [{ line: 1 }] });
	});
});

describe('entry photos', () => {
	let dir: string;
	beforeAll(async () => {
		dir = await mkdtemp(path.join(tmpdir(), 'cb-photos-'));
		process.env.UPLOAD_DIR = dir;
		useConfig(process.env);
	});
	afterAll(async () => {
		delete process.env.UPLOAD_DIR;
		useConfig(process.env);
		await rm(dir, { recursive: true, force: true });
	});

	const png = Buffer.from(
		'iVBORw0KGgoAAAANSUhEUgAAAAgAAAAICAIAAABLbSncAAAAEUlEQVR4nGOosFmAFTEMLQkALLdVAQ38h0IAAAAASUVORK5CYII=',
		'base64'
	);

	it('keeps a real image under a generated name and refuses fakes and huge files, writing nothing', async () => {
		const entry = (await Entry.findOne({
			where: { showId: show.id, exhibitorId: userId.member }
		}))!;
		const add = (file: File) =>
			sequelize.transaction((transaction) =>
				addEntryPhoto(entry, userId.member, file, { transaction })
			);
		await expect(
			add(new File([Buffer.from('<svg onload=alert(1)>')], 'x.png', { type: 'image/png' }))
		).rejects.toThrow(PhotoProblem);
		await expect(
			add(new File([Buffer.alloc(9 * 1024 * 1024)], 'big.jpg', { type: 'image/jpeg' }))
		).rejects.toThrow(/at most 8 MB/);
		expect(await EntryPhoto.count({ where: { entryId: entry.id } })).toBe(0);
		expect(await readdir(dir)).toEqual([]);

		const photo = await add(new File([png], '../../etc/passwd.png', { type: 'text/plain' }));
		expect(photo.contentType).toBe('image/png');
		expect(photo.fileName).toMatch(/^[0-9a-f-]{36}\.png$/);
		expect(await readdir(dir)).toEqual([photo.fileName]);
	});

	// i-sec: eight uploads at once still keep PHOTO_LIMITS.perEntry (4, common practice).
	it('keeps the per-entry limit under parallel uploads: count and insert are locked', async () => {
		const entry = (await Entry.findOne({
			where: { showId: show.id, exhibitorId: userId.member }
		}))!;
		const before = await EntryPhoto.count({ where: { entryId: entry.id } });
		const outcomes = await Promise.allSettled(
			Array.from({ length: 8 }, (_, i) =>
				sequelize.transaction((transaction) =>
					addEntryPhoto(entry, userId.member, new File([png], `p${i}.png`), { transaction })
				)
			)
		);
		expect(await EntryPhoto.count({ where: { entryId: entry.id } })).toBe(4);
		expect(outcomes.filter((o) => o.status === 'fulfilled')).toHaveLength(4 - before);
		for (const o of outcomes.filter((o) => o.status === 'rejected')) {
			expect((o as PromiseRejectedResult).reason).toBeInstanceOf(PhotoProblem);
		}
		expect(await readdir(dir)).toHaveLength(4);
	});
});
