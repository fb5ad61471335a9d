import { isHttpError, isRedirect } from '@sveltejs/kit';
import { afterAll, describe, expect, it } from 'vitest';
import { sequelize, Show } from '../../src/lib/server/db';
import { cachedSchedulePdf } from '../../src/lib/server/shows/schedule-pdf-cache';
import { loadPublicSchedule } from '../../src/lib/server/shows/public-schedule';
import { GET as schedulePdf } from '../../src/routes/shows/[slug]/schedule.pdf/+server';
import { areaOf } from '../../src/lib/server/policies';
import { loadSignedInUser } from '../../src/lib/server/people/people';
import { productionSettingProblems } from '../../src/lib/server/startup-checks';
import { GET as openTag } from '../../src/routes/e/[slug]/[number]/+server';
import { buildFixture, removeFixtures } from './judging-fixture';

afterAll(removeFixtures);

/** What the tag route answers a signed-in person: a redirect's location, or the error's status and message. */
async function tagAnswer(userId: string, slug: string, number: string) {
	const user = await loadSignedInUser(userId);
	const url = new URL(`http://127.0.0.1/e/${slug}/${number}`);
	const event = { locals: { user }, params: { slug, number }, url } as unknown as Parameters<
		typeof openTag
	>[0];
	try {
		await openTag(event);
		return { status: 200 };
	} catch (thrown) {
		if (isRedirect(thrown)) return { status: thrown.status, location: thrown.location };
		if (isHttpError(thrown)) return { status: thrown.status, message: thrown.body.message };
		throw thrown;
	}
}

describe('security: what an outside test found (issue 19)', () => {
	it('the area guard decides on the path as routing decodes it', () => {
		// Common practice: percent-encoded letters name the same path (RFC 3986, 2.3 and 6.2.2.2).
		expect(areaOf('/api/%6Audging/sheets')).toBe('judging');
		expect(areaOf('/%63hair/shows')).toBe('chair');
		expect(areaOf('/api/%6d%79/entries')).toBe('my');
		expect(areaOf('/%61dmin')).toBe('admin');
		expect(areaOf('/results/%ZZ')).toBeNull();
		expect(areaOf('/shows/spring')).toBeNull();
	});

	it('a judge opening a tag outside their classes learns nothing: the same 404 as no entry', async () => {
		const f = await buildFixture({ entryCount: 1 });
		const show = await Show.findByPk(f.showId);
		const slug = show!.slug;
		// Judge 1 is on the class's panel; judge 3 is not.
		expect(await tagAnswer(f.judges[0].id, slug, '1')).toEqual({
			status: 303,
			location: `/judging/entry/${f.entries[0].id}`
		});
		const missing = await tagAnswer(f.judges[2].id, slug, '999');
		expect(missing.status).toBe(404);
		const outside = await tagAnswer(f.judges[2].id, slug, '1');
		expect(outside).toEqual({ status: 404, message: 'There is no entry 1 in this show.' });
		expect(JSON.stringify(outside)).not.toContain(f.entries[0].id);
		// The other class has no panel: its entry is outside every judge's classes.
		const other = await tagAnswer(f.judges[0].id, slug, '101');
		expect(other).toEqual({ status: 404, message: 'There is no entry 101 in this show.' });
	});

	it('refuses to start in production with /dev/mail on, unless a test or demo run opts in', () => {
		const base = {
			NODE_ENV: 'production',
			ORIGIN: 'https://shows.example.org',
			AUTH_SECRET: 'a-secret-of-sixteen-or-more'
		};
		expect(productionSettingProblems(base)).toEqual([]);
		expect(
			productionSettingProblems({ ...base, CB_DEV_MAIL_URL: 'http://127.0.0.1:2536' })
		).toEqual([expect.stringMatching(/CB_DEV_MAIL_URL is set/)]);
		expect(
			productionSettingProblems({
				...base,
				CB_DEV_MAIL_URL: 'http://127.0.0.1:2536',
				CB_ALLOW_DEV_MAIL: '1'
			})
		).toEqual([]);
		// Development: the demo's own mail page is the point.
		expect(productionSettingProblems({ CB_DEV_MAIL_URL: 'http://127.0.0.1:2536' })).toEqual([]);
		// Without a public address, sign-in links would be made from the request's Host.
		// Without a secret, sessions could not be signed.
		expect(productionSettingProblems({ NODE_ENV: 'production' })).toEqual([
			expect.stringMatching(/Set ORIGIN/),
			expect.stringMatching(/Set AUTH_SECRET/)
		]);
	});

	it('keeps the public schedule PDF until the schedule or the society’s settings change', async () => {
		const f = await buildFixture({ entryCount: 1 });
		await sequelize.query('UPDATE shows SET schedule_published_at = now() WHERE id = :id', {
			replacements: { id: f.showId }
		});
		const slug = (await Show.findByPk(f.showId))!.slug;
		let builds = 0;
		const pdfOf = async () => {
			const data = await loadPublicSchedule(slug, null);
			return cachedSchedulePdf(slug, data, async () => Buffer.from(`build ${++builds}`));
		};
		expect(String(await pdfOf())).toBe('build 1');
		expect(String(await pdfOf())).toBe('build 1');
		await sequelize.query(`UPDATE classes SET name = 'Renamed class' WHERE id = :id`, {
			replacements: { id: f.classId }
		});
		expect(String(await pdfOf())).toBe('build 2');
		expect(String(await pdfOf())).toBe('build 2');
		await sequelize.query(`UPDATE societies SET slug = slug || '-x' WHERE id = :id`, {
			replacements: { id: f.societyId }
		});
		expect(String(await pdfOf())).toBe('build 3');
		// The route answers from the same place: the copy kept above, then (the society's settings
		// changed again) a real PDF, the same bytes while nothing changes.
		const event = { params: { slug }, locals: { user: null } } as unknown as Parameters<
			typeof schedulePdf
		>[0];
		expect(String(Buffer.from(await (await schedulePdf(event)).arrayBuffer()))).toBe('build 3');
		await sequelize.query(`UPDATE societies SET slug = slug || '-y' WHERE id = :id`, {
			replacements: { id: f.societyId }
		});
		const first = await schedulePdf(event);
		expect(first.headers.get('content-type')).toBe('application/pdf');
		const bytes = Buffer.from(await first.arrayBuffer());
		expect(bytes.subarray(0, 5).toString()).toBe('%PDF-');
		expect(Buffer.from(await (await schedulePdf(event)).arrayBuffer()).equals(bytes)).toBe(true);
	});
});
