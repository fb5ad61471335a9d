import { expect, test, type Page } from '@playwright/test';
import pg from 'pg';
import { expectAccessible } from './support/axe';
import { firstLink, lastMailId, waitForMail } from './support/mail';
import { signIn } from './support/session';

/** Runs SQL on the e2e database (the same one the built app uses). */
async function sql<T extends pg.QueryResultRow>(
	text: string,
	values: unknown[] = []
): Promise<T[]> {
	const client = new pg.Client({ connectionString: process.env.DATABASE_URL });
	await client.connect();
	try {
		return (await client.query<T>(text, values)).rows;
	} finally {
		await client.end();
	}
}

/**
 * A member of the demo society whose dues ran out four months ago, like lapsed@crownbench.test,
 * but of this test alone, so other tests still find the demo's lapsed member lapsed.
 */
async function newLapsedMember(tag: string): Promise<string> {
	const email = `${tag}-${Date.now()}@crownbench.test`;
	await sql(
		`WITH u AS (INSERT INTO users (id, name, email) VALUES (gen_random_uuid(), $2, $1) RETURNING id)
		 INSERT INTO memberships (society_id, user_id, roles, household, dues_paid_through)
		 SELECT s.id, u.id, ARRAY['member']::varchar(16)[], $2, (current_date - interval '4 months')::date
		   FROM societies s, u WHERE s.slug = 'larkspur-valley'`,
		[email, `Lapsed ${tag}`]
	);
	return email;
}

/** Pays on the local payment fake's checkout page and waits to be back in the app. */
async function payOnCheckout(page: Page, backTo: RegExp): Promise<void> {
	await expect(page).toHaveURL(/\/checkout\/cs_test_\w+$/);
	await expect(page.getByRole('heading', { name: 'Test checkout' })).toBeVisible();
	await page.getByRole('button', { name: /^Pay / }).click();
	await expect(page).toHaveURL(backTo);
}

test('a lapsed member is told to pay before entering, pays dues through the fake checkout, and the entry goes through', async ({
	page
}) => {
	const email = await newLapsedMember('lapsed-pays');
	// A plant grown long enough, measured single-crowned and in bloom: ready but for the dues.
	await sql(
		`WITH p AS (
		   INSERT INTO plants (owner_id, variety_id, obtained_how, obtained_on, pot_size_in)
		   SELECT u.id, v.id, 'bought', current_date - 200, 5.00
		     FROM users u, varieties v JOIN societies s ON s.id = v.society_id
		    WHERE u.email = $1 AND s.slug = 'larkspur-valley' AND v.name = 'Granary Snow'
		   RETURNING id)
		 INSERT INTO plant_events (plant_id, kind, happened_on, diameter_in, crowns)
		 SELECT p.id, 'measured', current_date - 20, 12.5, 1 FROM p
		 UNION ALL SELECT p.id, 'in_bloom', current_date - 9, NULL, NULL FROM p`,
		[email]
	);
	await signIn(page, email);
	const readiness = async () => {
		await page.goto('/my/plants/readiness');
		const spring = await page.getByRole('option', { name: /^Spring Show/ }).getAttribute('value');
		await page.goto(`/my/plants/readiness?show=${spring}`);
		return page.getByRole('listitem').filter({
			has: page.getByRole('heading', { level: 2, name: 'Granary Snow' })
		});
	};
	let card = await readiness();
	await expect(card.getByText(/open only to members in good standing/).first()).toBeVisible();
	await expect(card.getByRole('button', { name: /^Enter Granary Snow/ })).toHaveCount(0);
	await expectAccessible(page);
	await card.getByRole('link', { name: 'Pay your dues' }).first().click();

	await expect(page.getByRole('heading', { level: 1, name: 'My membership' })).toBeVisible();
	await expect(page.getByText('Your dues have lapsed.')).toBeVisible();
	await expect(page.getByText('pay your dues to be in good standing for it.')).toBeVisible();
	await expectAccessible(page);

	// Leaving the checkout charges nothing and changes nothing.
	await page.getByRole('button', { name: /^Pay One year of membership/ }).click();
	await expect(page).toHaveURL(/\/checkout\/cs_test_\w+$/);
	await page.getByRole('button', { name: 'Cancel' }).click();
	await expect(page.getByText('You left the checkout; nothing was charged.')).toBeVisible();
	await expect(page.getByText('Your dues have lapsed.')).toBeVisible();

	const before = await lastMailId(email);
	// Demo setting: one year of membership costs 25.00 (seeders/20261205000500-demo-dues-and-fees).
	await page.getByRole('button', { name: 'Pay One year of membership, $25.00' }).click();
	await payOnCheckout(page, /\/my\/membership\?paid=cs_test_\w+$/);
	await expect(page.getByText('Thank you: your payment is recorded.')).toBeVisible();
	await expect(page.getByText('Your membership is current.')).toBeVisible();
	await expect(page.getByText('you are in good standing for it.')).toBeVisible();
	await expect(page.getByRole('cell', { name: 'Paid', exact: true })).toBeVisible();
	await expectAccessible(page);

	const receipt = await waitForMail(email, before);
	expect(receipt.subject).toBe('Receipt from Larkspur Valley Violet Circle: $25.00');
	expect(receipt.text).toContain('Your dues are now paid through');

	// Now the entry goes through.
	card = await readiness();
	await expect(card.getByText(/open only to members in good standing/)).toHaveCount(0);
	await card
		.getByRole('button', { name: /^Enter Granary Snow in class/ })
		.first()
		.click();
	await expect(page.getByText(/Entered as entry \d+\./)).toBeVisible();
	const [entry] = await sql<{ fee_status: string }>(
		`SELECT e.fee_status FROM entries e JOIN users u ON u.id = e.exhibitor_id WHERE u.email = $1`,
		[email]
	);
	// The spring show charges an entry fee (demo setting), so the new entry owes it.
	expect(entry.fee_status).toBe('due');
});

test('a member pays the entry fees of a show, and the entries show as paid', async ({ page }) => {
	const email = await newLapsedMember('fee-payer');
	// An entry in the spring show (taking entries, with the demo's fee); never the judged autumn
	// show, whose results another test publishes.
	await sql(
		`INSERT INTO entries (show_id, class_id, exhibitor_id, title, number, fee_status)
		 SELECT c.show_id, c.id, u.id, 'Fee test plant', 80000 + floor(random() * 9000)::int, 'due'
		   FROM classes c JOIN shows s ON s.id = c.show_id JOIN societies so ON so.id = s.society_id,
		        users u
		  WHERE so.slug = 'larkspur-valley' AND s.slug LIKE 'larkspur-spring-%' AND u.email = $1
		  ORDER BY c.position LIMIT 1`,
		[email]
	);
	await signIn(page, email);
	await page.goto('/my/payments');
	await expect(page.getByRole('heading', { level: 1, name: 'Entry fees' })).toBeVisible();
	await expect(page.getByText('Fee test plant: Fee due')).toBeVisible();
	await expectAccessible(page);
	// Demo setting: 2.00 per entry.
	await page.getByRole('button', { name: 'Pay $2.00' }).click();
	await payOnCheckout(page, /\/my\/payments\?paid=cs_test_\w+$/);
	await expect(page.getByText('Thank you: your payment is recorded.')).toBeVisible();
	await expect(page.getByText('Fee test plant: Paid')).toBeVisible();
	await expect(page.getByText('Nothing due for this show.')).toBeVisible();
	await expectAccessible(page);
});

test('the admin sorts and filters members on the server, invites someone and takes a role away after confirming', async ({
	page
}) => {
	await signIn(page, 'admin@crownbench.test');
	await page.goto('/admin');
	await page.getByRole('link', { name: 'Members, invitations and roles' }).click();
	await expect(page.getByRole('heading', { level: 1, name: 'Members' })).toBeVisible();
	await expectAccessible(page);

	const table = page.getByRole('table', { name: /Members of/ });
	// Sorting: the header asks the server, and says how the table is sorted.
	const duesHeader = table.getByRole('columnheader', { name: /Dues paid through/ });
	await duesHeader.getByRole('button').click();
	await expect(duesHeader).toHaveAttribute('aria-sort', 'ascending');
	await expect(page).toHaveURL(/sort=duesPaidThrough&dir=asc/);
	// Lapsed members have the earliest dues dates, so they come first.
	await expect(table.getByRole('row').nth(1)).toContainText('Lapsed');
	await duesHeader.getByRole('button').click();
	await expect(duesHeader).toHaveAttribute('aria-sort', 'descending');

	// Filtering by standing.
	await page.getByLabel('Standing').selectOption('lapsed');
	await expect(page).toHaveURL(/standing=lapsed/);
	await expect(table.getByRole('cell', { name: 'Current', exact: true })).toHaveCount(0);
	await expect(table.getByText('Gordon Pellicane')).toBeVisible();
	await page.getByLabel('Standing').selectOption({ label: 'Any standing' });

	// Invitation: the roles hold at once and a sign-in link goes out.
	const invitee = `invitee-${Date.now()}@crownbench.test`;
	await page.getByLabel('E-mail address').fill(invitee);
	await page.getByLabel('Name (optional)').fill('Ottilie Invited');
	await page.getByRole('checkbox', { name: 'Clerk' }).first().check();
	await page.getByRole('button', { name: 'Send invitation' }).click();
	await expect(page.getByText(`Invitation sent to ${invitee}.`)).toBeVisible();
	const invitation = await waitForMail(invitee, 0);
	expect(invitation.subject).toBe('You are invited to Larkspur Valley Violet Circle on Crownbench');
	expect(firstLink(invitation)).toMatch(/\/signin$/);

	await page.getByLabel('Search name or e-mail').fill('Ottilie');
	await expect(table.getByRole('row')).toHaveCount(2);
	await expect(table).toContainText('invited, not signed in yet');
	await expect(table).toContainText('Clerk, Member');

	// Taking a role away asks first.
	await table.getByRole('button', { name: 'Change roles of Ottilie Invited' }).click();
	const dialog = page.getByRole('dialog', { name: 'Roles of Ottilie Invited' });
	await dialog.getByRole('checkbox', { name: 'Clerk' }).uncheck();
	await dialog.getByRole('button', { name: 'Save roles' }).click();
	const confirm = page.getByRole('dialog', { name: 'Take roles away from Ottilie Invited?' });
	await expect(confirm.getByText('will no longer be: Clerk')).toBeVisible();
	await expectAccessible(page);
	await confirm.getByRole('button', { name: 'Yes, take away' }).click();
	await expect(page.getByText('Roles saved: Member.')).toBeVisible();
	await expect(table.getByRole('row').nth(1)).toContainText('Member');
	await expect(table.getByRole('row').nth(1)).not.toContainText('Clerk');

	// The invited person signs in and has the member area.
	const context = await page.context().browser()!.newContext();
	const other = await context.newPage();
	await signIn(other, invitee);
	await other.goto('/my/membership');
	await expect(other.getByRole('heading', { level: 1, name: 'My membership' })).toBeVisible();
	await context.close();
});

test('the admin adds a dues period and sets an entry fee; bad amounts are refused', async ({
	page
}) => {
	await signIn(page, 'admin@crownbench.test');
	await page.goto('/admin/dues');
	await expect(page.getByRole('heading', { level: 1, name: 'Dues and fees' })).toBeVisible();
	await expectAccessible(page);

	const label = `Half year ${Date.now()}`;
	await page.getByLabel('Name', { exact: true }).fill(label);
	await page.getByLabel(/^Amount/).fill('twelve');
	await page.getByLabel('First day').fill('2031-01-01');
	await page.getByLabel('Last day (dues paid through)').fill('2031-06-30');
	await page.getByRole('button', { name: 'Add period' }).click();
	await expect(page.getByText('Enter an amount, like 25.00.')).toBeVisible();
	await expect(page.getByLabel(/^Amount/)).toHaveAttribute('aria-invalid', 'true');
	await expectAccessible(page);

	await page.getByLabel(/^Amount/).fill('12.50');
	await page.getByRole('button', { name: 'Add period' }).click();
	await expect(page.getByText(`Added “${label}”.`)).toBeVisible();
	await expect(page.getByRole('row', { name: new RegExp(label) })).toContainText('$12.50');

	const fee = page.getByLabel(/^Fee per entry/).first();
	await fee.fill('-3');
	await page.getByRole('button', { name: 'Save fee' }).first().click();
	await expect(page.getByText('Enter an amount, like 25.00.')).toBeVisible();
	await fee.fill('2.00');
	await page.getByRole('button', { name: 'Save fee' }).first().click();
	await expect(page.getByText('Entry fee saved.')).toBeVisible();
});
