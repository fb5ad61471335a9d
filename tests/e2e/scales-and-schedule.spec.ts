import { expect, test } from '@playwright/test';
import { expectAccessible } from './support/axe';
import { signIn } from './support/session';

test('the chair keeps a scale of points and builds a class with its own limit, pot size and place', async ({
	page
}) => {
	test.setTimeout(180_000); // axe on the whole spring schedule is slow on a busy machine
	const stamp = Date.now().toString(36);
	const scaleName = `Novice benches ${stamp}`;
	const div = `T${stamp.slice(-4)}`;
	await signIn(page, 'chair@crownbench.test');

	// A scale of the chair's own: the total follows the points as they are typed.
	await page.goto('/chair/scales');
	await expect(page.getByRole('heading', { level: 1, name: 'Scales of points' })).toBeVisible();
	await expectAccessible(page);
	const scaleForm = page.locator('#scale-form');
	await scaleForm.getByLabel('Name of the scale').fill(scaleName);
	await scaleForm.getByLabel('Criterion 1', { exact: true }).fill('Condition');
	await scaleForm.getByLabel('Points').nth(0).fill('120');
	await expect(page.getByTestId('scale-total')).toHaveText('Total: 120 points');
	await scaleForm.getByRole('button', { name: 'Add the scale' }).click();
	await expect(
		page.getByText('Criterion 1 may give at most 100 points. The scale was not saved.')
	).toBeVisible();

	await scaleForm.getByLabel('Points').nth(0).fill('60');
	await scaleForm.getByLabel('Criterion 2', { exact: true }).fill('Quantity of bloom');
	await scaleForm.getByLabel('Points').nth(1).fill('40');
	await expect(page.getByTestId('scale-total')).toHaveText('Total: 100 points');
	await scaleForm.getByRole('button', { name: 'Add the scale' }).click();
	await expect(page.getByText(`The scale “${scaleName}” is saved.`)).toBeVisible();
	await expect(page.getByRole('heading', { level: 2, name: scaleName })).toBeVisible();

	// A trial show of its own, being planned (a published schedule no longer changes), dated
	// before the demo's shows so that the other tests still find the spring show as the latest.
	await page.goto('/chair/shows/new');
	const start = page.locator('form[action="?/create"]');
	await start.getByLabel('Name of the show').fill(`Trial benches show ${stamp}`);
	await start.getByLabel('Short name for addresses').fill(`trial-benches-${stamp}`);
	await start.getByLabel('Entries open').fill('2026-02-01');
	await start.getByLabel('Entries close').fill('2026-02-20');
	await start.getByLabel('Entry day').fill('2026-03-06');
	await start.getByLabel('Judging day').fill('2026-03-07');
	await start.getByRole('button', { name: 'Start the show' }).click();
	await expect(page).toHaveURL(new RegExp(`/chair/shows/trial-benches-${stamp}`));
	const showLink = `/chair/shows/trial-benches-${stamp}`;
	await page.goto(`${showLink}/schedule`);
	await expect(
		page.getByRole('heading', { level: 1, name: 'Divisions and classes' })
	).toBeVisible();
	await page.getByLabel('Code', { exact: true }).fill(div);
	await page.getByLabel('Name', { exact: true }).fill(`Trial benches ${stamp}`);
	await page.getByRole('button', { name: 'Add the division' }).click();
	await expect(page.getByText(`Division ${div} is saved.`)).toBeVisible();

	const addClass = async (code: string, name: string) => {
		const form = page.locator('#class-form');
		await form.getByLabel('Division').selectOption({ label: `${div}: Trial benches ${stamp}` });
		await form.getByLabel('Class code').fill(code);
		await form.getByLabel('Class name').fill(name);
		await form.getByLabel('Entries per exhibitor').fill('1');
		await form.getByLabel('Largest pot (in)').fill('5');
		await form.getByLabel('Scale of points').selectOption({ label: scaleName });
		await form.getByRole('button', { name: 'Add the class' }).click();
		await expect(page.getByText(`Class ${code} is saved.`)).toBeVisible();
	};
	await addClass(`${div}1`, 'Novice standards');

	// A bad pot size is refused with its reason.
	const form = page.locator('#class-form');
	await form.getByLabel('Division').selectOption({ label: `${div}: Trial benches ${stamp}` });
	await form.getByLabel('Class code').fill(`${div}2`);
	await form.getByLabel('Class name').fill('Novice miniatures');
	await form.getByLabel('Largest pot (in)').fill('-3');
	await form.getByRole('button', { name: 'Add the class' }).click();
	await expect(page.getByText('The largest pot must be more than 0.')).toBeVisible();
	await addClass(`${div}2`, 'Novice miniatures');

	const division = page
		.locator('section')
		.filter({
			has: page.getByRole('heading', { level: 2, name: `Division ${div}: Trial benches ${stamp}` })
		})
		.last();
	const classNames = division.getByText(new RegExp(`^Class ${div}\\d\\.`));
	await expect(classNames).toHaveText([
		`Class ${div}1. Novice standards`,
		`Class ${div}2. Novice miniatures`
	]);
	await expect(division.getByText(`largest pot 5 in`).first()).toBeVisible();
	await expect(division.getByText(/at most 1 entry per exhibitor/).first()).toBeVisible();
	await expect(division.getByText(`judged on: ${scaleName}`).first()).toBeVisible();

	// Reorder: the second class moves up.
	await page.getByRole('button', { name: `Move up: class ${div}2` }).click();
	await expect(classNames).toHaveText([
		`Class ${div}2. Novice miniatures`,
		`Class ${div}1. Novice standards`
	]);
	await expectAccessible(page);

	// The scales page counts the two classes on the new scale.
	await page.goto('/chair/scales');
	const card = page.locator('section', {
		has: page.getByRole('heading', { level: 2, name: scaleName })
	});
	await expect(card.locator('p', { hasText: '2 classes of this society' })).toBeVisible();

	// General rules typed on the schedule page reach the schedule page people read.
	await page.goto(`${showLink}/schedule`);
	await page.getByLabel('General rules').fill('Plants must be clean.\n\nNo collars or supports.');
	await page.getByRole('button', { name: 'Save the general rules' }).click();
	await expect(page.getByText('The general rules are saved.')).toBeVisible();
	await page.goto(`/shows/trial-benches-${stamp}`);
	const rules = page.locator('section', {
		has: page.getByRole('heading', { name: 'General rules' })
	});
	await expect(rules.getByText('Plants must be clean.')).toBeVisible();
	await expect(rules.getByText('No collars or supports.')).toBeVisible();
});
