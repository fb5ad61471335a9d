import { expect, test } from '@playwright/test';
import { expectAccessible } from './support/axe';
import { signIn } from './support/session';

/**
 * The show chair starts next season's show through the pages: once from nothing, once as a copy
 * of the demo's spring show. Each new show says its stage; the empty one cannot be published
 * before it has a class; a short name already taken is refused with its reason. The new shows
 * are dated before the demo's shows and named apart from them, so the other specs, which take the
 * demo society's latest show and its "Spring Show" link, still find theirs.
 */

const run = Math.random().toString(36).slice(2, 8);

/** Whole days from one YYYY-MM-DD date to another. */
const daysBetween = (from: string, to: string) =>
	Math.round((Date.parse(`${to}T00:00:00Z`) - Date.parse(`${from}T00:00:00Z`)) / 86_400_000);
const addDays = (date: string, days: number) =>
	new Date(Date.parse(`${date}T00:00:00Z`) + days * 86_400_000).toISOString().slice(0, 10);

test('the chair starts a show from nothing and sees it being planned', async ({ page }) => {
	await signIn(page, 'chair@crownbench.test');
	await page.goto('/chair');
	await page.getByRole('link', { name: 'Start a show' }).click();
	await expect(page.getByRole('heading', { level: 1, name: 'Start a show' })).toBeVisible();
	await expectAccessible(page);

	const empty = page.locator('form[action="?/create"]');
	await empty.getByLabel('Name of the show').fill('Autumn Leaf Show');
	await empty.getByLabel('Short name for addresses').fill(`autumn-leaf-${run}`);
	await empty.getByLabel('Venue').fill('Library meeting room');
	// Dates out of order are refused with their reason, and the show is not made.
	await empty.getByLabel('Entries open').fill('2026-09-01');
	await empty.getByLabel('Entries close').fill('2026-08-01');
	await empty.getByLabel('Entry day').fill('2026-10-06');
	await empty.getByLabel('Judging day').fill('2026-10-07');
	await empty.getByRole('button', { name: 'Start the show' }).click();
	await expect(
		page.getByText('Entries must close on or after the day they open.').first()
	).toBeVisible();
	expect((await page.request.get(`/chair/shows/autumn-leaf-${run}`)).status()).toBe(404);

	await empty.getByLabel('Entries close').fill('2026-09-22');
	await empty.getByLabel('Judging system').selectOption('placement');
	await empty.getByRole('button', { name: 'Start the show' }).click();
	await expect(page).toHaveURL(new RegExp(`/chair/shows/autumn-leaf-${run}`));
	await expect(page.getByRole('heading', { level: 1, name: 'Autumn Leaf Show' })).toBeVisible();
	await expect(page.getByText('Stage: Being planned.')).toBeVisible();
	await expect(page.getByLabel('Award system')).toHaveValue('placement');
	await expectAccessible(page);

	// With no class yet, publishing the schedule is refused with the reason.
	await page.getByRole('button', { name: 'Publish the schedule' }).click();
	await expect(page.getByText(/has no class yet/)).toBeVisible();
	await expect(page.getByText('Stage: Being planned.')).toBeVisible();

	// The same short name again is refused.
	await page.goto('/chair/shows/new');
	await empty.getByLabel('Name of the show').fill('Autumn Leaf Show again');
	await empty.getByLabel('Short name for addresses').fill(`autumn-leaf-${run}`);
	await empty.getByLabel('Entries open').fill('2026-09-01');
	await empty.getByLabel('Entries close').fill('2026-09-22');
	await empty.getByLabel('Entry day').fill('2026-10-06');
	await empty.getByLabel('Judging day').fill('2026-10-07');
	await empty.getByRole('button', { name: 'Start the show' }).click();
	await expect(page.getByText(/is already used by another show/).first()).toBeVisible();
	await expectAccessible(page);
});

test('the chair copies the spring show on new dates; the copy keeps its classes', async ({
	page
}) => {
	await signIn(page, 'chair@crownbench.test');
	await page.goto('/chair');
	await page.getByRole('link', { name: /^Spring Show/ }).click();
	await expect(page.getByRole('heading', { level: 1, name: /^Spring Show/ })).toBeVisible();
	await expect(page.getByText('Stage: Taking entries.')).toBeVisible();
	const sourceSlug = page.url().split('/chair/shows/')[1];
	const judging = await page.getByLabel('Judging day').inputValue();
	const opens = await page.getByLabel('Entries open').inputValue();

	await page.goto('/chair/shows/new');
	const copy = page.locator('form[action="?/copy"]');
	const option = copy.locator('option', { hasText: /^Spring Show/ }).first();
	await copy.getByLabel('Earlier show to copy').selectOption((await option.getAttribute('value'))!);
	await copy.getByLabel('Name of the new show').fill('Next spring show');
	await copy.getByLabel('Short name for addresses').fill(`spring-next-${run}`);
	await copy.getByLabel('Judging day').fill('2026-05-16');
	await copy.getByRole('button', { name: 'Copy the show' }).click();

	await expect(page).toHaveURL(new RegExp(`/chair/shows/spring-next-${run}`));
	await expect(page.getByText('The show is copied on its new dates.')).toBeVisible();
	await expect(page.getByText('Stage: Being planned.')).toBeVisible();
	// Entries open as long before judging day as in the spring show.
	await expect(page.getByLabel('Entries open')).toHaveValue(
		addDays('2026-05-16', daysBetween(judging, opens))
	);
	await expectAccessible(page);

	await page
		.getByRole('navigation', { name: 'This show' })
		.getByRole('link', { name: 'Divisions and classes' })
		.click();
	await expect(page.getByText('Stage: Being planned.')).toBeVisible();
	await expect(page.getByText(/Class 15\. Miniatures, plain foliage/)).toBeVisible();
	await page
		.getByRole('navigation', { name: 'This show' })
		.getByRole('link', { name: 'Panels' })
		.click();
	await expectAccessible(page);

	// The earlier show is untouched and says its own stage.
	await page.goto(`/chair/shows/${sourceSlug}`);
	await expect(page.getByText('Stage: Being planned.')).toHaveCount(0);
	await page.goto(`/desk/${sourceSlug}`);
	await expect(page.getByText('Stage: Taking entries.')).toBeVisible();
	await expectAccessible(page);
});
