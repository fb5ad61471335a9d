import { expect, type Cookie, type Page } from '@playwright/test';
import { firstLink, lastMailId, waitForMail } from './mail';

/** Sessions already made in this worker, by address: later tests reuse them instead of new mail. */
const sessions = new Map<string, Cookie[]>();

/** Asks for a sign-in link on the sign-in page and returns the link from the mail that arrives. */
export async function requestSignInLink(page: Page, email: string): Promise<string> {
	const before = await lastMailId(email);
	await page.goto('/signin');
	await page.getByLabel('E-mail address').fill(email);
	await page.getByRole('button', { name: 'Send me a sign-in link' }).click();
	await expect(page.getByRole('heading', { name: 'Check your e-mail' })).toBeVisible();
	return firstLink(await waitForMail(email, before));
}

/**
 * Signs in through the real e-mail link flow and lands where the link leads (/home). The session
 * is reused by later tests of this worker; `fresh` makes a new one that is not shared (for tests
 * that sign out).
 */
export async function signIn(
	page: Page,
	email: string,
	options: { fresh?: boolean } = {}
): Promise<void> {
	const known = options.fresh ? undefined : sessions.get(email);
	if (known) {
		await page.context().addCookies(known);
		await page.goto('/home');
		return;
	}
	const link = await requestSignInLink(page, email);
	await page.goto(link);
	if (!options.fresh) {
		const cookies = await page.context().cookies();
		sessions.set(
			email,
			cookies.filter((c) => c.name.endsWith('authjs.session-token'))
		);
	}
}
