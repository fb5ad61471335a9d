import { randomUUID } from 'node:crypto';
import { expect, test, type Page } from '@playwright/test';
import { loadParams } from './access/params';
import { VISITORS } from './access/people';
import { expectAccessible } from './support/axe';
import { createJudgingShow, withDb, type JudgingShow } from './support/judging-fixture';
import { signIn } from './support/session';
import { cookieFor, requestAs } from './support/visitors';

// A show of its own (support/judging-fixture.ts): class 1 judged by judge1 alone, merit ribbons
// at blue 90, red 80, white 70 (national handbook, from memory), the single-crown standard scale
// (symmetry 25, condition 25, quantity of bloom 25, size and type of blossom 15, color 10; "A
// Beginner's Guide to Judging", African Violet Magazine, May/June 1993, rev. 2020). Sheets are
// written straight to the database, as a judge's tablet would have saved them:
//   exhibitor3: symmetry 2, condition 1 lost → 97: blue ribbon, best in class (the only blue)
//   exhibitor2: 15 lost → 85: red ribbon
//   exhibitor1: 25 lost → 75: white ribbon
//   exhibitor4: 35 lost → 65: no ribbon
test.describe.configure({ mode: 'serial' });

const OWN = 'exhibitor3@crownbench.test';
let show: JudgingShow;
let tag: string;
let ownEntry: string;
let otherEntry: string;
let plantId: string;
const showName = () => `Judging test show ${show.slug.replace('judging-test-', '')}`;
const comment = (who: string) => `${who} note ${tag}`;

/** A whole sheet (a judge's tablet sends every criterion): the points lost given, 0 elsewhere. */
const sheet = (lost: Record<string, number>) => ({
	symmetry: 0,
	condition: 0,
	quantity_of_bloom: 0,
	size_and_type_of_blossom: 0,
	color_of_blossom: 0,
	...lost
});

/** Writes judge1's sheet for each entry and gives exhibitor3's entry a plant of their own. */
async function scoreShow(): Promise<void> {
	tag = randomUUID().slice(0, 8);
	show = await createJudgingShow(4);
	const lost: Record<string, number>[] = [
		{ symmetry: 10, condition: 10, quantity_of_bloom: 5 },
		{ symmetry: 5, condition: 5, quantity_of_bloom: 5 },
		{ symmetry: 2, condition: 1 },
		{ symmetry: 10, condition: 10, quantity_of_bloom: 10, color_of_blossom: 5 }
	];
	await withDb(async (db) => {
		const judge = (await db.query(`SELECT id FROM users WHERE email = 'judge1@crownbench.test'`))
			.rows[0].id;
		for (const [i, e] of show.entries.entries()) {
			await db.query(
				`INSERT INTO score_sheets (show_id, entry_id, kind, judge_id, deductions, comment)
				 VALUES ($1, $2, 'judge', $3, $4::jsonb, $5)`,
				[show.showId, e.id, judge, JSON.stringify(sheet(lost[i])), comment(`exhibitor${i + 1}`)]
			);
		}
		ownEntry = show.entries[2].id;
		otherEntry = show.entries[1].id;
		const entry = (
			await db.query(`SELECT exhibitor_id, variety_id FROM entries WHERE id = $1`, [ownEntry])
		).rows[0];
		plantId = randomUUID();
		await db.query(
			`INSERT INTO plants (id, owner_id, variety_id, label, obtained_how, obtained_on)
			 VALUES ($1, $2, $3, $4, 'bought', current_date - 400)`,
			[plantId, entry.exhibitor_id, entry.variety_id, `Bench ${tag}`]
		);
		await db.query(`UPDATE entries SET plant_id = $2 WHERE id = $1`, [ownEntry, plantId]);
	});
}

/** The page's text, for "never contains" checks. */
const textOf = (page: Page) => page.locator('body').innerText();

/** True when the page, or a table's box within it, scrolls sideways at its current width. */
const scrollsSideways = (page: Page) =>
	page.evaluate(
		() =>
			document.documentElement.scrollWidth > window.innerWidth ||
			[...document.querySelectorAll('div')].some(
				(d) => getComputedStyle(d).overflowX === 'auto' && d.scrollWidth > d.clientWidth
			)
	);

test('before results are published, the exhibitor sees no score, ribbon or comment', async ({
	page
}) => {
	test.setTimeout(120_000);
	await scoreShow();
	await signIn(page, OWN);
	await page.goto(`/my/entries/${ownEntry}`);
	await expect(page.getByRole('heading', { name: 'Results' })).toBeVisible();
	await expect(page.getByText('has not published this show’s results yet')).toBeVisible();
	for (const url of [
		`/my/entries/${ownEntry}`,
		'/my',
		'/my/record',
		`/my/plants/${plantId}`,
		'/my/plants/readiness',
		'/my/society-record'
	]) {
		await page.goto(url);
		const text = await textOf(page);
		expect(text, url).not.toContain(`note ${tag}`);
		expect(text, url).not.toMatch(/points lost per criterion/i);
	}
	await page.goto(`/my/entries/${ownEntry}`);
	expect(await textOf(page)).not.toContain('97');
	expect(await textOf(page)).not.toContain('Blue ribbon');
	await page.goto('/my');
	const table = page.getByRole('table', { name: `My entries in ${showName()}` });
	await expect(table.getByRole('row').nth(1)).toContainText('Not yet');
});

test('after publishing, the exhibitor sees their own score, ribbon, comment and points lost, and no one else’s', async ({
	page,
	browser,
	baseURL
}) => {
	test.setTimeout(120_000);
	// The chair shares the points lost (show settings), then publishes.
	const chairPage = await (await browser.newContext()).newPage();
	await signIn(chairPage, VISITORS.chair);
	await chairPage.goto(`/chair/shows/${show.slug}`);
	await chairPage.getByLabel('the points lost on each criterion of the scale').check();
	await chairPage.getByRole('button', { name: 'Save this choice' }).click();
	await expect(chairPage.getByText('Exhibitors will see the points lost')).toBeVisible();
	await expectAccessible(chairPage);
	await chairPage.context().close();
	const chair = await requestAs(baseURL!, await cookieFor(browser, VISITORS.chair));
	const published = await chair.post(`/chair/shows/${show.slug}/awards?/publish`, {
		form: { allowIncomplete: 'on', confirm: 'yes' },
		headers: { accept: 'text/html' },
		maxRedirects: 0
	});
	expect(published.status()).toBe(200);
	await chair.dispose();

	await signIn(page, OWN);
	await page.goto(`/my/entries/${ownEntry}`);
	await expect(page.getByTestId('result-score')).toHaveText('97');
	await expect(page.getByTestId('result-award')).toHaveText('Best in class, Blue ribbon');
	await expect(page.getByText(comment('exhibitor3'))).toBeVisible();
	const lost = page.getByRole('table', { name: /Points lost per criterion/ });
	await expect(lost.getByRole('row', { name: 'Symmetry or leaf pattern 25 2' })).toBeVisible();
	await expect(lost.getByRole('row', { name: 'Condition 25 1' })).toBeVisible();
	await expect(lost.getByRole('row', { name: 'All criteria 3' })).toBeVisible();
	await expectAccessible(page);
	// Another exhibitor's entry is not found, and their comment is nowhere on my pages.
	const other = await page.goto(`/my/entries/${otherEntry}`);
	expect(other?.status()).toBe(404);
	for (const url of ['/my', '/my/record', `/my/plants/${plantId}`, '/my/society-record']) {
		await page.goto(url);
		expect(await textOf(page), url).not.toContain(comment('exhibitor2'));
	}

	// /my: the show with its ribbons.
	await page.goto('/my');
	await expect(page.getByText(/1 blue ribbon/).first()).toBeVisible();
	const table = page.getByRole('table', { name: `My entries in ${showName()}` });
	await expect(table.getByRole('row').nth(1)).toContainText('Best in class, Blue ribbon (97)');

	// The record: by year, by variety, best scores, with a chart.
	await page.goto('/my/record');
	await expect(page.getByRole('img', { name: /My ribbons and places by year/ })).toBeVisible();
	const best = page.getByRole('table', { name: 'My best scores' });
	await expect(best.getByRole('row', { name: new RegExp(`97 .*${showName()}`) })).toBeVisible();
	await expect(page.getByRole('table', { name: 'My results by year' })).toBeVisible();
	await expectAccessible(page);

	// The plant's show history beside its family.
	await page.goto(`/my/plants/${plantId}`);
	const history = page.getByRole('region', { name: 'Show history' });
	await expect(history).toContainText(`${showName()}`);
	await expect(history).toContainText(comment('exhibitor3'));
	await expect(page.getByRole('region', { name: 'Plant and family' })).toBeVisible();
	await expectAccessible(page);

	// The readiness check: what the judges marked down last time.
	const params = await loadParams();
	await page.goto(`/my/plants/readiness?show=${params.showId}`);
	const card = page.getByRole('listitem').filter({ hasText: `Bench ${tag}` });
	await expect(card).toContainText(`Last time: ${showName()}`);
	await expect(card).toContainText(
		'The judges marked down: symmetry or leaf pattern 2 of 25; condition 1 of 25.'
	);

	// The society's record: the variety is counted; the CSV is for members only.
	await page.goto('/my/society-record');
	await expect(page.getByRole('table', { name: 'Varieties by entries' })).toBeVisible();
	await expect(page.getByRole('img', { name: /Varieties entered most/ })).toBeVisible();
	await expectAccessible(page);
	const csv = await page.request.get('/my/society-record/record.csv?society=larkspur-valley');
	expect(csv.status()).toBe(200);
	const text = await csv.text();
	expect(text).toContain('variety,shows,entries,placed');
	expect(text).not.toContain(tag);
	const anon = await requestAs(baseURL!);
	expect((await anon.get('/my/society-record/record.csv', { maxRedirects: 0 })).status()).toBe(303);
	await anon.dispose();
});

test('public results and my pages read on a phone without sideways scrolling', async ({
	browser
}) => {
	test.setTimeout(120_000);
	const context = await browser.newContext({ viewport: { width: 390, height: 844 } });
	const page = await context.newPage();
	for (const url of [`/shows/${show.slug}/results`, `/shows/${show.slug}`]) {
		await page.goto(url);
		expect(await scrollsSideways(page), url).toBe(false);
		expect(await page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(
			390
		);
	}
	// Each result is readable as a whole: entry, variety, exhibitor, score and award.
	const class1 = page.getByRole('table', { name: /Class 1:/ });
	await page.goto(`/shows/${show.slug}/results`);
	await expect(class1.getByRole('row', { name: /97 Best in class, Blue ribbon/ })).toBeVisible();
	await expectAccessible(page);
	if (process.env.CB_SHOT) await page.screenshot({ path: process.env.CB_SHOT, fullPage: true });
	await signIn(page, OWN);
	for (const url of [
		`/shows/${show.slug}/results`,
		`/my/entries/${ownEntry}`,
		'/my',
		'/my/record',
		'/my/society-record',
		`/my/plants/${plantId}`
	]) {
		await page.goto(url);
		expect(await scrollsSideways(page), url).toBe(false);
	}
	await context.close();
});
