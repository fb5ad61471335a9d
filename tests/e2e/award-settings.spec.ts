import { expect, test } from '@playwright/test';
import { randomUUID } from 'node:crypto';
import { expectAccessible } from './support/axe';
import { withDb } from './support/judging-fixture';
import { signIn } from './support/session';

/**
 * The chair sets the three award settings on the award rules page (honorable mentions per class,
 * rounding of the panel's mean, one top award per plant) and finds them kept; a count out of
 * range is refused with its message and changes nothing. A society, chair and show of its own,
 * made here (invented names).
 */
async function createSocietyWithShow(): Promise<{ slug: string; showId: string; chair: string }> {
	const tag = randomUUID().slice(0, 8);
	const chair = `awards-chair-${tag}@awards.test`;
	return withDb(async (db) => {
		const societyId = randomUUID();
		await db.query(`INSERT INTO societies (id, name, slug) VALUES ($1, $2, $3)`, [
			societyId,
			`Quillmere Violet Circle ${tag}`,
			`quillmere-${tag}`
		]);
		const userId = randomUUID();
		await db.query(`INSERT INTO users (id, name, email) VALUES ($1, $2, $3)`, [
			userId,
			`Orla Fenwick ${tag}`,
			chair
		]);
		await db.query(
			`INSERT INTO memberships (society_id, user_id, roles) VALUES ($1, $2, '{chair}'::varchar(16)[])`,
			[societyId, userId]
		);
		const showId = randomUUID();
		const slug = `quillmere-spring-${tag}`;
		await db.query(
			`INSERT INTO shows (id, society_id, name, slug, entries_open, entries_close, entry_day, judging_day,
			                    panel_score_method, award_rules)
			 VALUES ($1, $2, $3, $4, current_date + 10, current_date + 30, current_date + 35,
			         current_date + 36, 'mean', '{}'::jsonb)`,
			[showId, societyId, `Quillmere Spring Show ${tag}`, slug]
		);
		return { slug, showId, chair };
	});
}

async function storedRules(showId: string): Promise<Record<string, unknown>> {
	return withDb(
		async (db) =>
			(await db.query(`SELECT award_rules FROM shows WHERE id = $1`, [showId])).rows[0].award_rules
	);
}

test('the chair changes the three award settings and finds them kept', async ({ page }) => {
	const { slug, showId, chair } = await createSocietyWithShow();
	await signIn(page, chair);
	await page.goto(`/chair/shows/${slug}/awards/rules`);
	const settings = page.getByTestId('award-settings');
	// A show whose rules predate the settings reads today's behavior.
	await expect(settings).toContainText('Panel score: mean of the judges, half up to one decimal');
	await expect(settings).toContainText('Top awards: a plant may take several');
	await expect(page.getByRole('radio', { name: 'One', exact: true })).toBeChecked();
	await expectAccessible(page);

	await page.getByRole('radio', { name: /^Placement/ }).check();
	await page.getByRole('radio', { name: 'Up to the number below' }).check();
	await page.getByLabel('Number of honorable mentions').fill('3');
	await page.getByRole('radio', { name: /^To whole points, half up/ }).check();
	await page.getByRole('radio', { name: /^A plant takes only one/ }).check();
	await page.getByRole('button', { name: 'Save award rules' }).click();
	await expect(page.getByText('Award rules saved.')).toBeVisible();

	await page.reload();
	await expect(page.getByRole('radio', { name: 'Up to the number below' })).toBeChecked();
	await expect(page.getByLabel('Number of honorable mentions')).toHaveValue('3');
	await expect(page.getByRole('radio', { name: /^To whole points, half up/ })).toBeChecked();
	await expect(page.getByRole('radio', { name: /^A plant takes only one/ })).toBeChecked();
	await expect(settings).toContainText('Honorable mentions: up to 3 per class');
	await expect(settings).toContainText('Panel score: mean of the judges, half up to whole points');
	await expect(settings).toContainText('Top awards: one per plant, in the order listed');
	expect(await storedRules(showId)).toMatchObject({
		system: 'placement',
		honorableMentions: { rule: 'number', count: 3 },
		meanRounding: 'whole',
		topAwardsPerPlant: 'one'
	});
	await expectAccessible(page);

	// A count out of range: refused with its message, nothing stored changes.
	const before = await storedRules(showId);
	for (const bad of ['-2', '1000', '2.5']) {
		await page.getByLabel('Number of honorable mentions').fill(bad);
		await page.getByRole('radio', { name: 'Every entry reaching the minimum' }).check();
		await page.getByRole('button', { name: 'Save award rules' }).click();
		await expect(
			page.getByText('Honorable mentions: enter a whole number from 1 to 99.')
		).toBeVisible();
		expect(await storedRules(showId)).toEqual(before);
	}
	await expectAccessible(page);

	// Every entry reaching the minimum, back to one decimal and several top awards per plant.
	await page.getByLabel('Number of honorable mentions').fill('3');
	await page.getByRole('radio', { name: /^To one decimal, half up/ }).check();
	await page.getByRole('radio', { name: 'A plant may take several top awards' }).check();
	await page.getByRole('button', { name: 'Save award rules' }).click();
	await expect(page.getByText('Award rules saved.')).toBeVisible();
	await page.reload();
	await expect(page.getByRole('radio', { name: 'Every entry reaching the minimum' })).toBeChecked();
	await expect(settings).toContainText('Honorable mentions: every entry reaching the minimum');
	await expect(settings).toContainText('Panel score: mean of the judges, half up to one decimal');
});
