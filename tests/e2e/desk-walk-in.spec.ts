import { randomUUID } from 'node:crypto';
import { expect, test, type Page } from '@playwright/test';
import { expectAccessible } from './support/axe';
import { withDb } from './support/judging-fixture';
import { signIn } from './support/session';

// A tablet held in landscape at the desk.
test.use({ viewport: { width: 1024, height: 768 } });

/** Saves the chair's choice of the desk's new entries and waits for the page to say it. */
async function saveDeskChoice(chair: Page, saidAs: string): Promise<void> {
	await chair
		.locator('form[action="?/deskEntries"]')
		.getByRole('button', { name: 'Save the desk’s choice' })
		.click();
	await expect(chair.getByText(`New entries at the desk: ${saidAs}`)).toBeVisible();
}

/**
 * A show of the demo society on its entry day (judging tomorrow), open to non-members, with
 * one horticulture class on the published default scale, judged by one panel whose clerk is
 * clerk@ and whose sheets are the panel's own (consensus). No entries yet.
 */
async function createEntryDayShow(): Promise<{ slug: string; variety: string }> {
	return withDb(async (db) => {
		const one = async (sql: string, params: unknown[] = []) =>
			(await db.query(sql, params)).rows[0];
		const tag = randomUUID().slice(0, 8);
		const society = await one(`SELECT id FROM societies WHERE slug = 'larkspur-valley'`);
		const scale = await one(
			`SELECT id FROM scales WHERE society_id IS NULL ORDER BY created_at LIMIT 1`
		);
		const clerk = await one(`SELECT id FROM users WHERE email = 'clerk@crownbench.test'`);
		const variety = await one(
			`SELECT id, name FROM varieties WHERE society_id = $1 AND size_class = 'standard'
			   AND habit = 'single_crown' AND NOT is_species ORDER BY name LIMIT 1`,
			[society.id]
		);
		const showId = randomUUID();
		const slug = `entry-day-${tag}`;
		await db.query(
			`INSERT INTO shows (id, society_id, name, slug, entries_open, entries_close, entry_day, judging_day,
			                    panel_score_method, require_good_standing, possession_months, schedule_published_at)
			 VALUES ($1, $2, $3, $4, current_date - 30, current_date - 5, current_date, current_date + 1,
			         'consensus', false, 0, now())`,
			[showId, society.id, `Entry day show ${tag}`, slug]
		);
		const division = randomUUID();
		await db.query(
			`INSERT INTO divisions (id, show_id, code, name, position) VALUES ($1, $2, 'I', 'Standards', 1)`,
			[division, showId]
		);
		const classId = randomUUID();
		await db.query(
			`INSERT INTO classes (id, show_id, division_id, code, name, position, scale_id)
			 VALUES ($1, $2, $3, '1', 'Standards, any blossom', 1, $4)`,
			[classId, showId, division, scale.id]
		);
		const panel = randomUUID();
		await db.query(
			`INSERT INTO panels (id, show_id, name, clerk_id) VALUES ($1, $2, 'Bench One', $3)`,
			[panel, showId, clerk.id]
		);
		await db.query(`INSERT INTO panel_classes (class_id, panel_id) VALUES ($1, $2)`, [
			classId,
			panel
		]);
		return { slug, variety: variety.name as string };
	});
}

test('a walk-in exhibitor enters at the desk, is judged on paper, placed, and finds the entry after signing in', async ({
	browser
}) => {
	test.setTimeout(180_000);
	const { slug, variety } = await createEntryDayShow();
	const tag = randomUUID().slice(0, 6);
	const walkIn = { name: `Juniper Quillfeather ${tag}`, email: `walk-in-${tag}@crownbench.test` };

	// The clerk enters the walk-in's plant at the desk.
	const clerkContext = await browser.newContext();
	const clerk = await clerkContext.newPage();
	await signIn(clerk, 'clerk@crownbench.test');
	await clerk.goto(`/desk/${slug}`);
	await expect(clerk.getByRole('group', { name: 'Number pad for the entry number' })).toBeVisible();
	await expect(clerk.getByRole('button', { name: 'Scan a tag’s code' })).toBeVisible();
	await expectAccessible(clerk);
	await clerk.getByRole('link', { name: 'Enter a plant at the desk' }).click();
	await expect(
		clerk.getByRole('heading', { level: 1, name: 'Enter a plant at the desk' })
	).toBeVisible();
	await expectAccessible(clerk);

	const search = clerk.getByLabel('Find a variety');
	await search.fill(variety);
	await clerk
		.getByRole('listitem')
		.filter({ hasText: variety })
		.getByRole('button', { name: /Choose/ })
		.first()
		.click();
	await expect(clerk.getByText(`Variety: ${variety}`)).toBeVisible();
	await clerk.getByLabel('A walk-in exhibitor without an account').check();
	await clerk.getByLabel('Class').selectOption({ label: '1 Standards, any blossom' });
	await clerk.getByLabel('Diameter (in)').fill('11');
	await clerk.getByLabel('Crowns').fill('1');
	await clerk.getByLabel('Pot size (in)').fill('4');

	// A walk-in without a name is refused with its reason; nothing is entered.
	await clerk.getByRole('button', { name: 'Enter and check in' }).click();
	await expect(clerk.getByText('Write the walk-in exhibitor’s name.')).toBeVisible();
	await expect(clerk.getByText('Check the marked fields; nothing was entered.')).toBeVisible();
	const entries = await withDb(
		async (db) =>
			(
				await db.query(
					`SELECT count(*)::int AS n FROM entries e JOIN shows s ON s.id = e.show_id WHERE s.slug = $1`,
					[slug]
				)
			).rows[0].n
	);
	expect(entries).toBe(0);

	// A single crown with a sucker: the desk says why and what to do (state council show rules 2018, DOMAIN.md).
	await clerk.getByLabel('Walk-in’s name').fill(walkIn.name);
	await clerk.getByLabel('Walk-in’s e-mail address (optional)').fill(walkIn.email);
	await clerk.getByLabel('Walk-in’s household (optional)').fill(`Quillfeather ${tag}`);
	await clerk.getByLabel('Crowns').fill('2');
	await clerk.getByRole('button', { name: 'Enter and check in' }).click();
	await expect(
		clerk.getByText('The plant does not fit the class; nothing was entered.')
	).toBeVisible();
	await expect(clerk.getByText(/the 1 sucker must come off/)).toBeVisible();
	await expect(clerk.getByText(/The sucker must come off before judging/)).toBeVisible();
	await expectAccessible(clerk);

	// The sucker comes off: one crown, and the plant is entered and checked in.
	await clerk.getByLabel('Crowns').fill('1');
	await clerk.getByRole('button', { name: 'Enter and check in' }).click();
	await expect(clerk.getByText(/is entered and checked in/)).toBeVisible();
	const heading = await clerk.getByRole('heading', { level: 1 }).textContent();
	const number = Number(heading!.match(/Entry (\d+)/)![1]);
	// Numbers are fixed in shuffled order from at least two digits (never 1, 2, 3…).
	expect(number).toBeGreaterThanOrEqual(10);
	await expect(clerk.getByText(walkIn.name)).toBeVisible();

	// The desk finds it by typing its number.
	await clerk.goto(`/desk/${slug}?q=${number}`);
	await expect(clerk.getByRole('link', { name: String(number), exact: true })).toBeVisible();

	// Tablets failed: the judging sheet prints, and the panel's clerk types the panel's sheet in.
	const sheet = await clerk.request.get(`/desk/${slug}/paper/sheets`);
	expect(sheet.status()).toBe(200);
	expect(sheet.headers()['content-type']).toBe('application/pdf');
	await clerk.goto(`/desk/${slug}/paper`);
	await expectAccessible(clerk);
	await clerk.getByRole('link', { name: /Type in the paper sheet/ }).click();
	await expect(
		clerk.getByRole('heading', { level: 1, name: 'Type in the paper sheet of class 1' })
	).toBeVisible();
	const boxes = clerk.locator('input[inputmode="decimal"]');
	await expect(boxes.first()).toBeVisible();
	const count = await boxes.count();
	expect(count).toBeGreaterThan(1);
	// One point below the most on every criterion (the default scale totals 100: DOMAIN.md).
	for (let i = 0; i < count; i++) {
		const label = (await boxes.nth(i).getAttribute('aria-label'))!;
		expect(label).toContain(`Entry ${number},`);
		const most = Number(label.match(/points of (\d+)/)![1]);
		await boxes.nth(i).fill(String(most - 1));
	}
	await clerk.getByLabel(`Entry ${number}, comment`).fill('Even rosette, fresh bloom.');
	await expectAccessible(clerk);
	await clerk.getByRole('button', { name: /Save the panel/ }).click();
	await expect(clerk.getByText('Saved 1 sheets of class 1.')).toBeVisible();
	await clerkContext.close();

	// The chair publishes the results; the walk-in is placed under their name.
	const chairContext = await browser.newContext();
	const chair = await chairContext.newPage();
	await signIn(chair, 'chair@crownbench.test');
	await chair.goto(`/chair/shows/${slug}/awards`);
	await expect(chair.locator('tr', { hasText: String(number) }).first()).toBeVisible();
	await chair.getByRole('button', { name: 'Publish results' }).click();
	await chair.getByRole('button', { name: 'Yes, publish the results' }).click();
	await expect(chair.getByText('Scores are locked.').first()).toBeVisible();
	await chairContext.close();

	const visitorContext = await browser.newContext();
	const visitor = await visitorContext.newPage();
	await visitor.goto(`/shows/${slug}/results`);
	await expect(visitor.getByRole('row', { name: new RegExp(walkIn.name) }).first()).toBeVisible();
	await visitorContext.close();

	// The walk-in signs in with the address they gave and finds the entry as their own.
	const walkInContext = await browser.newContext();
	const own = await walkInContext.newPage();
	await signIn(own, walkIn.email, { fresh: true });
	await own.goto('/home');
	await expect(own.getByRole('heading', { name: 'Your entries' })).toBeVisible();
	await expect(
		own.getByText(`entry ${number}, ${variety}, class 1 Standards, any blossom`)
	).toBeVisible();
	await expect(own.getByRole('link', { name: /Results of Entry day show/ })).toBeVisible();
	await expectAccessible(own);
	const claimed = await withDb(
		async (db) =>
			(await db.query(`SELECT claimed_at FROM walk_in_exhibitors WHERE email = $1`, [walkIn.email]))
				.rows[0]
	);
	expect(claimed.claimed_at).not.toBeNull();
	await walkInContext.close();
});

test('the chair decides until when the desk takes new entries, and the desk says so', async ({
	browser
}) => {
	const { slug } = await createEntryDayShow();
	const chairContext = await browser.newContext();
	const chair = await chairContext.newPage();
	await signIn(chair, 'chair@crownbench.test');
	await chair.goto(`/chair/shows/${slug}`);
	const card = chair.getByRole('group', { name: /the desk enters plants never entered online/ });
	await expect(card.getByLabel('Until judging starts (the first score of the show)')).toBeChecked();
	// A choice made while the page still starts up is set back by its scripts: choose until it holds.
	const choose = (label: string) =>
		expect(async () => {
			await card.getByLabel(label).check();
			await expect(card.getByLabel(label)).toBeChecked();
		}).toPass();
	await choose('The desk takes no new entries');
	await saveDeskChoice(chair, 'The desk takes no new entries.');
	await expectAccessible(chair);

	const clerkContext = await browser.newContext();
	const clerk = await clerkContext.newPage();
	await signIn(clerk, 'clerk@crownbench.test');
	await clerk.goto(`/desk/${slug}/enter`);
	await expect(clerk.getByText('This show takes no entries at the desk.')).toBeVisible();
	await expect(clerk.getByLabel('Find a member by name')).toHaveCount(0);

	// Until the end of entry day (today): the desk takes entries again.
	await chair.reload();
	await choose('Until the end of entry day');
	await saveDeskChoice(chair, 'Until the end of entry day.');
	await clerk.reload();
	await expect(clerk.getByLabel('Find a member by name')).toBeVisible();
	await chairContext.close();
	await clerkContext.close();
});

test('a choice the chair taps before the page’s scripts have started is kept when they start', async ({
	browser
}) => {
	const { slug } = await createEntryDayShow();
	const context = await browser.newContext();
	const chair = await context.newPage();
	await signIn(chair, 'chair@crownbench.test');
	// Hold the page's scripts back, as a slow hall network does, while the chair taps a choice.
	let release: () => void = () => {};
	const held = new Promise<void>((resolve) => (release = resolve));
	await chair.route('**/_app/immutable/**/*.js', async (route) => {
		await held;
		await route.continue();
	});
	await chair.goto(`/chair/shows/${slug}`, { waitUntil: 'commit' });
	const card = chair.getByRole('group', { name: /the desk enters plants never entered online/ });
	await card.getByLabel('The desk takes no new entries').check();
	release();
	await chair.waitForLoadState('networkidle');
	await expect(card.getByLabel('The desk takes no new entries')).toBeChecked();
	await saveDeskChoice(chair, 'The desk takes no new entries.');
	await context.close();
});
