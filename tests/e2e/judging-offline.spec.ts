import { expect, test, type BrowserContext, type Page } from '@playwright/test';
import { mkdtemp, rm } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import AxeBuilder from '@axe-core/playwright';
import config from '../../playwright.config';
import { expectAccessible } from './support/axe';
import { createJudgingShow, withDb, type JudgingShow } from './support/judging-fixture';
import { firstLink, lastMailId, waitForMail } from './support/mail';
import { changesOf, score } from './support/scoresheet';
import { startHallNetwork } from './support/hall-network';
import { signIn } from './support/session';

/**
 * The judge's tablet without the hall's network, in a browser profile kept on disk (as a tablet
 * keeps it) so the browser can be closed and opened again: Chromium at tablet size, as
 * playwright.config.ts launches it, with the service worker and IndexedDB of a real profile.
 */

const TABLET = { width: 768, height: 1024 };

// A browser opened on a new profile first keeps the whole built app (hundreds of files).
test.describe.configure({ timeout: 120_000 });

/** Deductions per entry on the published scale (see support/scoresheet.ts), 100 less the sum. */
const SHEETS = [
	{ deduct: [1, 1.5, 1, 1, 0.5] },
	{ deduct: [3, 4, 4, 2, 2] },
	{ deduct: [2, 2, 2, 1.5, 0.5] },
	{ deduct: [6, 6, 7, 4, 2] }
];

interface Tablet {
	/** Opens the browser (again) on the tablet's profile. */
	open(options?: { offline?: boolean }): Promise<{ context: BrowserContext; page: Page }>;
	/** Takes the hall's network away (the browser says offline too), or gives it back. */
	setOffline(offline: boolean): Promise<void>;
}

/**
 * A tablet: a persistent profile in a folder of its own, opened (and opened again) at will, that
 * reaches the app through the hall's network (support/hall-network.ts).
 */
const tabletTest = test.extend<{ tablet: Tablet }>({
	tablet: async ({ playwright, baseURL }, use) => {
		const dir = await mkdtemp(join(tmpdir(), 'crownbench-tablet-'));
		const hall = await startHallNetwork(baseURL ?? 'http://127.0.0.1:4173');
		const opened: { context: BrowserContext | null } = { context: null };
		await use({
			open: async (options = {}) => {
				await opened.context?.close();
				if (options.offline) hall.down();
				const context = await playwright.chromium.launchPersistentContext(dir, {
					...config.use?.launchOptions,
					baseURL: hall.origin,
					viewport: TABLET,
					// The config blocks service workers for other specs; a tablet has one.
					serviceWorkers: 'allow',
					offline: options.offline ?? false
				});
				opened.context = context;
				return { context, page: context.pages()[0] ?? (await context.newPage()) };
			},
			setOffline: async (offline) => {
				if (offline) hall.down();
				await opened.context?.setOffline(offline);
				if (!offline) hall.up();
			}
		});
		await opened.context?.close();
		await hall.close();
		await rm(dir, { recursive: true, force: true });
	}
});

/** Opens the judging list and waits until the service worker holds the person's pages. */
async function openJudgingOnline(page: Page): Promise<number> {
	await page.goto('/judging');
	const ready = page.locator('[data-offline-pages]');
	// The built app and every page of the person's classes are fetched once: the demo show has many.
	await expect(ready).toContainText('Ready to work offline', { timeout: 60_000 });
	return Number(await ready.getAttribute('data-offline-pages'));
}

/** Every change the server applied to the show's sheets, in the order it applied them. */
async function appliedInOrder(show: JudgingShow) {
	return withDb(
		async (db) =>
			(
				await db.query(
					`SELECT e.number, (c.response->>'version')::int AS version
					   FROM score_audit a
					   JOIN applied_changes c ON c.change_id = a.change_id
					   JOIN entries e ON e.id = a.entry_id
					  WHERE a.show_id = $1 ORDER BY a.id`,
					[show.showId]
				)
			).rows as { number: number; version: number }[]
	);
}

/** The sheets of the show as stored, with how many changes were applied to each. */
async function storedSheets(show: JudgingShow) {
	return withDb(
		async (db) =>
			(
				await db.query(
					`SELECT e.number, s.version,
					        (SELECT count(*)::int FROM applied_changes c WHERE c.sheet_id = s.id) AS applied
					   FROM score_sheets s JOIN entries e ON e.id = s.entry_id
					  WHERE s.show_id = $1 ORDER BY e.number`,
					[show.showId]
				)
			).rows
	);
}

/** What the browser keeps for this site: Cache Storage names and URLs, IndexedDB names and data. */
async function keptOnTablet(page: Page) {
	return page.evaluate(async () => {
		const cacheNames = await caches.keys();
		const cached: string[] = [];
		for (const name of cacheNames) {
			const cache = await caches.open(name);
			for (const request of await cache.keys()) {
				const response = await cache.match(request);
				cached.push(`${name} ${request.url}\n${(await response?.text()) ?? ''}`);
			}
		}
		const databases = (await indexedDB.databases()).map((d) => d.name ?? '');
		const data: string[] = [];
		for (const name of databases) {
			const db = await new Promise<IDBDatabase>((resolve, reject) => {
				const request = indexedDB.open(name);
				request.onsuccess = () => resolve(request.result);
				request.onerror = () => reject(request.error);
			});
			for (const store of Array.from(db.objectStoreNames)) {
				const all = await new Promise<unknown[]>((resolve) => {
					const request = db.transaction(store).objectStore(store).getAll();
					request.onsuccess = () => resolve(request.result);
				});
				data.push(`${name}/${store} ${JSON.stringify(all)}`);
			}
			db.close();
		}
		return { cacheNames, cached: cached.join('\n'), databases, data: data.join('\n') };
	});
}

const userIdOf = (email: string) =>
	withDb(
		async (db) =>
			(await db.query('SELECT id FROM users WHERE email = $1', [email])).rows[0].id as string
	);

tabletTest(
	'offline from the first tap: reload, score, close the browser, score more; every change is saved once, in order',
	async ({ tablet }) => {
		const show = await createJudgingShow(4);
		let { page } = await tablet.open();
		await signIn(page, 'judge1@crownbench.test', { fresh: true });
		const kept = await openJudgingOnline(page);
		// The list, the class and its four scoresheets at least (judge1 also judges the demo show).
		expect(kept).toBeGreaterThanOrEqual(6);

		// The network goes; the judge reloads and opens the class and an entry from what was kept.
		await tablet.setOffline(true);
		await page.reload();
		await expect(page.getByRole('heading', { level: 1, name: 'Judging' })).toBeVisible();
		// This show's class 1: judge1 judges other tests' shows too, with a class 1 of the same name.
		await page.locator(`a[href="/judging/class/${show.classId}"]`).first().click();
		await expect(page.getByRole('heading', { level: 1, name: 'Class 1' })).toBeVisible();
		await page
			.getByRole('link', { name: new RegExp(`Entry ${show.entries[0].number}\\b`) })
			.click();
		await expect(
			page.getByRole('heading', { level: 1, name: `Entry ${show.entries[0].number}` })
		).toBeVisible();

		// Three entries scored offline; nothing reaches the server.
		const sync = page.locator('[data-sync]');
		for (let i = 0; i < 3; i++) {
			if (i > 0) await page.getByRole('button', { name: 'Next entry' }).click();
			await score(page, SHEETS[i].deduct);
		}
		const offlineChanges = changesOf(SHEETS[0]) + changesOf(SHEETS[1]) + changesOf(SHEETS[2]);
		await expect(sync).toHaveAttribute('data-sync', 'waiting');
		await expect(sync).toHaveText(`Offline. Waiting to send ${offlineChanges} changes`);
		await expect(page.getByTestId('last-reached')).toHaveText(
			'No change from this tablet has reached the server yet.'
		);
		await expectAccessible(page);
		expect(await storedSheets(show)).toEqual([]);

		// The browser closes (the tablet slept); it opens again, still offline, on the fourth entry,
		// a scoresheet the judge never opened: it was kept when the judging list was opened.
		const reopened = await tablet.open({ offline: true });
		page = reopened.page;
		await page.goto(`/judging/entry/${show.entries[3].id}`);
		await expect(
			page.getByRole('heading', { level: 1, name: `Entry ${show.entries[3].number}` })
		).toBeVisible();
		await expect(page.locator('[data-sync]')).toHaveText(
			`Offline. Waiting to send ${offlineChanges} changes`
		);
		await score(page, SHEETS[3].deduct);
		// The third entry still shows what was scored before the browser closed.
		await page.getByRole('button', { name: 'Previous entry' }).click();
		await expect(page.getByTestId('running-total')).toHaveText('92');
		expect(await storedSheets(show)).toEqual([]);

		// A page that was never kept says so (the service worker has no network either).
		const other = await reopened.context.newPage();
		await other.goto(`/judging/entry/${show.otherEntryId}`);
		await expect(other.getByRole('heading', { name: 'Not kept on this tablet' })).toBeVisible();
		await other.close();

		// The class page, opened offline from its kept copy, shows the sheets as the tablet has them.
		await page.goto(`/judging/class/${show.classId}`);
		for (const [i, total] of [95, 85, 92, 75].entries()) {
			await expect(
				page.getByRole('link', { name: new RegExp(`Entry ${show.entries[i].number}\\b`) })
			).toContainText(`Scored ${total}`);
		}
		await expect(page.locator('[data-sync]')).toHaveAttribute('data-sync', 'waiting');

		// The network returns: every change is sent once, in the order made, on the right versions.
		await tablet.setOffline(false);
		await expect(page.locator('[data-sync]')).toHaveAttribute('data-sync', 'saved', {
			timeout: 30_000
		});
		await expect(page.getByTestId('last-reached')).toContainText(
			'Last change reached the server at'
		);
		expect(await storedSheets(show)).toEqual(
			SHEETS.map((s, i) => ({
				number: show.entries[i].number,
				version: changesOf(s),
				applied: changesOf(s)
			}))
		);
		expect(await appliedInOrder(show)).toEqual(
			SHEETS.flatMap((s, i) =>
				Array.from({ length: changesOf(s) }, (_, v) => ({
					number: show.entries[i].number,
					version: v + 1
				}))
			)
		);

		// Daylight: the judging pages meet the enhanced contrast (7:1) of WCAG's AAA level.
		for (const url of [
			'/judging',
			`/judging/class/${show.classId}`,
			`/judging/entry/${show.entries[3].id}`
		]) {
			await page.goto(url);
			const results = await new AxeBuilder({ page })
				.withRules(['color-contrast-enhanced'])
				.analyze();
			expect(
				results.violations.map((v) => `${url}: ${v.nodes.map((n) => n.html).join(' ')}`)
			).toEqual([]);
		}

		// Nothing the tablet keeps names an exhibitor.
		const stored = await keptOnTablet(page);
		expect(stored.cached.length + stored.data.length).toBeGreaterThan(1000);
		for (const word of show.exhibitorWords) {
			expect(stored.cached).not.toContain(word);
			expect(stored.data).not.toContain(word);
		}
	}
);

tabletTest(
	'a session that ran out while offline: the changes stay on the tablet and are sent after signing in',
	async ({ tablet }) => {
		const show = await createJudgingShow(2);
		const { context, page } = await tablet.open();
		await signIn(page, 'judge1@crownbench.test', { fresh: true });
		await openJudgingOnline(page);
		await tablet.setOffline(true);
		await page.goto(`/judging/entry/${show.entries[0].id}`);
		await score(page, SHEETS[0].deduct);

		// Meanwhile the session ends (it ran out, or was ended on the server).
		const token = (await context.cookies()).find((c) =>
			c.name.endsWith('authjs.session-token')
		)?.value;
		expect(token).toBeTruthy();
		await withDb((db) => db.query('DELETE FROM sessions WHERE session_token = $1', [token]));
		await tablet.setOffline(false);

		const sync = page.locator('[data-sync]');
		await expect(sync).toHaveAttribute('data-sync', 'signed-out', { timeout: 20_000 });
		await expect(sync).toHaveText(
			`Your session has ended. ${changesOf(SHEETS[0])} changes kept on this tablet until you sign in again.`
		);
		const again = page.getByRole('link', { name: 'Sign in again' });
		await expect(again).toHaveAttribute(
			'href',
			`/signin?next=${encodeURIComponent(`/judging/entry/${show.entries[0].id}`)}`
		);
		await expectAccessible(page);
		expect(await storedSheets(show)).toEqual([]);

		// The judge signs in again from the link on the page, and lands back on the scoresheet.
		await again.click();
		await expect(page).toHaveURL(/\/signin\?next=/);
		const before = await lastMailId('judge1@crownbench.test');
		await page.getByLabel('E-mail address').fill('judge1@crownbench.test');
		await page.getByRole('button', { name: 'Send me a sign-in link' }).click();
		await page.goto(firstLink(await waitForMail('judge1@crownbench.test', before)));
		await expect(page).toHaveURL(new RegExp(`/judging/entry/${show.entries[0].id}$`));
		// (The sign-in link names the app's own address; the tablet goes on through the hall's.)
		await page.goto(`/judging/entry/${show.entries[0].id}`);
		await expect(sync).toHaveAttribute('data-sync', 'saved', { timeout: 20_000 });
		expect(await storedSheets(show)).toEqual([
			{
				number: show.entries[0].number,
				version: changesOf(SHEETS[0]),
				applied: changesOf(SHEETS[0])
			}
		]);
	}
);

tabletTest(
	'signing out clears the tablet; the next person sees nothing of the first, also without a sign-out',
	async ({ tablet }) => {
		const show = await createJudgingShow(1);
		const { context, page } = await tablet.open();
		const judge1 = await userIdOf('judge1@crownbench.test');
		const judge2 = await userIdOf('judge2@crownbench.test');
		await signIn(page, 'judge1@crownbench.test', { fresh: true });
		await openJudgingOnline(page);
		await page.goto(`/judging/entry/${show.entries[0].id}`);
		const condition = page.getByLabel('Condition', { exact: true });
		await condition.fill('2');
		await condition.press('Tab');
		await expect(page.locator('[data-sync]')).toHaveAttribute('data-sync', 'saved');
		let kept = await keptOnTablet(page);
		expect(kept.cached).toContain(`/judging/entry/${show.entries[0].id}`);
		expect(kept.data).toContain(show.entries[0].id);

		// A change that has not reached the server: signing out asks first.
		await tablet.setOffline(true);
		await condition.fill('3');
		await condition.press('Tab');
		await expect(page.locator('[data-sync]')).toHaveAttribute('data-sync', 'waiting');
		await page.getByRole('button', { name: 'Sign out' }).click();
		await expect(page.getByRole('heading', { name: 'Changes not yet sent' })).toBeVisible();
		await expectAccessible(page);
		await tablet.setOffline(false);
		await page.getByRole('link', { name: 'Back to judging, to send them first' }).click();
		await page.goto(`/judging/entry/${show.entries[0].id}`);
		await expect(page.locator('[data-sync]')).toHaveAttribute('data-sync', 'saved');
		expect(await storedSheets(show)).toEqual([
			{ number: show.entries[0].number, version: 2, applied: 2 }
		]);

		await page.getByRole('button', { name: 'Sign out' }).click();
		await expect(page).toHaveURL(/\/$/);
		kept = await keptOnTablet(page);
		expect(kept.cacheNames.filter((n) => !n.startsWith('crownbench-app-'))).toEqual([]);
		expect(kept.data).not.toContain(show.entries[0].id);
		const judge1Data = kept.data
			.split('\n')
			.filter((line) => line.startsWith(`crownbench-tablet-${judge1}/`));
		expect(judge1Data.every((line) => line.endsWith(' []'))).toBe(true);

		// judge2 signs in on the same tablet: nothing of judge1's is there, online or offline.
		await signIn(page, 'judge2@crownbench.test', { fresh: true });
		await openJudgingOnline(page);
		kept = await keptOnTablet(page);
		expect(kept.cached).not.toContain(show.entries[0].id);
		expect(kept.cacheNames.some((n) => n.includes(judge1))).toBe(false);
		expect(kept.data).not.toContain(show.entries[0].id);
		await tablet.setOffline(true);
		await page.goto(`/judging/entry/${show.entries[0].id}`);
		await expect(page.getByRole('heading', { name: 'Not kept on this tablet' })).toBeVisible();
		await tablet.setOffline(false);

		// judge2's session ends without signing out; judge1 signs in on the tablet again.
		const token = (await context.cookies()).find((c) =>
			c.name.endsWith('authjs.session-token')
		)?.value;
		await withDb((db) => db.query('DELETE FROM sessions WHERE session_token = $1', [token]));
		await context.clearCookies();
		expect((await keptOnTablet(page)).cacheNames.some((n) => n.includes(judge2))).toBe(true);
		await signIn(page, 'judge1@crownbench.test', { fresh: true });
		await openJudgingOnline(page);
		kept = await keptOnTablet(page);
		expect(kept.cacheNames.some((n) => n.includes(judge2))).toBe(false);
		expect(kept.data).not.toContain(`crownbench-tablet-${judge2}/kept [{`);
		// judge1's own sheet is there again, from the server.
		expect(kept.cached).toContain(`/judging/entry/${show.entries[0].id}`);
	}
);
