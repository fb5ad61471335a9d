import { expect, test, type Page, type Response } from '@playwright/test';
import { expectAccessible } from './support/axe';
import { createJudgingShow, withDb } from './support/judging-fixture';
import { changesOf, score } from './support/scoresheet';
import { signIn } from './support/session';

// A tablet held in portrait, with the service worker as a judge's tablet has it.
test.use({ viewport: { width: 768, height: 1024 }, serviceWorkers: 'allow' });

/** Deductions per entry and the totals they give on the published scale (100 less the sum). */
const SHEETS: { deduct: number[]; total: number; ribbon: string }[] = [
	{ deduct: [1, 1.5, 1, 1, 0.5], total: 95, ribbon: 'Blue ribbon' },
	{ deduct: [3, 4, 4, 2, 2], total: 85, ribbon: 'Red ribbon' },
	{ deduct: [2, 2, 2, 1.5, 0.5], total: 92, ribbon: 'Blue ribbon' },
	{ deduct: [6, 6, 7, 4, 2], total: 75, ribbon: 'White ribbon' }
];

/** Keeps the body of every page and data answer the judge's browser receives. */
function recordAnswers(page: Page): Promise<string>[] {
	const bodies: Promise<string>[] = [];
	page.on('response', (response: Response) => {
		const type = response.headers()['content-type'] ?? '';
		if (/html|json|javascript|text\/plain/.test(type)) {
			bodies.push(response.text().catch(() => ''));
		}
	});
	return bodies;
}

test('a judge scores a class on a tablet, offline for part of it, and the board and awards match', async ({
	page,
	context,
	browser
}) => {
	const show = await createJudgingShow(4);
	const answers = recordAnswers(page);
	await signIn(page, 'judge1@crownbench.test');

	await page.goto('/judging');
	await page
		.getByRole('link', { name: /Class 1 Standards, any blossom/ })
		.first()
		.click();
	await expect(page.getByRole('heading', { level: 1, name: 'Class 1' })).toBeVisible();
	await expectAccessible(page);
	await page.goto(`/judging/class/${show.classId}`);
	await page.getByRole('link', { name: new RegExp(`Entry ${show.entries[0].number}\\b`) }).click();
	await expect(
		page.getByRole('heading', { level: 1, name: `Entry ${show.entries[0].number}` })
	).toBeVisible();
	await expectAccessible(page);

	// Touch targets of at least 44 px on the scoresheet (a radio button's target is its label).
	const targets = page.locator(
		'main button, main input:not([type=radio]), main select, main label:has(input[type=radio])'
	);
	for (const target of await targets.all()) {
		const box = await target.boundingBox();
		if (box) expect(box.height).toBeGreaterThanOrEqual(44);
	}

	// Online: two entries, every change saved without a button.
	const sync = page.locator('[data-sync]');
	await score(page, SHEETS[0].deduct);
	await expect(sync).toHaveAttribute('data-sync', 'saved');
	await page.getByRole('button', { name: 'Next entry' }).click();
	await score(page, SHEETS[1].deduct);
	await expect(sync).toHaveAttribute('data-sync', 'saved');

	// The chair watches the board in another browser.
	const chairContext = await browser.newContext({ viewport: { width: 1280, height: 800 } });
	const chair = await chairContext.newPage();
	await signIn(chair, 'chair@crownbench.test');
	await chair.goto(`/chair/shows/${show.slug}/board`);
	// Two entries of class 1 left, and the entry of class 2, which has no panel yet.
	await expect(chair.getByTestId('entries-left')).toHaveText('3');
	await expectAccessible(chair);

	// The network goes; the judge keeps scoring, moving between entries without the server.
	await context.setOffline(true);
	await page.getByRole('button', { name: 'Next entry' }).click();
	await expect(
		page.getByRole('heading', { level: 1, name: `Entry ${show.entries[2].number}` })
	).toBeVisible();
	await score(page, SHEETS[2].deduct);
	await page.getByRole('button', { name: 'Next entry' }).click();
	await score(page, SHEETS[3].deduct);
	await expect(sync).toHaveAttribute('data-sync', 'waiting');
	await expect(sync).toContainText(
		`Waiting to send ${changesOf(SHEETS[2]) + changesOf(SHEETS[3])} changes`
	);
	const whileOffline = await withDb(
		async (db) =>
			(
				await db.query(
					'SELECT count(*)::int AS n FROM score_sheets WHERE entry_id = ANY($1::uuid[])',
					[[show.entries[2].id, show.entries[3].id]]
				)
			).rows[0].n as number
	);
	expect(whileOffline).toBe(0);

	// The network returns: the waiting changes are sent, each once.
	await context.setOffline(false);
	await expect(sync).toHaveAttribute('data-sync', 'saved', { timeout: 20_000 });
	const stored = await withDb(
		async (db) =>
			(
				await db.query(
					`SELECT e.number, s.version, (SELECT count(*)::int FROM score_audit a WHERE a.sheet_id = s.id) AS audits
					   FROM score_sheets s JOIN entries e ON e.id = s.entry_id
					  WHERE s.show_id = $1 ORDER BY e.number`,
					[show.showId]
				)
			).rows
	);
	// Five criteria per entry, the last by half points: one version and one audit row per change.
	expect(stored).toEqual(
		SHEETS.map((s, i) => ({
			number: show.entries[i].number,
			version: changesOf(s),
			audits: changesOf(s)
		}))
	);

	// The board follows without a reload; the awards match the scores.
	await expect(chair.getByTestId('entries-left')).toHaveText('1', { timeout: 15_000 });
	await expect(chair.getByTestId('classes-judged')).toHaveText('1 of 2');
	await chair.goto(`/chair/shows/${show.slug}/awards`);
	await expectAccessible(chair);
	for (const [i, s] of SHEETS.entries()) {
		const row = chair
			.locator('tr', { hasText: s.ribbon })
			.filter({ hasText: `Scored ${s.total},` });
		await expect(row).toContainText(String(show.entries[i].number));
	}
	await expect(chair.locator('tr', { hasText: 'Best in class' })).toContainText(
		String(show.entries[0].number)
	);
	await expect(chair.locator('tr', { hasText: 'Best in class' })).toContainText(
		`The highest score (95) among the 2 blue-ribbon entries in class 1`
	);
	await chair.getByLabel('Publish anyway').check();
	await chair.getByRole('button', { name: 'Publish results' }).click();
	await chair.getByRole('button', { name: 'Yes, publish the results' }).click();
	await expect(chair.getByText('Scores are locked.').first()).toBeVisible();
	await chairContext.close();

	await page.reload();
	await expect(page.getByText('Results are published: this sheet is locked.')).toBeVisible();

	// Blind judging: nothing the judge's browser received names an exhibitor.
	const seen = (await Promise.all(answers)).join('\n');
	expect(seen.length).toBeGreaterThan(1000);
	for (const word of show.exhibitorWords) expect(seen).not.toContain(word);
});

test('bad scores and entries outside the judge’s classes are refused and change nothing', async ({
	page
}) => {
	const show = await createJudgingShow(1);
	await signIn(page, 'judge1@crownbench.test');
	const entryId = show.entries[0].id;
	const put = (body: object) => page.request.put('/api/judging/sheets', { data: body });
	const base = { changeId: crypto.randomUUID(), entryId, baseVersion: 0, comment: '' };

	for (const [deductions, message] of [
		[{ condition: 25.5 }, 'Condition: cannot deduct more than the 25 points it carries.'],
		[{ symmetry: -1 }, 'Symmetry or leaf pattern: a deduction cannot be negative.'],
		[{ symmetry: 'lots' }, 'Symmetry or leaf pattern: enter a number.']
	] as const) {
		const answer = await put({ ...base, changeId: crypto.randomUUID(), deductions });
		expect(answer.status()).toBe(400);
		expect(((await answer.json()) as { message: string }).message).toBe(message);
	}
	const outside = await put({ ...base, entryId: show.otherEntryId, deductions: { symmetry: 1 } });
	expect(outside.status()).toBe(403);
	expect(((await outside.json()) as { message: string }).message).toBe(
		'This entry is not in your classes.'
	);
	const sheets = await withDb(
		async (db) =>
			(
				await db.query('SELECT count(*)::int AS n FROM score_sheets WHERE show_id = $1', [
					show.showId
				])
			).rows[0].n as number
	);
	expect(sheets).toBe(0);

	// The scoresheet of an entry outside the judge's classes does not open.
	const refused = await page.goto(`/judging/entry/${show.otherEntryId}`);
	expect(refused?.status()).toBe(403);

	// On a phone the scoresheet fits the width.
	await page.setViewportSize({ width: 390, height: 844 });
	await page.goto(`/judging/entry/${entryId}`);
	await expect(
		page.getByRole('heading', { level: 1, name: `Entry ${show.entries[0].number}` })
	).toBeVisible();
	const overflow = await page.evaluate(
		() => document.documentElement.scrollWidth - window.innerWidth
	);
	expect(overflow).toBeLessThanOrEqual(0);
	await expectAccessible(page);
});

test('the chair sets up a panel and is refused a class where a judge’s household has an entry', async ({
	page
}) => {
	const show = await createJudgingShow(1);
	await page.setViewportSize({ width: 1280, height: 800 });
	await signIn(page, 'chair@crownbench.test');
	await page.goto(`/chair/shows/${show.slug}/panels`);
	await expectAccessible(page);
	await page.getByLabel('New panel').fill('Bench Two');
	await page.getByRole('button', { name: 'Add panel' }).click();
	await expect(page.getByText('Bench Two added.')).toBeVisible();
	await page.getByLabel('Add a judge to Bench Two').selectOption({ label: 'Harriet Birchwood' });
	await page.getByRole('button', { name: 'Add judge' }).last().click();
	await expect(page.getByText('Judge added.')).toBeVisible();

	// Class 2 holds an entry of exhibitor5, of judge3's household (Birchwood).
	await page.getByLabel(/Class 2 Semiminiatures/).selectOption({ label: 'Bench Two' });
	await page.getByRole('button', { name: 'Save the panel of class 2' }).click();
	await expect(
		page.getByText(
			'Harriet Birchwood cannot judge class 2: someone of their household has an entry in it.'
		)
	).toBeVisible();
	await expect(page.getByLabel(/Class 2 Semiminiatures/)).toHaveValue('');
	await expectAccessible(page);

	await page.goto(`/chair/shows/${show.slug}/awards/rules`);
	await expectAccessible(page);
	await page.goto(`/chair/shows/${show.slug}/audit`);
	await expectAccessible(page);
});

test('two judges on one consensus sheet: the later change is shown as a conflict, never lost', async ({
	page,
	browser
}) => {
	const show = await createJudgingShow(1, { method: 'consensus', judges: ['judge1', 'judge2'] });
	const entry = show.entries[0];
	const otherContext = await browser.newContext({ viewport: { width: 768, height: 1024 } });
	const other = await otherContext.newPage();
	await signIn(page, 'judge1@crownbench.test');
	await signIn(other, 'judge2@crownbench.test');
	await page.goto(`/judging/entry/${entry.id}`);
	await other.goto(`/judging/entry/${entry.id}`);
	await expect(page.getByText('This is the panel’s one agreed sheet.')).toBeVisible();

	// judge1 saves first; judge2's tablet still holds the empty sheet.
	const condition = page.getByLabel('Condition', { exact: true });
	await condition.fill('2');
	await condition.press('Tab');
	await expect(page.locator('[data-sync]')).toHaveAttribute('data-sync', 'saved');
	const symmetry = other.getByLabel('Symmetry or leaf pattern', { exact: true });
	await symmetry.fill('1');
	await symmetry.press('Tab');

	await expect(
		other.getByRole('heading', { name: 'Another panel member saved this sheet first' })
	).toBeVisible();
	await expect(other.locator('[data-sync]')).toHaveAttribute('data-sync', 'conflict');
	await expect(other.getByTestId('running-total')).toHaveText('98');
	await expectAccessible(other);
	// The put-back is held on its way to the server, so the tablet's state can be read before the
	// server acknowledges it: waiting ("Saving…"), never "saved", until the answer comes.
	const versions = () =>
		withDb(
			async (db) =>
				(await db.query('SELECT version FROM score_sheets WHERE entry_id = $1', [entry.id])).rows
		);
	let release = () => {};
	const held = new Promise<void>((resolve) => (release = resolve));
	let arrived = () => {};
	const putBackSent = new Promise<void>((resolve) => (arrived = resolve));
	await other.route('**/api/judging/sheets', async (route) => {
		arrived();
		await held;
		await route.continue();
	});
	// Every state the status line takes from here on, so a brief "saved" cannot go unseen.
	await other.locator('[data-sync]').evaluate((line) => {
		const seen: string[] = [];
		(window as unknown as { syncStates: string[] }).syncStates = seen;
		new MutationObserver(() => seen.push(line.getAttribute('data-sync') ?? '')).observe(line, {
			attributes: true,
			attributeFilter: ['data-sync']
		});
	});
	const statesSeen = () =>
		other.evaluate(() => (window as unknown as { syncStates: string[] }).syncStates);
	await other.getByRole('button', { name: 'Put my scores back' }).click();
	await putBackSent;
	await expect(other.locator('[data-sync]')).toHaveAttribute('data-sync', 'saving');
	await expect(other.locator('[data-sync]')).toHaveText('Saving…');
	await expect(other.getByTestId('running-total')).toHaveText('99');
	expect(await statesSeen()).not.toContain('saved');
	expect(await versions()).toEqual([{ version: 1 }]);

	release();
	await expect(other.locator('[data-sync]')).toHaveAttribute('data-sync', 'saved');
	await expect(other.locator('[data-sync]')).toHaveText('All changes saved');
	const states = await statesSeen();
	expect(states.indexOf('saved')).toBe(states.length - 1);
	// The acknowledgement came after the put-back reached the database.
	expect(await versions()).toEqual([{ version: 2 }]);
	await expect(other.getByTestId('running-total')).toHaveText('99');
	await otherContext.close();
});
