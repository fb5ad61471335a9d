import { expect, type Browser } from '@playwright/test';
import { VISITORS, type Visitor } from '../access/people';
import { signIn } from './session';

/** A session cookie header ("name=value") for each signed-in kind of visitor, from real sign-ins. */
export async function sessionCookies(
	browser: Browser,
	visitors: readonly Visitor[]
): Promise<Partial<Record<Visitor, string>>> {
	const cookies: Partial<Record<Visitor, string>> = {};
	for (const visitor of new Set(visitors)) {
		const email = VISITORS[visitor];
		if (!email) continue;
		const context = await browser.newContext();
		const page = await context.newPage();
		await signIn(page, email);
		const session = (await context.cookies()).find((c) => c.name.endsWith('authjs.session-token'));
		expect(session, `session for ${email}`).toBeTruthy();
		cookies[visitor] = `${session!.name}=${session!.value}`;
		await context.close();
	}
	return cookies;
}
