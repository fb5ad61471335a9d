import { expect, test, type Page } from '@playwright/test';
import { PDFParse } from 'pdf-parse';
import { expectAccessible } from './support/axe';
import { signIn } from './support/session';

function day(offset: number): string {
	const d = new Date();
	d.setUTCDate(d.getUTCDate() + offset);
	return d.toISOString().slice(0, 10);
}

async function chooseVariety(page: Page, name: string): Promise<void> {
	await page.getByLabel('Variety').fill(name);
	await page.getByRole('button', { name: `Choose ${name}`, exact: true }).click();
	await expect(page.getByText(`Chosen: ${name}`)).toBeVisible();
}

test('the chair writes a class for miniature Sinningia species; the wrong genus is refused with its reason and a fitting species is entered', async ({
	browser
}) => {
	test.setTimeout(180_000);
	const stamp = Date.now().toString(36);
	const slug = `gesneriad-trial-${stamp}`;
	const div = `S${stamp.slice(-4)}`;
	const chairContext = await browser.newContext();
	const chair = await chairContext.newPage();
	await signIn(chair, 'chair@crownbench.test');

	// A show of its own taking entries from today, judged before the demo's spring show (other
	// tests look for the spring show as the latest).
	await chair.goto('/chair/shows/new');
	const start = chair.locator('form[action="?/create"]');
	await start.getByLabel('Name of the show').fill(`Gesneriad trial ${stamp}`);
	await start.getByLabel('Short name for addresses').fill(slug);
	await start.getByLabel('Entries open').fill(day(-2));
	await start.getByLabel('Entries close').fill(day(5));
	await start.getByLabel('Entry day').fill(day(6));
	await start.getByLabel('Judging day').fill(day(7));
	await start.getByRole('button', { name: 'Start the show' }).click();
	await expect(chair).toHaveURL(new RegExp(`/chair/shows/${slug}`));

	await chair.goto(`/chair/shows/${slug}/schedule`);
	await chair.getByLabel('Code', { exact: true }).fill(div);
	await chair.getByLabel('Name', { exact: true }).fill('Gesneriads');
	await chair.getByRole('button', { name: 'Add the division' }).click();
	await expect(chair.getByText(`Division ${div} is saved.`)).toBeVisible();

	// Class: miniature Sinningia species (leaf blade at most 2.5 in: The Gesneriad Society
	// convention show schedule 2018, New England chapter schedule 2022).
	const form = chair.locator('#class-form');
	await form.getByLabel('Division').selectOption({ label: `${div}: Gesneriads` });
	await form.getByLabel('Class code').fill(`${div}1`);
	await form.getByLabel('Class name').fill('Miniature Sinningia species');
	await form.getByLabel('Group').selectOption({ label: 'Gesneriads other than African violets' });
	await form.getByLabel('Sinningia', { exact: true }).check();
	await form.getByLabel('Habit (African violets)').selectOption({ label: 'Either' });
	await form.getByLabel('miniature', { exact: true }).check();
	await form.getByLabel('Species only').check();
	await form
		.getByLabel('Scale of points')
		.selectOption({ label: 'Species (Larkspur Valley setting)' });
	await expectAccessible(chair);
	await form.getByRole('button', { name: 'Add the class' }).click();
	await expect(chair.getByText(`Class ${div}1 is saved.`)).toBeVisible();
	const rules = chair.getByText(/genus: Sinningia/).first();
	await expect(rules).toContainText('gesneriads other than African violets');
	await expect(rules).toContainText('species only');
	await expect(rules).toContainText('size: miniature (leaf blade up to 2.5 in');

	await chair.goto(`/chair/shows/${slug}`);
	await chair.getByRole('button', { name: 'Publish the schedule' }).click();
	await expect(chair.getByText('Stage: Taking entries.')).toBeVisible();

	// The schedule PDF prints the class's rules.
	const pdf = await chair.request.get(`/shows/${slug}/schedule.pdf`);
	expect(pdf.status()).toBe(200);
	const parser = new PDFParse({ data: new Uint8Array(await pdf.body()) });
	const text = (await parser.getText()).text.replace(/\s+/g, ' ');
	await parser.destroy();
	expect(text).toContain('genus: Sinningia');
	expect(text).toContain('species only');
	expect(text).toContain('miniature (leaf blade up to 2.5 in');
	await chairContext.close();

	// The exhibitor: the wrong genus, a hybrid and a standard are refused with their reasons.
	const context = await browser.newContext();
	const exhibitor = await context.newPage();
	await signIn(exhibitor, 'exhibitor7@crownbench.test');
	await exhibitor.goto(`/my/shows/${slug}`);
	await expect(exhibitor.getByRole('heading', { level: 1, name: 'Enter plants' })).toBeVisible();
	const classLabel = `${div} · ${div}1. Miniature Sinningia species`;
	const tryPlant = async (name: string) => {
		await chooseVariety(exhibitor, name);
		await exhibitor.getByLabel('Class').selectOption({ label: classLabel });
		await exhibitor.getByLabel('The day you got the plant').fill(day(-365));
	};

	await tryPlant('Episcia cupreata');
	await expect(exhibitor.getByText('This plant does not fit the class')).toBeVisible();
	await expect(
		exhibitor
			.getByText('This class is for Sinningia, and "Episcia cupreata" is an Episcia.')
			.first()
	).toBeVisible();
	await expectAccessible(exhibitor);
	await exhibitor.getByRole('button', { name: 'Enter this plant' }).click();
	await expect(exhibitor.getByText('This entry was refused; nothing was entered.')).toBeVisible();
	await expect(
		exhibitor.getByText(/This class is for Sinningia, and "Episcia cupreata" is an Episcia/).first()
	).toBeVisible();

	await tryPlant('Cinder Thimble');
	await expect(
		exhibitor.getByText('This class is for species only, and "Cinder Thimble" is a hybrid.').first()
	).toBeVisible();

	await tryPlant('Sinningia leucotricha');
	await expect(
		exhibitor
			.getByText(/This class is for miniature plants, and "Sinningia leucotricha" is a standard/)
			.first()
	).toBeVisible();

	await tryPlant('Sinningia pusilla');
	await expect(exhibitor.getByText('This plant fits the class.')).toBeVisible();
	await exhibitor.getByRole('button', { name: 'Enter this plant' }).click();
	await expect(exhibitor.getByText(/Entered as number \d+\./)).toBeVisible();
	await expect(exhibitor.getByRole('cell', { name: 'Sinningia pusilla' })).toBeVisible();
	await expect(exhibitor.getByRole('cell', { name: 'Episcia cupreata' })).toHaveCount(0);
	await context.close();
});

test('the chair downloads the registry with its gesneriads, and only the own society’s', async ({
	page
}) => {
	await signIn(page, 'chair@crownbench.test');
	await page.goto('/chair/varieties');
	const link = page.getByRole('link', { name: 'Download the registry as a CSV file' });
	const response = await page.request.get((await link.getAttribute('href'))!);
	expect(response.status()).toBe(200);
	expect(response.headers()['content-type']).toBe('text/csv; charset=utf-8');
	const csv = await response.text();
	expect(csv.split('\r\n')[0]).toBe(
		'\uFEFFname,group,hybridizer,species,botanical_name,growth_form,size_class,blossom_type,blossom_colors,foliage,description'
	);
	expect(csv).toContain('Sinningia pusilla,Sinningia,,yes,Sinningia pusilla,rosette,miniature');
	expect(csv).toContain('Harbor Dusk,African violet,');
	// Cedar Ridge's own variety never appears in Larkspur Valley's file, nor may its chair ask.
	expect(csv).not.toContain('Cedar Smoke Lace');
	expect((await page.request.get('/chair/varieties/export?society=cedar-ridge')).status()).toBe(
		403
	);
	const unnamed = await page.request.get('/chair/varieties/export');
	expect(unnamed.status()).toBe(400);
	expect((await unnamed.json()).message).toMatch(/Say which society’s registry/);

	// The variety form offers the growth forms and size classes of the group chosen.
	await page.getByLabel('Group').selectOption({ label: 'Sinningia' });
	await expect(page.getByLabel('Growth form').locator('option')).toHaveText(['Rosette', 'Upright']);
	await expect(page.getByLabel('Size class').locator('option')).toHaveText([
		'miniature (leaf blade up to 2.5 in)',
		'standard'
	]);
	await page.getByLabel('Name', { exact: true }).fill(`Sinningia test ${Date.now()}`);
	await page.getByLabel('Blossom type').fill('single');
	await page.getByLabel(/A species/).check();
	await page.getByLabel('Botanical name').fill('Episcia lilacina');
	await page.getByRole('button', { name: 'Add to the registry' }).click();
	await expect(
		page.getByText('A botanical name in the Sinningia group starts with Sinningia.').first()
	).toBeVisible();
	await expectAccessible(page);
});
