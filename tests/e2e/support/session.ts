import { expect, type Cookie, type Page } from '@playwright/test';
import { mkdir, rmdir, stat } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { firstLink, lastMailId, waitForMail } from './mail';

/** Sessions already made in this worker, by address: later tests reuse them instead of new mail. */
const sessions = new Map<string, Cookie[]>();

/**
 * Runs `work` while no other Playwright worker asks for a link for the same address: two workers
 * asking at once would both read the newer of the two mails and one would use the other's link,
 * which works only once. A lock left by a crashed worker is taken over after a minute.
 */
async function withAddressLock<T>(email: string, work: () => Promise<T>): Promise<T> {
	const mailbox = (process.env.CB_DEV_MAIL_URL ?? '').replace(/\W+/g, '-');
	const lock = join(
		tmpdir(),
		`crownbench-e2e-signin${mailbox}-${encodeURIComponent(email.toLowerCase())}`
	);
	const until = Date.now() + 60_000;
	for (;;) {
		try {
			await mkdir(lock);
			break;
		} catch {
			const age = await stat(lock).then(
				(s) => Date.now() - s.mtimeMs,
				() => 0
			);
			if (age > 60_000 || Date.now() > until) {
				await rmdir(lock).catch(() => {});
				continue;
			}
			await new Promise((r) => setTimeout(r, 100));
		}
	}
	try {
		return await work();
	} finally {
		await rmdir(lock).catch(() => {});
	}
}

/** Asks for a sign-in link on the sign-in page and returns the link from the mail that arrives. */
export async function requestSignInLink(page: Page, email: string): Promise<string> {
	return withAddressLock(email, async () => {
		const before = await lastMailId(email);
		await page.goto('/signin');
		await page.getByLabel('E-mail address').fill(email);
		await page.getByRole('button', { name: 'Send me a sign-in link' }).click();
		await expect(page.getByRole('heading', { name: 'Check your e-mail' })).toBeVisible();
		return firstLink(await waitForMail(email, before));
	});
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
	await page.goto(await requestSignInLink(page, email));
	const session = (await page.context().cookies()).filter((c) =>
		c.name.endsWith('authjs.session-token')
	);
	expect(session, `a session after following the sign-in link for ${email}`).not.toHaveLength(0);
	if (!options.fresh) sessions.set(email, session);
}
