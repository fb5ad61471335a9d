import { expect, test } from '@playwright/test';
import { expectAccessible } from './support/axe';
import { withDb } from './support/judging-fixture';
import { firstLink, lastMailId, waitForMail } from './support/mail';
import { requestSignInLink, signIn } from './support/session';

// Each demo role signs in by e-mail link, lands on its own page, and is refused another role's page.
const roles = [
	{
		email: 'admin@crownbench.test',
		home: '/admin',
		link: 'Society admin',
		heading: 'Society admin',
		refused: '/judging'
	},
	{
		email: 'chair@crownbench.test',
		home: '/chair',
		link: 'Show chair',
		heading: 'Show chair',
		refused: '/admin'
	},
	{
		email: 'clerk@crownbench.test',
		home: '/desk',
		link: 'Clerk',
		heading: 'Entry desk',
		refused: '/chair'
	},
	{
		email: 'judge1@crownbench.test',
		home: '/judging',
		link: 'Judge',
		heading: 'Judging',
		refused: '/desk'
	},
	{
		email: 'member@crownbench.test',
		home: '/my',
		link: 'Member',
		heading: 'My entries',
		refused: '/chair'
	}
];

for (const role of roles) {
	test(`${role.heading}: signs in by e-mail link and is refused ${role.refused}`, async ({
		page
	}) => {
		await signIn(page, role.email);
		if (!page.url().endsWith(role.home)) {
			await expect(page).toHaveURL(/\/home$/);
			await page.getByRole('main').getByRole('link', { name: role.link, exact: true }).click();
		}
		await expect(page).toHaveURL(new RegExp(`${role.home}$`));
		await expect(page.getByRole('heading', { level: 1, name: role.heading })).toBeVisible();
		await expectAccessible(page);

		const refused = await page.goto(role.refused);
		expect(refused?.status()).toBe(403);
		await expect(
			page.getByText('Your account does not have the role this page needs.')
		).toBeVisible();
		await expect(page.getByRole('link', { name: 'Go to the start page' })).toBeVisible();
	});
}

test('a signed-out visitor is sent to sign in, and an API answers 401', async ({
	page,
	request
}) => {
	await page.goto('/chair');
	await expect(page).toHaveURL(/\/signin\?next=%2Fchair$/);
	await expectAccessible(page);
	const api = await request.get('/api/chair/shows');
	expect(api.status()).toBe(401);
});

test('a new address gets an account that sees only public pages', async ({ page }) => {
	const email = `newcomer-${Date.now()}@crownbench.test`;
	await signIn(page, email);
	await expect(page.getByText('Your account is ready')).toBeVisible();
	await expectAccessible(page);
	const refused = await page.goto('/my');
	expect(refused?.status()).toBe(403);
	await page.goto('/');
	await expect(page.getByRole('heading', { level: 1, name: 'Plant society shows' })).toBeVisible();
	await expectAccessible(page);
});

test('a malformed address gets a clear message and sends nothing', async ({ page }) => {
	await page.goto('/signin');
	await page.getByLabel('E-mail address').fill('not-an-address');
	await page.getByRole('button', { name: 'Send me a sign-in link' }).click();
	await expect(page.getByText('Enter a complete e-mail address')).toBeVisible();
	await expect(page.getByLabel('E-mail address')).toHaveAttribute('aria-invalid', 'true');
	await expectAccessible(page);
});

test('a sign-in link works once', async ({ page, context }) => {
	const link = await requestSignInLink(page, 'judge2@crownbench.test');
	await page.goto(link);
	await expect(page.getByRole('heading', { level: 1, name: 'Judging' })).toBeVisible();
	await context.clearCookies();
	await page.goto(link);
	await expect(page).toHaveURL(/\/signin\/problem/);
	await expect(page.getByText('expired or has already been used')).toBeVisible();
});

test('a sign-in link expires: an old link is refused and signs nobody in', async ({ page }) => {
	const email = 'judge3@crownbench.test';
	const link = await requestSignInLink(page, email);
	// The link lives SIGN_IN_LINK_MINUTES (30): short-lived sign-in links are common practice.
	const minutesLeft = await withDb(async (db) => {
		const { rows } = await db.query<{ minutes: number }>(
			`SELECT EXTRACT(EPOCH FROM (max(expires) - now())) / 60 AS minutes
			   FROM verification_tokens WHERE identifier = $1`,
			[email]
		);
		return Number(rows[0].minutes);
	});
	expect(minutesLeft).toBeGreaterThan(28);
	expect(minutesLeft).toBeLessThanOrEqual(30);
	// Half an hour later: the link's time is up.
	await withDb((db) =>
		db.query(
			`UPDATE verification_tokens SET expires = now() - interval '1 minute' WHERE identifier = $1`,
			[email]
		)
	);
	await page.goto(link);
	await expect(page).toHaveURL(/\/signin\/problem/);
	await expect(page.getByText('expired or has already been used')).toBeVisible();
	await page.goto('/judging');
	await expect(page).toHaveURL(/\/signin/);
});

test('signing out ends the session', async ({ page }) => {
	await signIn(page, 'clerk@crownbench.test', { fresh: true });
	await page.getByRole('button', { name: 'Sign out' }).click();
	await expect(page.getByRole('link', { name: 'Sign in' })).toBeVisible();
	await page.goto('/desk');
	await expect(page).toHaveURL(/\/signin/);
});

test('too many sign-in links for one address are refused with a clear message', async ({
	page,
	request,
	baseURL
}) => {
	const email = `hurry-${Date.now()}@crownbench.test`;
	const limit = Number(process.env.CB_SIGNIN_LIMIT_PER_ADDRESS ?? 5);
	for (let i = 0; i < limit; i++) {
		const response = await request.post('/signin', {
			form: { providerId: 'nodemailer', redirectTo: '/home', email },
			headers: { origin: baseURL ?? '' },
			maxRedirects: 0
		});
		expect(response.status()).toBeLessThan(400);
	}
	await page.goto('/signin');
	await page.getByLabel('E-mail address').fill(email);
	await page.getByRole('button', { name: 'Send me a sign-in link' }).click();
	await expect(
		page.getByText(/Too many sign-in links were asked for\. Try again in \d+ minutes?\./)
	).toBeVisible();
});

// i-sec: sign-in links name the configured address; one guarded way to ask for them.
test('a sign-in request with a forged Host or X-Forwarded-Host mails a link to the configured address', async ({
	request,
	baseURL
}) => {
	const email = `forged-host-${Date.now()}@crownbench.test`;
	const forged: Record<string, string>[] = [
		{ host: 'attacker.example' },
		{ 'x-forwarded-host': 'attacker.example', 'x-forwarded-proto': 'https' },
		{ host: 'attacker.example:8443', 'x-forwarded-host': 'attacker.example' },
		// Malformed: answered without a 500, and still no other host in the link.
		{ 'x-forwarded-host': 'bad host/<x>' }
	];
	for (const headers of forged) {
		const before = await lastMailId(email);
		const response = await request.post('/signin', {
			form: { providerId: 'nodemailer', redirectTo: '/home', email },
			headers: { origin: baseURL ?? '', ...headers },
			maxRedirects: 0
		});
		expect(response.status(), JSON.stringify(headers)).toBeLessThan(400);
		const link = firstLink(await waitForMail(email, before));
		expect(new URL(link).origin, JSON.stringify(headers)).toBe(new URL(baseURL ?? '').origin);
		expect(link).not.toContain('attacker');
		expect(decodeURIComponent(link)).not.toContain('attacker');
	}
});

test('Auth.js’s own sign-in endpoint is closed: no mail, whatever the address', async ({
	request,
	baseURL
}) => {
	for (const email of ['a@b', `direct-${Date.now()}@crownbench.test`]) {
		const before = await lastMailId(email);
		const response = await request.post('/auth/signin/nodemailer', {
			form: { email, callbackUrl: '/home' },
			headers: { origin: baseURL ?? '' },
			maxRedirects: 0
		});
		expect(response.status()).toBe(404);
		await new Promise((r) => setTimeout(r, 500));
		expect(await lastMailId(email)).toBe(before);
	}
});

test('GET /auth/session gives page scripts no session token and no internal ids', async ({
	page
}) => {
	await signIn(page, 'member@crownbench.test');
	const answer = await page.request.get('/auth/session');
	expect(answer.status()).toBe(200);
	const text = await answer.text();
	const token = (await page.context().cookies()).find((c) =>
		c.name.endsWith('authjs.session-token')
	)?.value;
	expect(token).toBeTruthy();
	expect(text).not.toContain(token!);
	const body = JSON.parse(text) as Record<string, unknown>;
	expect(Object.keys(body).sort()).toEqual(['expires', 'user']);
	expect(Object.keys(body.user as object).sort()).toEqual(['email', 'name']);
	expect(text).not.toMatch(/sessionToken|userId|"id"/);
});
