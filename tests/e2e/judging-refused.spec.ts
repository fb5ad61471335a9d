import { randomUUID } from 'node:crypto';
import { expect, test, type Page } from '@playwright/test';
import { expectAccessible } from './support/axe';
import { createJudgingShow, withDb } from './support/judging-fixture';
import { signIn } from './support/session';

// A tablet held in portrait, as in judging.spec.ts.
// With the service worker, as a judge's tablet has it.
test.use({ viewport: { width: 768, height: 1024 }, serviceWorkers: 'allow' });

/**
 * Puts text in the comment box as a paste would: text no keyboard types (a NUL, half of a
 * surrogate pair) reaches the page's input handler as it is.
 */
async function setComment(page: Page, value: string) {
	await page.locator('#comment').evaluate((box, v) => {
		(box as HTMLTextAreaElement).value = v;
		box.dispatchEvent(new Event('input', { bubbles: true }));
	}, value);
}

/** The changes this tablet set aside (idb-keyval's store of the person, read with the browser's own API). */
function setAside(page: Page): Promise<{ comment: string }[]> {
	return page.evaluate(
		() =>
			new Promise<{ comment: string }[]>((resolve, reject) => {
				void indexedDB.databases().then((all) => {
					const name = all.map((d) => d.name).find((n) => n?.startsWith('crownbench-tablet-'));
					if (!name) return resolve([]);
					const open = indexedDB.open(name);
					open.onerror = () => reject(open.error);
					open.onsuccess = () => {
						const read = open.result.transaction('kept').objectStore('kept').get('set-aside');
						read.onerror = () => reject(read.error);
						read.onsuccess = () => {
							open.result.close();
							resolve((read.result as { comment: string }[] | undefined) ?? []);
						};
					};
				});
			})
	);
}

async function stored(entryId: string) {
	return withDb(
		async (db) =>
			(
				await db.query(
					'SELECT version, deductions, comment FROM score_sheets WHERE entry_id = $1',
					[entryId]
				)
			).rows as { version: number; deductions: Record<string, number>; comment: string }[]
	);
}

async function deduct(page: Page, criterion: string, value: string) {
	const input = page.getByLabel(criterion, { exact: true });
	await input.fill(value);
	await input.press('Tab');
}

// Issue 19, item 5: the server refuses a comment with a NUL or a lone surrogate (400); the tablet
// sets that change aside and says so, and the judge's later changes are still sent and saved.
test('a change the server refuses for good is set aside with a message; later changes are saved', async ({
	page
}) => {
	// A show of its own (the fixture names it apart), so no other spec scores this entry, and a
	// judge of its own on its panel, so no other worker signs the same address in at once.
	const show = await createJudgingShow(1);
	const entry = show.entries[0];
	const judge = await withDb(async (db) => {
		const tag = randomUUID().slice(0, 8);
		const email = `tablet-judge-${tag}@crownbench.test`;
		const userId = randomUUID();
		await db.query(`INSERT INTO users (id, name, email) VALUES ($1, $2, $3)`, [
			userId,
			`Wren Talbridge ${tag}`,
			email
		]);
		await db.query(
			`INSERT INTO memberships (society_id, user_id, roles)
			 SELECT society_id, $2, '{judge}'::varchar(16)[] FROM shows WHERE id = $1`,
			[show.showId, userId]
		);
		await db.query(
			`INSERT INTO panel_judges (panel_id, user_id) SELECT id, $2 FROM panels WHERE show_id = $1`,
			[show.showId, userId]
		);
		return email;
	});
	await signIn(page, judge);
	await page.goto(`/judging/entry/${entry.id}`);
	await expect(
		page.getByRole('heading', { level: 1, name: `Entry ${entry.number}` })
	).toBeVisible();
	const sync = page.locator('[data-sync]');
	const refusals: number[] = [];
	page.on('response', (r) => {
		if (r.url().endsWith('/api/judging/sheets') && r.status() === 400) refusals.push(r.status());
	});

	await deduct(page, 'Condition', '2');
	await expect(sync).toHaveAttribute('data-sync', 'saved');
	expect(await stored(entry.id)).toEqual([
		{ version: 1, deductions: { condition: 2 }, comment: '' }
	]);

	// Half of a surrogate pair in the comment: refused, set aside, the judge is told.
	await setComment(page, 'Even rosette \uD800');
	const alert = page.getByRole('alert').filter({ hasText: 'Not saved:' });
	await expect(alert).toContainText('Remove the unusual characters (a NUL or a broken character).');
	await expect(alert).toContainText(
		'This change was set aside and the sheet shows what was saved; the later ones are sent.'
	);
	// The refused text is not kept on screen, where every later change would carry it.
	await expect(page.locator('#comment')).toHaveValue('');
	await expectAccessible(page);
	expect(refusals).toHaveLength(1);
	expect(await setAside(page)).toEqual([
		expect.objectContaining({ comment: 'Even rosette \uD800' })
	]);

	// A later score change is sent and saved, on top of the last sheet the server kept.
	await deduct(page, 'Symmetry or leaf pattern', '1');
	await expect(sync).toHaveAttribute('data-sync', 'saved');
	await expect(sync).toHaveText('All changes saved');
	await expect(page.getByTestId('running-total')).toHaveText('97');
	await expect
		.poll(() => stored(entry.id))
		.toEqual([{ version: 2, deductions: { condition: 2, symmetry: 1 }, comment: '' }]);

	// A NUL is refused the same way; a plain comment after it is saved.
	await setComment(page, 'Even\u0000rosette');
	await expect.poll(() => setAside(page).then((list) => list.length)).toBe(2);
	await setComment(page, 'Even rosette, good color.');
	await expect
		.poll(() => stored(entry.id))
		.toEqual([
			{
				version: 3,
				deductions: { condition: 2, symmetry: 1 },
				comment: 'Even rosette, good color.'
			}
		]);
	await expect(sync).toHaveAttribute('data-sync', 'saved');
	expect(refusals).toHaveLength(2);

	// What the page shows after a reload is what the server kept; nothing waits to be sent.
	await page.reload();
	await expect(page.getByTestId('running-total')).toHaveText('97');
	await expect(page.locator('#comment')).toHaveValue('Even rosette, good color.');
	await expect(sync).toHaveAttribute('data-sync', 'saved');
	const audits = await withDb(
		async (db) =>
			(
				await db.query(
					`SELECT count(*)::int AS n FROM score_audit a JOIN score_sheets s ON s.id = a.sheet_id
					  WHERE s.entry_id = $1`,
					[entry.id]
				)
			).rows[0].n as number
	);
	expect(audits).toBe(3);
});
