import { expect, test, type Browser, type BrowserContext, type Page } from '@playwright/test';
import { expectAccessible } from './support/axe';
import { firstLink, lastMailId, waitForMail } from './support/mail';
import { requestSignInLink } from './support/session';

/**
 * A society's season from an empty database (the 'fresh' project: a built app on a database with
 * the migrations and no demo seed). Serial steps that share the people and the society below:
 * the founder starts the society and invites the others; the chair builds a show from empty with
 * a scale of their own and publishes its schedule; the member enters (a trailer into a
 * single-crown class first, refused); the clerk checks the entry in; the judge scores it; the
 * chair publishes the results; the member's placements mail arrives. Everything through the pages.
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

/** Today's date in a time zone, as YYYY-MM-DD (the society's day decides the show's stage). */
function todayIn(timeZone: string): string {
	return new Intl.DateTimeFormat('en-CA', { timeZone }).format(new Date());
}
/** A date a year before today: the plant has been owned longer than any possession period. */
function yearAgo(): string {
	const d = new Date();
	d.setFullYear(d.getFullYear() - 1);
	return d.toISOString().slice(0, 10);
}

/**
 * The society's own scale, made by the chair: the criteria and points of the published African
 * violet scale for standard plants (symmetry 25, condition 25, quantity of bloom 25, size and type
 * of blossom 15, color of blossom 10: "A Beginner's Guide to Judging", AVM 1993, rev. 2020, as
 * DOMAIN.md gives it), under a name of the society's own.
 */
const scale = {
	name: `Brookfield bench scale ${run}`,
	criteria: [
		{ label: 'Symmetry or leaf pattern', points: 25 },
		{ label: 'Condition', points: 25 },
		{ label: 'Quantity of bloom', points: 25 },
		{ label: 'Size and type of blossom', points: 15 },
		{ label: 'Color of blossom', points: 10 }
	]
};
/**
 * Deductions the judge makes on each criterion: 100 less 5 is 95, a blue ribbon under merit
 * judging (90 and over: the national handbook's minimum, from memory, and the default of a new
 * show's award rules) and best in class as the class's only entry that reaches it.
 */
const deductions = [1, 1.5, 1, 1, 0.5];
const expectedScore = 95;

const show = {
	name: `Brookfield First Show ${run}`,
	slug: `first-show-${run}`,
	venue: 'Community hall, room 2'
};
/** Two divisions and three classes; class 1 takes single-crown standards, class 2 trailers. */
const divisions = [
	{ code: 'I', name: 'Standard plants' },
	{ code: 'II', name: 'Trailers and small plants' }
];
const classes = [
	{
		division: 'I',
		code: '1',
		name: 'Standard single crowns',
		habit: 'Single crown',
		sizes: ['standard']
	},
	{ division: 'II', code: '2', name: 'Trailers of any size', habit: 'Trailer', sizes: [] },
	{
		division: 'II',
		code: '3',
		name: 'Miniature single crowns',
		habit: 'Single crown',
		sizes: ['miniature', 'semiminiature']
	}
];
/** Invented varieties for the society's empty registry (no real variety or hybridizer). */
const varieties = {
	single: { name: `Quillmoor Dawn ${run}`, habit: 'Single crown', size: 'standard' },
	trailer: { name: `Pebblewash Ramble ${run}`, habit: 'Trailer', size: 'standard' }
};
/** The member's accepted entry, read from the page. */
let entryNumber = 0;

/** A page in the person's own browser context (their session stays for the later steps). */
async function pageOf(browser: Browser, person: Person): Promise<Page> {
	person.context ??= await browser.newContext();
	return person.context.newPage();
}

test.describe.serial('a new society from an empty database', () => {
	// Each step waits on mail and pages of a cold built app; the first ones ran near a minute on a
	// busy machine.
	test.describe.configure({ timeout: 120_000 });

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
	test('the chair builds a show from empty with a scale of their own and publishes its schedule', async ({
		browser
	}) => {
		test.setTimeout(180_000);
		const chair = await pageOf(browser, invitees.chair);

		// The society's own scale of points, with its total shown while editing.
		await chair.goto(`/chair/scales?society=${society.slug}`);
		await expect(chair.getByRole('heading', { level: 1, name: 'Scales of points' })).toBeVisible();
		await expectAccessible(chair);
		const scaleForm = chair.locator('#scale-form');
		await scaleForm.getByLabel('Name of the scale').fill(scale.name);
		for (const [i, c] of scale.criteria.entries()) {
			await scaleForm.locator(`#criterion-${i}`).fill(c.label);
			await scaleForm.locator(`#points-${i}`).fill(String(c.points));
		}
		await expect(chair.getByTestId('scale-total')).toHaveText('Total: 100 points');
		await scaleForm.getByRole('button', { name: 'Add the scale' }).click();
		await expect(chair.getByRole('heading', { level: 2, name: scale.name })).toBeVisible();

		// The registry is empty in a new society: the chair adds the two varieties the member grows.
		await chair.goto(`/chair/varieties?society=${society.slug}`);
		await expectAccessible(chair);
		for (const v of Object.values(varieties)) {
			await chair.getByLabel('Name', { exact: true }).fill(v.name);
			await chair.getByLabel('Hybridizer').fill('Brookfield trial grower');
			await chair.getByLabel('Growth form').selectOption({ label: v.habit });
			await chair.getByLabel('Size class').selectOption(v.size);
			await chair.getByLabel('Blossom type').fill('single');
			await chair.getByLabel('Blossom colors').fill('pink');
			await chair.getByRole('button', { name: 'Add to the registry' }).click();
			await expect(chair.getByText(`“${v.name}” is saved in the registry.`)).toBeVisible();
		}

		// A show from empty: entries open today in the society's time zone, so the member can enter
		// now; entry and judging day are today too, so the desk and the judge work on the same day.
		const today = todayIn('America/Toronto');
		await chair.goto('/chair/shows/new');
		await expect(chair.getByRole('heading', { level: 1, name: 'Start a show' })).toBeVisible();
		const empty = chair.locator('form[action="?/create"]');
		await empty.getByLabel('Name of the show').fill(show.name);
		await empty.getByLabel('Short name for addresses').fill(show.slug);
		await empty.getByLabel('Venue').fill(show.venue);
		await empty.getByLabel('Entries open').fill(today);
		await empty.getByLabel('Entries close').fill(today);
		await empty.getByLabel('Entry day').fill(today);
		await empty.getByLabel('Judging day').fill(today);
		await empty.getByLabel('Judging system').selectOption('merit');
		await empty.getByRole('button', { name: 'Start the show' }).click();
		await expect(chair).toHaveURL(new RegExp(`/chair/shows/${show.slug}`));
		await expect(chair.getByRole('heading', { level: 1, name: show.name })).toBeVisible();
		await expect(chair.getByText('Stage: Being planned.')).toBeVisible();
		// The award rules the score is read against: a new show's merit minimums.
		await expect(chair.getByLabel('Award system')).toHaveValue('merit');
		await expect(chair.getByLabel('Blue', { exact: true })).toHaveValue('90');
		await expectAccessible(chair);

		// Good standing needs dues on record, and a society that has just started has not collected
		// any yet (its dues periods come later): for this first show the chair lets every member
		// enter, as a new society would, instead of asking the admin to invent dues payments.
		await chair.getByLabel('Exhibitors must be members in good standing').uncheck();
		await chair.getByRole('button', { name: 'Save dates and rules' }).click();
		await expect(chair.getByText('The show’s dates and rules are saved.')).toBeVisible();
		await chair.reload();
		await expect(chair.getByLabel('Exhibitors must be members in good standing')).not.toBeChecked();

		// The schedule, edited while the show is being planned.
		await chair.goto(`/chair/shows/${show.slug}/schedule`);
		await expect(chair.getByText('No divisions yet; add the first one.')).toBeVisible();
		await expectAccessible(chair);
		for (const d of divisions) {
			await chair.locator('#division-code').fill(d.code);
			await chair.locator('#division-name').fill(d.name);
			await chair.getByRole('button', { name: 'Add the division' }).click();
			await expect(
				chair.getByRole('heading', { level: 2, name: `Division ${d.code}: ${d.name}` })
			).toBeVisible();
		}
		const classForm = chair.locator('#class-form');
		for (const c of classes) {
			const division = divisions.find((d) => d.code === c.division)!;
			await classForm
				.getByLabel('Division')
				.selectOption({ label: `${division.code}: ${division.name}` });
			await classForm.getByLabel('Class code').fill(c.code);
			await classForm.getByLabel('Class name').fill(c.name);
			await classForm.getByLabel('Habit').selectOption({ label: c.habit });
			for (const size of c.sizes) {
				await classForm.getByRole('checkbox', { name: size, exact: true }).check();
			}
			await classForm.getByLabel('Scale of points').selectOption({ label: scale.name });
			await classForm.getByRole('button', { name: 'Add the class' }).click();
			await expect(chair.getByText(`Class ${c.code}. ${c.name}`, { exact: true })).toBeVisible();
		}

		// One panel with the judge, judging every class.
		await chair.goto(`/chair/shows/${show.slug}/panels`);
		await chair.getByLabel('New panel').fill('Panel A');
		await chair.getByRole('button', { name: 'Add panel' }).click();
		await expect(chair.getByText('Panel A added.')).toBeVisible();
		await chair.getByLabel('Add a judge to Panel A').selectOption({ label: invitees.judge.email });
		await chair.getByRole('button', { name: 'Add judge' }).click();
		await expect(chair.getByText('Judge added.')).toBeVisible();
		for (const [i, c] of classes.entries()) {
			await chair
				.getByLabel(new RegExp(`Class ${c.code} ${c.name}`))
				.selectOption({ label: 'Panel A' });
			await chair.getByRole('button', { name: `Save the panel of class ${c.code}` }).click();
			await expect(chair.getByText('now: Panel A')).toHaveCount(i + 1);
		}
		await expectAccessible(chair);

		// Publishing the schedule opens entries today.
		await chair.goto(`/chair/shows/${show.slug}`);
		await chair.getByRole('button', { name: 'Publish the schedule' }).click();
		await expect(chair.getByText('Stage: Taking entries.')).toBeVisible();
		await expect(chair.getByText('The schedule is public.')).toBeVisible();
		await chair.close();
	});

	test('the member enters: a trailer in a single-crown class is refused, a fitting plant is accepted', async ({
		browser
	}) => {
		const member = await pageOf(browser, invitees.member);
		await member.goto('/my');
		await member.getByRole('link', { name: new RegExp(`^Enter plants in ${show.name}`) }).click();
		await expect(member.getByRole('heading', { level: 1, name: 'Enter plants' })).toBeVisible();
		await expectAccessible(member);
		const classOne = `I · 1. ${classes[0].name}`;

		const choose = async (name: string) => {
			await member.getByLabel('Variety').fill(name);
			await member.getByRole('button', { name: `Choose ${name}`, exact: true }).click();
			await expect(member.getByText(`Chosen: ${name}`)).toBeVisible();
		};

		// The trailer in the single-crown class: the form and then the server say why not.
		await choose(varieties.trailer.name);
		await member.getByLabel('Class').selectOption({ label: classOne });
		await member.getByLabel('The day you got the plant').fill(yearAgo());
		const reason = `This class is for single-crown plants, and "${varieties.trailer.name}" is a trailer.`;
		await expect(member.getByText('This plant does not fit the class')).toBeVisible();
		await member.getByRole('button', { name: 'Enter this plant' }).click();
		// The server's answer names the reason, in the error notice above the form.
		const refusal = member.getByRole('alert').filter({
			hasText: 'This entry was refused; nothing was entered.'
		});
		await expect(refusal).toBeVisible();
		await expect(refusal.getByText(reason)).toBeVisible();
		await expect(member.getByRole('cell', { name: varieties.trailer.name })).toHaveCount(0);
		await expectAccessible(member);

		// The single-crown standard in the same class fits and is entered.
		await choose(varieties.single.name);
		await member.getByLabel('Class').selectOption({ label: classOne });
		await member.getByLabel('The day you got the plant').fill(yearAgo());
		await expect(member.getByText('This plant fits the class.')).toBeVisible();
		await member.getByRole('button', { name: 'Enter this plant' }).click();
		const entered = member.getByText(/Entered as number \d+\./);
		await expect(entered).toBeVisible();
		entryNumber = Number((await entered.textContent())!.match(/number (\d+)/)![1]);
		await expect(member.getByRole('cell', { name: varieties.single.name })).toBeVisible();
		await member.close();
	});

	test('the clerk checks the entry in at the desk', async ({ browser }) => {
		expect(entryNumber).toBeGreaterThan(0);
		const clerk = await pageOf(browser, invitees.clerk);
		await clerk.goto(`/desk/${show.slug}`);
		await expect(clerk.getByRole('heading', { level: 1, name: 'Entry desk' })).toBeVisible();
		await expectAccessible(clerk);
		// A search sent while the page is still starting up can be lost on a busy machine: search
		// again until the entry shows (as entries-and-desk.spec.ts does).
		const found = clerk.getByRole('link', { name: String(entryNumber), exact: true });
		await expect(async () => {
			await clerk.getByLabel('Entry number or name').fill(String(entryNumber));
			await clerk.getByRole('button', { name: 'Find' }).click();
			await expect(found).toBeVisible({ timeout: 3000 });
		}).toPass({ timeout: 20_000 });
		await found.click();
		await expect(
			clerk.getByRole('heading', { level: 1, name: `Entry ${entryNumber}` })
		).toBeVisible();
		// A standard is over 8 in (20.3 cm) across (growers' references, DOMAIN.md): 30 cm fits.
		await clerk.getByLabel('centimeters').check();
		await clerk.getByLabel('Diameter (cm)').fill('30');
		await clerk.getByLabel('Crowns').fill('1');
		await clerk.getByLabel('Pot size (cm)').fill('11');
		await clerk.getByRole('button', { name: 'Check in' }).click();
		await expect(clerk.getByText(`Entry ${entryNumber} is checked in.`)).toBeVisible();
		await expectAccessible(clerk);
		await clerk.close();
	});

	test('the judge scores the entry on the tablet page', async ({ browser }) => {
		invitees.judge.context ??= await browser.newContext();
		const judge = await invitees.judge.context.newPage();
		await judge.setViewportSize({ width: 768, height: 1024 });
		await judge.goto('/judging');
		await judge.getByRole('link', { name: new RegExp(`Class 1 ${classes[0].name}`) }).click();
		await expect(judge.getByRole('heading', { level: 1, name: 'Class 1' })).toBeVisible();
		await judge.getByRole('link', { name: new RegExp(`Entry ${entryNumber}\\b`) }).click();
		await expect(
			judge.getByRole('heading', { level: 1, name: `Entry ${entryNumber}` })
		).toBeVisible();
		await expectAccessible(judge);
		const criteria = scale.criteria.map((c) => c.label);
		for (let i = 0; i < criteria.length - 1; i++) {
			const input = judge.getByLabel(criteria[i], { exact: true });
			await input.fill(String(deductions[i]));
			await input.press('Tab');
		}
		const last = criteria[criteria.length - 1];
		for (let n = 0; n < deductions[criteria.length - 1] * 2; n++) {
			await judge.getByRole('button', { name: `Deduct half a point on ${last}` }).click();
		}
		await expect(judge.getByTestId('running-total')).toHaveText(String(expectedScore));
		// Every change is saved without a button; wait until the page says so.
		await expect(judge.locator('[data-sync]')).toHaveAttribute('data-sync', 'saved', {
			timeout: 20_000
		});
		await judge.close();
	});

	test('the chair publishes the results and the member’s placements mail arrives', async ({
		browser
	}) => {
		const chair = await pageOf(browser, invitees.chair);
		const before = await lastMailId(invitees.member.email);
		await chair.goto(`/chair/shows/${show.slug}/awards`);
		await expectAccessible(chair);
		await chair.getByRole('button', { name: 'Publish results' }).click();
		await chair.getByRole('button', { name: 'Yes, publish the results' }).click();
		await expect(chair.getByText(/placements? e-mails? (is|are) on (its|their) way/)).toBeVisible();

		const mail = await waitForMail(invitees.member.email, before, 30_000);
		expect(mail.subject).toBe(`Your results: ${show.name}`);
		expect(mail.text).toContain(
			`Entry ${entryNumber}, class 1 (${classes[0].name}): ${varieties.single.name}`
		);
		// Best in class goes to a blue-ribbon entry only (merit judging, DOMAIN.md); the only entry.
		expect(mail.text).toContain('Award: Best in class, Blue ribbon');
		expect(mail.text).toContain(`Score: ${expectedScore}`);
		await chair.close();
	});
});
