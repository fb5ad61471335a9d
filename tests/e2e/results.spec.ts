import { expect, test } from '@playwright/test';
import pg from 'pg';
import { PDFParse } from 'pdf-parse';
import { expectAccessible } from './support/axe';
import { lastMailId, mailFor, type CaughtMail } from './support/mail';
import { signIn } from './support/session';

// The judged, unpublished autumn show of the demo seed (seeders/20261206000500-...): invented
// scores. Entry 1 (member@) scores (96 + 95) / 2 = 95.5: a blue ribbon (90 and over, national
// handbook, from memory) and best in class; entry 5 (97) is best in show.
test.describe.configure({ mode: 'serial' });

async function autumnSlug(): Promise<string> {
	const client = new pg.Client({ connectionString: process.env.DATABASE_URL });
	await client.connect();
	try {
		const { rows } = await client.query<{ slug: string }>(
			`SELECT slug FROM shows WHERE slug LIKE 'larkspur-autumn-%' LIMIT 1`
		);
		return rows[0].slug;
	} finally {
		await client.end();
	}
}

test('the chair publishes results: public page, PDF download and placements e-mail', async ({
	page,
	browser
}) => {
	test.setTimeout(120_000);
	const slug = await autumnSlug();
	const visitorContext = await browser.newContext();
	const visitor = await visitorContext.newPage();

	// Before publishing: the public page says so and shows no score.
	await visitor.goto(`/shows/${slug}/results`);
	await expect(visitor.getByText('Results are not published yet')).toBeVisible();
	await expect(visitor.getByText('95.5')).toHaveCount(0);
	await expectAccessible(visitor);

	const before = await lastMailId('member@crownbench.test');
	await signIn(page, 'chair@crownbench.test');
	await page.goto(`/chair/shows/${slug}/results`);
	await expect(page.getByText('Results are not published yet')).toBeVisible();
	await page.goto(`/chair/shows/${slug}/awards`);
	await page.getByRole('button', { name: 'Publish results' }).click();
	await page.getByRole('button', { name: 'Yes, publish the results' }).click();
	await expect(page.getByText('6 placements e-mails are on their way.')).toBeVisible();

	// The chair's results page: documents, charts and the sending progress.
	await page.goto(`/chair/shows/${slug}/results`);
	await expect(
		page.getByRole('heading', { level: 1, name: /Results of Autumn Show/ })
	).toBeVisible();
	await expect(page.locator('p[aria-live]')).toContainText('6 sent', { timeout: 20_000 });
	await expect(page.locator('p[aria-live]')).toContainText('0 failed');
	await expect(page.locator('progress')).toHaveAttribute('value', '6');
	await expect(page.getByRole('img', { name: /Scores in division A/ })).toBeVisible();
	await expectAccessible(page);

	// The worker builds the documents off the request path; the page shows each once it is ready.
	await expect(page.getByRole('link', { name: 'Award sheets (PDF)' })).toBeVisible({
		timeout: 30_000
	});
	const pdf = await page.request.get(`/chair/shows/${slug}/results/award-sheets.pdf`);
	expect(pdf.status()).toBe(200);
	expect(pdf.headers()['content-type']).toBe('application/pdf');
	const parser = new PDFParse({ data: new Uint8Array(await pdf.body()) });
	const text = (await parser.getText()).text.replace(/\s+/g, ' ');
	await parser.destroy();
	expect(text).toContain('Award sheets: Autumn Show');
	expect(text).toMatch(/Best in show 2 5 .*Imogen Tallis 97/);
	expect(text).toMatch(/Wren Halloway 95\.5 Best in class, Blue ribbon/);

	// The public page, for anyone.
	await visitor.goto(`/shows/${slug}/results`);
	await expect(
		visitor.getByRole('heading', { level: 1, name: /Results: Autumn Show/ })
	).toBeVisible();
	const top = visitor.getByRole('table', { name: 'Top awards' });
	await expect(top.getByRole('row', { name: /Best in show .*Imogen Tallis 97/ })).toBeVisible();
	const class1 = visitor.getByRole('table', { name: /Class 1:/ });
	await expect(
		class1.getByRole('row', { name: /Wren Halloway 95\.5 Best in class, Blue ribbon/ })
	).toBeVisible();
	await expect(visitor.getByText('spent blossoms')).toHaveCount(0);
	await expectAccessible(visitor);
	const csv = await visitor.request.get(`/shows/${slug}/results/results.csv`);
	expect(csv.status()).toBe(200);
	expect(await csv.text()).toContain('Blue ribbon');

	// The member's placements e-mail, caught by the SMTP fake.
	// Other tests sign member@ in at the same time: look for the results message among them.
	let mail: CaughtMail | undefined;
	await expect
		.poll(
			async () => {
				mail = (await mailFor('member@crownbench.test')).find(
					(m) => m.id > before && m.subject.startsWith('Your results: Autumn Show')
				);
				return mail !== undefined;
			},
			{ timeout: 20_000 }
		)
		.toBe(true);
	if (!mail) throw new Error('no results e-mail');
	expect(mail.text).toContain('Entry 1, class 1');
	expect(mail.text).toContain('Award: Best in class, Blue ribbon');
	expect(mail.text).toContain("Judges' comment: Crisp, even rosette; remove two spent blossoms.");
	await visitorContext.close();
});
