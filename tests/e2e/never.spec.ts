import { randomUUID } from 'node:crypto';
import { expect, test, type APIRequestContext, type APIResponse } from '@playwright/test';
import { PDFParse } from 'pdf-parse';
import sharp from 'sharp';
import { VISITORS, type Visitor } from './access/people';
import { fillRoute, loadParams } from './access/params';
import { ACCESS_TABLE } from './access/table';
import { enterNewPlant } from './support/entries';
import { createJudgingShow, withDb } from './support/judging-fixture';
import { cookieFor, requestAs, wordsIn } from './support/visitors';

// The four "never" rules of issue 9, each tried every way in against the built server.

/** What a visitor's browser receives from one address: status and readable body. */
interface Answer {
	url: string;
	status: number;
	body: string;
}

async function read(response: APIResponse, url: string): Promise<Answer> {
	const type = response.headers()['content-type'] ?? '';
	let body = '';
	if (type.startsWith('application/pdf')) {
		const parser = new PDFParse({ data: new Uint8Array(await response.body()) });
		body = (await parser.getText()).text;
		await parser.destroy();
	} else if (!type.startsWith('image/')) {
		body = await response.text();
	}
	if (url.includes('/__data.json') && response.ok()) {
		// Data answers are 200 and say inside whether they redirect (to sign-in: the location only
		// repeats the address asked for) or hold a refusal.
		const data = JSON.parse(body) as {
			type: string;
			nodes?: ({ type: string; status?: number } | null)[];
		};
		if (data.type === 'redirect') return { url, status: 303, body: '' };
		const refusal = data.nodes?.find((n) => n?.type === 'error');
		if (refusal) return { url, status: refusal.status ?? 500, body };
	}
	return { url, status: response.status(), body };
}

/** GETs every address (and the data answer of each page) and keeps what comes back. */
async function fetchAll(
	api: APIRequestContext,
	urls: readonly string[],
	options: { followRedirects?: boolean; withData?: boolean } = {}
): Promise<Answer[]> {
	const answers: Answer[] = [];
	const all = new Set(urls);
	if (options.withData) {
		for (const url of urls) {
			const [path, query] = url.split('?');
			if (!path.startsWith('/api/') && !/\.(pdf|csv)$/.test(path))
				all.add(`${path.replace(/\/$/, '')}/__data.json${query ? `?${query}` : ''}`);
		}
	}
	for (const url of all) {
		const response = await api.get(url, { maxRedirects: options.followRedirects ? 10 : 0 });
		answers.push(await read(response, url));
	}
	return answers;
}

/** "url: words" for every answer that contains one of the words. */
function leaks(answers: readonly Answer[], words: readonly string[]): string[] {
	return answers
		.map((a) => ({ url: a.url, found: wordsIn(a.body, words) }))
		.filter((a) => a.found.length > 0)
		.map((a) => `${a.url}: ${a.found.join(', ')}`);
}

const statusOf = (answers: readonly Answer[], url: string) =>
	answers.find((a) => a.url === url)?.status;

async function smallJpeg(): Promise<Buffer> {
	return sharp({ create: { width: 48, height: 32, channels: 3, background: '#6a4c93' } })
		.jpeg()
		.toBuffer();
}

test('an exhibitor never sees another exhibitor’s entries, plants or photos before results are public', async ({
	browser,
	baseURL
}) => {
	test.setTimeout(120_000);
	const params = await loadParams();
	const tag = randomUUID().slice(0, 8);
	const secretTitle = `Hidden Velvet ${tag}`;
	const secretLabel = `Back shelf ${tag}`;
	// Exhibitor B (exhibitor1@) enters a plant of their collection in the spring show, whose
	// schedule is public and whose results are not.
	const show = await withDb(
		async (db) =>
			(await db.query(`SELECT results_published_at FROM shows WHERE id = $1`, [params.showId]))
				.rows[0]
	);
	expect(show.results_published_at, 'the spring show’s results are not public').toBeNull();
	const b = await enterNewPlant({
		email: 'exhibitor1@crownbench.test',
		label: secretLabel,
		title: secretTitle,
		daysOwned: 200
	});
	const secretWords = [secretTitle, secretLabel, b.user.name, b.user.email];

	// B adds a photo to the entry and one to the plant through the real forms.
	const bApi = await requestAs(baseURL!, await cookieFor(browser, b.user.email));
	const photo = { name: 'bench.jpg', mimeType: 'image/jpeg', buffer: await smallJpeg() };
	const html = { accept: 'text/html' }; // as a plain form sends it: real status codes
	const uploads = [
		await bApi.post(`/my/entries/${b.entryId}?/upload`, { multipart: { photo }, headers: html }),
		await bApi.post(`/my/plants/${b.plantId}?/photo`, {
			multipart: { photo, caption: '' },
			headers: html
		})
	];
	expect(uploads.map((r) => r.status())).toEqual([200, 200]);
	const photos = await withDb(async (db) => ({
		entry: (await db.query(`SELECT id FROM entry_photos WHERE entry_id = $1`, [b.entryId])).rows,
		plant: (await db.query(`SELECT id FROM plant_photos WHERE plant_id = $1`, [b.plantId])).rows
	}));
	expect(photos.entry).toHaveLength(1);
	expect(photos.plant).toHaveLength(1);
	const entryPhotoId = photos.entry[0].id as string;
	const plantPhotoId = photos.plant[0].id as string;

	// The words are there to be found: B sees them, so a leak to A would be caught.
	const own = await fetchAll(bApi, [`/my/entries/${b.entryId}`, `/my/plants/${b.plantId}`]);
	expect(own.map((a) => a.status)).toEqual([200, 200]);
	// The title is on the entry and, in its show history, on the plant's page.
	expect(leaks(own, [secretTitle])).toHaveLength(2);
	expect(leaks(own, [secretLabel])).toHaveLength(1);
	expect((await bApi.get(`/api/photos/${entryPhotoId}`)).status()).toBe(200);
	expect((await bApi.get(`/my/plants/${b.plantId}/photos/${plantPhotoId}`)).status()).toBe(200);

	// Exhibitor A (member@) tries every GET address of the app with B's ids filled in.
	const mine: Record<string, string> = {
		memberEntryId: b.entryId,
		entryId: b.entryId,
		plantId: b.plantId,
		photoId: plantPhotoId,
		number: String(b.number),
		classId: b.classId
	};
	// (/dev/mail, the local mail viewer of development and tests, is left out: it is off in
	// production and shows every caught message, sign-in links included.)
	const rows = ACCESS_TABLE.filter(
		(row) => (row.method ?? 'GET') === 'GET' && !row.route.startsWith('/dev/')
	);
	const urls = rows.map((row) => {
		const id = row.route.startsWith('/api/photos/') ? entryPhotoId : b.entryId;
		const values: Record<string, string> = { ...params, ...row.params, ...mine, id };
		const query = row.query?.replace(/\$(\w+)/g, (_, k: string) => values[k]);
		return fillRoute(row.route, values) + (query ? `?${query}` : '');
	});
	const aApi = await requestAs(baseURL!, await cookieFor(browser, VISITORS.member));
	const answers = await fetchAll(aApi, urls, { withData: true });
	expect(answers.length).toBeGreaterThan(60);
	console.log(`never, exhibitors: ${answers.length} answers to exhibitor A checked for B's entry`);
	expect(leaks(answers, secretWords)).toEqual([]);

	// Direct addresses of B's things answer "not found" or "refused", never the thing.
	const direct: [string, number][] = [
		[`/my/entries/${b.entryId}`, 404],
		[`/my/entries/${b.entryId}/__data.json`, 404],
		[`/api/photos/${entryPhotoId}`, 403],
		[`/my/plants/${b.plantId}`, 404],
		[`/my/plants/${b.plantId}/edit`, 404],
		[`/my/plants/${b.plantId}/lineage`, 404],
		[`/my/plants/${b.plantId}/photos/${plantPhotoId}`, 404],
		[`/e/${params.slug}/${b.number}`, 403],
		[`/desk/${params.slug}/entries/${b.number}`, 403],
		[`/judging/entry/${b.entryId}`, 403],
		[`/judging/class/${b.classId}`, 403],
		[`/api/judging/classes/${b.classId}`, 403],
		[`/api/desk/shows/${params.slug}/entries`, 403],
		[`/shows/${params.slug}/results/results.csv`, 404]
	];
	expect(direct.map(([url]) => [url, statusOf(answers, url)])).toEqual(direct);

	// Nor can A change them: uploading to or deleting from B's entry and plant is refused.
	const refusedWrites = [
		await aApi.post(`/my/entries/${b.entryId}?/upload`, { multipart: { photo }, headers: html }),
		await aApi.post(`/my/entries/${b.entryId}?/deletePhoto`, {
			form: { photoId: entryPhotoId, confirm: 'yes' },
			headers: html
		}),
		await aApi.post(`/my/plants/${b.plantId}?/photo`, {
			multipart: { photo, caption: '' },
			headers: html
		}),
		await aApi.post(`/my/plants/${b.plantId}?/deletePhoto`, {
			form: { id: plantPhotoId, confirm: 'yes' },
			headers: html
		})
	];
	// A has no such entry or plant: 404, as if it did not exist.
	expect(refusedWrites.map((r) => r.status())).toEqual([404, 404, 404, 404]);
	const after = await withDb(async (db) => ({
		entry: (
			await db.query(`SELECT count(*)::int AS n FROM entry_photos WHERE entry_id = $1`, [b.entryId])
		).rows[0].n,
		plant: (
			await db.query(`SELECT count(*)::int AS n FROM plant_photos WHERE plant_id = $1`, [b.plantId])
		).rows[0].n
	}));
	expect(after).toEqual({ entry: 1, plant: 1 });
	await aApi.dispose();
	await bApi.dispose();
});

test('judges never receive an exhibitor’s name or address, on any judging page, answer or tag link', async ({
	browser,
	baseURL
}) => {
	test.setTimeout(120_000);
	const params = await loadParams();
	const show = await createJudgingShow(3);
	// Every exhibitor of both shows (the test show, and the spring show that judge1's panel judges).
	const { words, springClasses, springEntries } = await withDb(async (db) => {
		const people = await db.query<{ name: string; email: string }>(
			`SELECT DISTINCT u.name, u.email FROM entries e JOIN users u ON u.id = e.exhibitor_id
			  WHERE e.show_id = ANY($1::uuid[])`,
			[[show.showId, params.showId]]
		);
		const classes = await db.query<{ id: string }>(
			`SELECT DISTINCT pc.class_id AS id FROM panel_classes pc
			   JOIN panel_judges pj ON pj.panel_id = pc.panel_id
			   JOIN users u ON u.id = pj.user_id AND u.email = 'judge1@crownbench.test'
			   JOIN classes c ON c.id = pc.class_id AND c.show_id = $1`,
			[params.showId]
		);
		const entries = await db.query<{ id: string; number: number }>(
			`SELECT id, number FROM entries WHERE class_id = ANY($1::uuid[]) ORDER BY number LIMIT 30`,
			[classes.rows.map((c) => c.id)]
		);
		return {
			words: people.rows.flatMap((p) => [p.name, p.email]),
			springClasses: classes.rows.map((c) => c.id),
			springEntries: entries.rows
		};
	});
	expect(words.length).toBeGreaterThan(10);
	expect(springEntries.length).toBeGreaterThan(0);

	const judge = await requestAs(baseURL!, await cookieFor(browser, VISITORS.judge));
	const urls = ['/', '/home', '/judging', '/desk', '/my'];
	for (const s of [
		{
			slug: show.slug,
			classes: [show.classId, show.otherClassId],
			entries: [...show.entries, { id: show.otherEntryId, number: 99 }]
		},
		{ slug: params.slug, classes: springClasses, entries: springEntries }
	]) {
		urls.push(
			`/shows/${s.slug}`,
			`/shows/${s.slug}/results`,
			`/shows/${s.slug}/schedule.pdf`,
			`/desk/${s.slug}`,
			`/desk/${s.slug}/table`,
			`/desk/${s.slug}/tags?numbers=${s.entries.map((e) => e.number).join(',')}`,
			`/api/desk/shows/${s.slug}/entries`,
			`/chair/shows/${s.slug}/board`,
			`/api/chair/shows/${s.slug}/board`
		);
		for (const c of s.classes) urls.push(`/judging/class/${c}`, `/api/judging/classes/${c}`);
		for (const e of s.entries) {
			urls.push(`/judging/entry/${e.id}`, `/e/${s.slug}/${e.number}`);
			urls.push(`/desk/${s.slug}/entries/${e.number}`);
		}
	}
	// Redirects are followed: the tag link leads the judge to the entry's judging page.
	const answers = await fetchAll(judge, urls, { followRedirects: true, withData: true });
	expect(statusOf(answers, `/judging/class/${show.classId}`)).toBe(200);
	expect(statusOf(answers, `/e/${show.slug}/${show.entries[0].number}`)).toBe(200);
	expect(statusOf(answers, `/judging/entry/${show.otherEntryId}`)).toBe(403);

	// The offline queue's answers: a saved change, a replay of it and a stale change (409).
	const sheet = (changeId: string, comment: string) => ({
		changeId,
		entryId: show.entries[0].id,
		baseVersion: 0,
		deductions: {
			symmetry: 1,
			condition: 1,
			quantity_of_bloom: 1,
			size_and_type_of_blossom: 0.5,
			color_of_blossom: 0.5
		},
		comment
	});
	const first = randomUUID();
	const saves = [
		await judge.put('/api/judging/sheets', { data: sheet(first, 'Even rosette.') }),
		await judge.put('/api/judging/sheets', { data: sheet(first, 'Even rosette.') }),
		await judge.put('/api/judging/sheets', { data: sheet(randomUUID(), 'Later look.') })
	];
	expect(saves.map((r) => r.status())).toEqual([200, 200, 409]);
	for (const [i, r] of saves.entries()) answers.push(await read(r, `PUT sheets #${i + 1}`));

	expect(answers.length).toBeGreaterThan(80);
	console.log(
		`never, judges: ${answers.length} answers to a judge checked for ${words.length / 2} exhibitors`
	);
	expect(leaks(answers, words)).toEqual([]);

	// The names are there to be found: the chair's desk list of the same show holds them.
	const chair = await requestAs(baseURL!, await cookieFor(browser, VISITORS.chair));
	const desk = await fetchAll(chair, [`/api/desk/shows/${show.slug}/entries`]);
	expect(desk[0].status).toBe(200);
	expect(leaks(desk, show.exhibitorWords)).toHaveLength(1);
	await judge.dispose();
	await chair.dispose();
});

/** The show-specific addresses of a show: its pages, documents and APIs in every area. */
function showUrls(show: { slug: string; id: string; classId: string }): string[] {
	const s = show.slug;
	return [
		`/shows/${s}`,
		`/shows/${s}/schedule.pdf`,
		`/shows/${s}/results`,
		`/shows/${s}/results/results.csv`,
		`/my/shows/${s}`,
		`/chair/shows/${s}`,
		`/chair/shows/${s}/schedule`,
		`/chair/shows/${s}/panels`,
		`/chair/shows/${s}/board`,
		`/chair/shows/${s}/awards`,
		`/chair/shows/${s}/awards/rules`,
		`/chair/shows/${s}/audit`,
		`/chair/shows/${s}/results`,
		`/chair/shows/${s}/results/award-sheets.pdf`,
		`/desk/${s}`,
		`/desk/${s}/table`,
		`/desk/${s}/entries/1`,
		`/desk/${s}/tags?numbers=1`,
		`/e/${s}/1`,
		`/api/desk/shows/${s}/entries`,
		`/api/chair/shows/${s}/board`,
		`/api/chair/shows/${s}/results-mail`,
		`/judging/class/${show.classId}`,
		`/api/judging/classes/${show.classId}`
	];
}

/** Pages that list shows or societies: open to their visitors, but never naming a draft. */
const LISTS = ['/', '/home', '/my', '/chair', '/desk', '/admin', '/judging', '/chair/varieties'];

test('one society never sees another’s unpublished show, and the public sees neither', async ({
	browser,
	baseURL
}) => {
	test.setTimeout(120_000);
	// Cedar Ridge's draft show (demo seed: schedule not published; other-admin is its chair).
	const cedar = await withDb(async (db) => {
		const r = await db.query(
			`SELECT s.id, s.slug, s.name, s.venue, s.schedule_published_at, c.id AS class_id
			   FROM shows s JOIN societies so ON so.id = s.society_id AND so.slug = 'cedar-ridge'
			   JOIN classes c ON c.show_id = s.id ORDER BY c.position LIMIT 1`
		);
		return r.rows[0];
	});
	expect(cedar.schedule_published_at).toBeNull();
	// A draft of Larkspur Valley, judged but unpublished, made for this test.
	const own = await createJudgingShow(2);
	const venue = `Draft hall ${randomUUID().slice(0, 8)}`;
	await withDb((db) =>
		db.query(`UPDATE shows SET schedule_published_at = NULL, venue = $2 WHERE id = $1`, [
			own.showId,
			venue
		])
	);
	const drafts = {
		cedar: {
			urls: showUrls({ slug: cedar.slug, id: cedar.id, classId: cedar.class_id }),
			words: [cedar.slug, cedar.venue, cedar.id]
		},
		larkspur: {
			urls: showUrls({ slug: own.slug, id: own.showId, classId: own.classId }),
			words: [own.slug, venue, own.showId]
		}
	};
	// Who must not see which draft: the main society's people and the public see no Cedar Ridge
	// draft; Cedar Ridge's admin and chair and the public see no Larkspur Valley draft.
	const outsiders: { visitor: Visitor; draft: keyof typeof drafts }[] = [
		...(['anon', 'member', 'clerk', 'judge', 'chair', 'admin'] as const).map((visitor) => ({
			visitor,
			draft: 'cedar' as const
		})),
		{ visitor: 'other', draft: 'larkspur' },
		{ visitor: 'anon', draft: 'larkspur' }
	];
	const cookies: Partial<Record<Visitor, string>> = {};
	const problems: string[] = [];
	let checked = 0;
	for (const { visitor, draft } of outsiders) {
		const email = VISITORS[visitor];
		if (email && !cookies[visitor]) cookies[visitor] = await cookieFor(browser, email);
		const api = await requestAs(baseURL!, cookies[visitor]);
		const answers = await fetchAll(api, [...drafts[draft].urls, ...LISTS], { withData: true });
		for (const a of answers) {
			checked++;
			const path = a.url.split('?')[0].replace(/\/?__data\.json$/, '') || '/';
			const isList = LISTS.includes(path);
			if (!isList && ![303, 401, 403, 404, 405].includes(a.status))
				problems.push(`${visitor} ${a.url}: ${a.status}`);
		}
		for (const leak of leaks(answers, drafts[draft].words)) problems.push(`${visitor} ${leak}`);
		await api.dispose();
	}
	expect(checked).toBeGreaterThan(300);
	console.log(`never, societies: ${checked} answers about the other society's draft checked`);
	expect(problems).toEqual([]);

	// The words are there to be found: each society's own chair sees its draft.
	const checks: [string | undefined, string, string][] = [
		[cookies.other, `/chair/shows/${cedar.slug}`, cedar.slug],
		[cookies.chair, `/chair/shows/${own.slug}`, own.slug]
	];
	for (const [cookie, url, word] of checks) {
		const api = await requestAs(baseURL!, cookie);
		const [answer] = await fetchAll(api, [url]);
		expect(answer.status).toBe(200);
		expect(wordsIn(answer.body, [word])).toEqual([word]);
		await api.dispose();
	}
});

test('only the show’s chair publishes the schedule and the results', async ({
	browser,
	baseURL
}) => {
	test.setTimeout(120_000);
	const show = await createJudgingShow(2);
	await withDb((db) =>
		db.query(`UPDATE shows SET schedule_published_at = NULL WHERE id = $1`, [show.showId])
	);
	const state = () =>
		withDb(async (db) => {
			const r = await db.query(
				`SELECT s.schedule_published_at IS NOT NULL AS schedule,
				        s.results_published_at IS NOT NULL AS results,
				        (SELECT count(*)::int FROM awards a WHERE a.show_id = s.id) AS awards,
				        (SELECT count(*)::int FROM outbox_messages o WHERE o.show_id = s.id) AS mail
				   FROM shows s WHERE s.id = $1`,
				[show.showId]
			);
			return r.rows[0];
		});
	const nothing = { schedule: false, results: false, awards: 0, mail: 0 };
	expect(await state()).toEqual(nothing);

	const publish = async (api: APIRequestContext) => [
		// As a plain browser form sends them (no script): accept HTML.
		(
			await api.post(`/chair/shows/${show.slug}?/publish`, {
				form: { published: 'yes' },
				headers: { accept: 'text/html' },
				maxRedirects: 0
			})
		).status(),
		(
			await api.post(`/chair/shows/${show.slug}/awards?/publish`, {
				form: { allowIncomplete: 'on', confirm: 'yes' },
				headers: { accept: 'text/html' },
				maxRedirects: 0
			})
		).status()
	];
	const refused: Visitor[] = ['anon', 'admin', 'clerk', 'judge', 'member', 'other'];
	const answers: Record<string, number[]> = {};
	for (const visitor of refused) {
		const email = VISITORS[visitor];
		const api = await requestAs(baseURL!, email ? await cookieFor(browser, email) : undefined);
		answers[visitor] = await publish(api);
		await api.dispose();
	}
	expect(answers).toEqual({
		anon: [303, 303], // to sign-in
		admin: [403, 403],
		clerk: [403, 403],
		judge: [403, 403],
		member: [403, 403],
		other: [403, 403] // chair of another society
	});
	expect(await state()).toEqual(nothing);

	// The show's own chair can: the same requests publish both (so the refusals above mean it).
	const chair = await requestAs(baseURL!, await cookieFor(browser, VISITORS.chair));
	expect(await publish(chair)).toEqual([200, 200]);
	const published = await state();
	expect(published).toMatchObject({ schedule: true, results: true });
	await chair.dispose();
});

test('an exhibitor never receives a score, ribbon or comment before results are public, nor another exhibitor’s comment after', async ({
	browser,
	baseURL
}) => {
	test.setTimeout(180_000);
	const params = await loadParams();
	const tag = randomUUID().slice(0, 8);
	// A judged show of its own: exhibitor1 (A) and exhibitor2 (B) each have one scored entry with
	// a comment; A's entry is of a plant of A's collection.
	const show = await createJudgingShow(2);
	const words = { a: `Own remark ${tag}`, b: `Rival remark ${tag}` };
	const aPlant = randomUUID();
	const sheet = {
		symmetry: 3,
		condition: 0,
		quantity_of_bloom: 0,
		size_and_type_of_blossom: 0,
		color_of_blossom: 0
	};
	await withDb(async (db) => {
		const judge = (await db.query(`SELECT id FROM users WHERE email = 'judge1@crownbench.test'`))
			.rows[0].id;
		for (const [i, text] of [words.a, words.b].entries()) {
			await db.query(
				`INSERT INTO score_sheets (show_id, entry_id, kind, judge_id, deductions, comment)
				 VALUES ($1, $2, 'judge', $3, $4::jsonb, $5)`,
				[show.showId, show.entries[i].id, judge, JSON.stringify(sheet), text]
			);
		}
		const entry = (
			await db.query(`SELECT exhibitor_id, variety_id FROM entries WHERE id = $1`, [
				show.entries[0].id
			])
		).rows[0];
		await db.query(
			`INSERT INTO plants (id, owner_id, variety_id, obtained_how, obtained_on)
			 VALUES ($1, $2, $3, 'bought', current_date - 300)`,
			[aPlant, entry.exhibitor_id, entry.variety_id]
		);
		await db.query(`UPDATE entries SET plant_id = $2 WHERE id = $1`, [show.entries[0].id, aPlant]);
		await db.query(`UPDATE shows SET share_points_lost = true WHERE id = $1`, [show.showId]);
	});
	// A's own ids in every GET address of the access table, and this show's slug.
	const own: Record<string, string> = {
		memberEntryId: show.entries[0].id,
		entryId: show.entries[0].id,
		id: show.entries[0].id,
		plantId: aPlant,
		slug: show.slug,
		classId: show.classId,
		number: String(show.entries[0].number)
	};
	const urls = ACCESS_TABLE.filter(
		(row) => (row.method ?? 'GET') === 'GET' && !row.route.startsWith('/dev/')
	).map((row) => {
		const values: Record<string, string> = { ...params, ...row.params, ...own };
		const query = row.query?.replace(/\$(\w+)/g, (_, k: string) => values[k]);
		return fillRoute(row.route, values) + (query ? `?${query}` : '');
	});
	urls.push(`/my/plants/readiness?show=${params.showId}`);
	const aCookie = await cookieFor(browser, 'exhibitor1@crownbench.test');
	let a = await requestAs(baseURL!, aCookie);
	// A score of 97 (100 less 3 on symmetry) and its points lost, written as the pages write them.
	const scoreWords = [words.a, words.b, 'symmetry or leaf pattern 3 of 25', 'Points lost per'];

	const before = await fetchAll(a, urls, { withData: true });
	expect(before.length).toBeGreaterThan(60);
	expect(leaks(before, scoreWords)).toEqual([]);
	const entryPage = before.find((x) => x.url === `/my/entries/${show.entries[0].id}`);
	expect(entryPage?.status).toBe(200);
	expect(wordsIn(entryPage!.body, ['has not published'])).toHaveLength(1);

	const chair = await requestAs(baseURL!, await cookieFor(browser, VISITORS.chair));
	const published = await chair.post(`/chair/shows/${show.slug}/awards?/publish`, {
		form: { allowIncomplete: 'on', confirm: 'yes' },
		headers: { accept: 'text/html' },
		maxRedirects: 0
	});
	expect(published.status()).toBe(200);
	await chair.dispose();

	// A fresh context: the first one's kept-alive connections may have been closed meanwhile.
	await a.dispose();
	a = await requestAs(baseURL!, aCookie);
	const after = await fetchAll(a, urls, { withData: true });
	console.log(
		`never, results: ${before.length + after.length} answers to an exhibitor checked before and after publishing`
	);
	// A's own comment is there to be found (so B's would be caught), B's is nowhere.
	expect(leaks(after, [words.a]).length).toBeGreaterThan(0);
	expect(leaks(after, [words.b])).toEqual([]);
	await a.dispose();
});
