import { expect, test, type Browser, type BrowserContext, type Page } from '@playwright/test';
import { expectAccessible } from './support/axe';
import { firstLink, lastMailId, waitForMail } from './support/mail';
import { requestSignInLink } from './support/session';

/**
 * A society's season from an empty database (the 'fresh' project: a built app on a database with
 * the migrations and no demo seed). Serial steps that share the people and the society below;
 * later steps (the chair builds a show, the member enters, the clerk checks in, the judge scores,
 * the chair publishes, the placement mail arrives) go at the end of the describe block.
 */
const run = Date.now().toString(36);
const address = (who: string) => `${who}-${run}@fresh.crownbench.test`;

type Person = {
	email: string;
	role: string;
	home: string;
	heading: string;
	context?: BrowserContext;
};

const founder: Person = {
	email: address('founder'),
	role: 'Society admin',
	home: '/admin',
	heading: 'Society admin'
};
const society = { name: `Brookfield Violet Circle ${run}`, slug: `brookfield-${run}` };
const invitees: Record<'chair' | 'clerk' | 'judge' | 'member', Person> = {
	chair: { email: address('chair'), role: 'Show chair', home: '/chair', heading: 'Show chair' },
	clerk: { email: address('clerk'), role: 'Clerk', home: '/desk', heading: 'Entry desk' },
	judge: { email: address('judge'), role: 'Judge', home: '/judging', heading: 'Judging' },
	member: { email: address('member'), role: 'Member', home: '/my', heading: 'My entries' }
};
/** The link each invitee's invitation mail carries. */
const invitationLinks = new Map<string, string>();

/** A page in the person's own browser context (their session stays for the later steps). */
async function pageOf(browser: Browser, person: Person): Promise<Page> {
	person.context ??= await browser.newContext();
	return person.context.newPage();
}

test.describe.serial('a new society from an empty database', () => {
	test.afterAll(async () => {
		for (const person of [founder, ...Object.values(invitees)]) await person.context?.close();
	});

	test('a new person signs in and starts a society', async ({ browser, baseURL }) => {
		const page = await pageOf(browser, founder);
		await page.goto(await requestSignInLink(page, founder.email));
		await expect(page).toHaveURL(/\/home$/);
		await page.getByRole('link', { name: 'Start a society' }).click();
		await expect(page).toHaveURL(/\/societies\/new$/);
		await expect(page.getByRole('heading', { level: 1, name: 'Start a society' })).toBeVisible();
		await expectAccessible(page);

		// A short name with capitals and spaces is refused with its reason; nothing is started.
		await page.getByLabel('Society name').fill(society.name);
		await page.getByLabel('Short name for addresses').fill('Brookfield Circle');
		await page.getByRole('button', { name: 'Start the society' }).click();
		await expect(page.getByText('Use lower-case letters, digits and single hyphens')).toBeVisible();
		await expect(page).toHaveURL(/\/societies\/new$/);

		await page.getByLabel('Short name for addresses').fill(society.slug);
		await page.getByLabel('Country').selectOption('CA');
		await page.getByLabel('Time zone').selectOption('America/Toronto');
		await page.getByLabel('Lengths are shown first in').selectOption('cm');
		await page.getByLabel('Paper size').selectOption('a4');
		await page.getByLabel('Currency').selectOption('CAD');
		await page.getByRole('button', { name: 'Start the society' }).click();
		await expect(page).toHaveURL(`${baseURL}/admin/members?society=${society.slug}`);
		await expect(page.getByText(`${society.name}: who belongs`)).toBeVisible();
		await expect(page.getByRole('cell', { name: founder.email, exact: true })).toBeVisible();

		// The settings page shows what was chosen.
		await page.goto(`/admin/society?society=${society.slug}`);
		await expect(page.getByLabel('Society name')).toHaveValue(society.name);
		await expect(page.getByLabel('Time zone')).toHaveValue('America/Toronto');
		await expect(page.getByLabel('Paper size')).toHaveValue('a4');
		await expectAccessible(page);
		await page.close();
	});

	test('the admin invites a chair, a clerk, a judge and a member', async ({ browser, baseURL }) => {
		const page = await pageOf(browser, founder);
		await page.goto(`/admin/members?society=${society.slug}`);
		const form = page.locator('form[action="?/invite"]');
		for (const person of Object.values(invitees)) {
			const before = await lastMailId(person.email);
			await form.getByLabel('E-mail address').fill(person.email);
			for (const role of ['Society admin', 'Show chair', 'Clerk', 'Judge', 'Member']) {
				await form
					.getByRole('checkbox', { name: role, exact: true })
					.setChecked(role === person.role);
			}
			await form.getByRole('button', { name: 'Send invitation' }).click();
			await expect(form.getByText(`Invitation sent to ${person.email}.`)).toBeVisible();
			const mail = await waitForMail(person.email, before);
			expect(mail.subject).toBe(`You are invited to ${society.name} on Crownbench`);
			expect(mail.text).toContain(person.role);
			const link = firstLink(mail);
			expect(link).toBe(`${baseURL}/signin`);
			invitationLinks.set(person.email, link);
		}
		await page.reload();
		for (const person of Object.values(invitees)) {
			await expect(page.getByRole('cell', { name: person.email, exact: true })).toBeVisible();
		}
		await page.close();
	});

	for (const key of ['chair', 'clerk', 'judge', 'member'] as const) {
		test(`the invited ${key} signs in from the mail and lands on their page`, async ({
			browser,
			baseURL
		}) => {
			const person = invitees[key];
			const page = await pageOf(browser, person);
			await page.goto(invitationLinks.get(person.email)!);
			const before = await lastMailId(person.email);
			await page.getByLabel('E-mail address').fill(person.email);
			await page.getByRole('button', { name: 'Send me a sign-in link' }).click();
			await expect(page.getByRole('heading', { name: 'Check your e-mail' })).toBeVisible();
			await page.goto(firstLink(await waitForMail(person.email, before)));
			await expect(page).toHaveURL(`${baseURL}${person.home}`);
			await expect(page.getByRole('heading', { level: 1, name: person.heading })).toBeVisible();
			await expectAccessible(page);
			await page.close();
		});
	}
});
