import { expect, type Page } from '@playwright/test';
import { firstLink, lastMailId, waitForMail } from './mail';

/** Asks for a sign-in link on the sign-in page and returns the link from the mail that arrives. */
export async function requestSignInLink(page: Page, email: string): Promise<string> {
	const before = await lastMailId(email);
	await page.goto('/signin');
	await page.getByLabel('E-mail address').fill(email);
	await page.getByRole('button', { name: 'Send me a sign-in link' }).click();
	await expect(page.getByRole('heading', { name: 'Check your e-mail' })).toBeVisible();
	return firstLink(await waitForMail(email, before));
}

/** Signs in through the real e-mail link flow. */
export async function signIn(page: Page, email: string): Promise<void> {
	const link = await requestSignInLink(page, email);
	await page.goto(link);
}
