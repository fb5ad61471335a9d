import type { Browser } from '@playwright/test';
import { VISITORS, type Visitor } from '../access/people';
import { cookieFor } from './visitors';

/** A session cookie header ("name=value") for each signed-in kind of visitor, from real sign-ins. */
export async function sessionCookies(
	browser: Browser,
	visitors: readonly Visitor[]
): Promise<Partial<Record<Visitor, string>>> {
	const cookies: Partial<Record<Visitor, string>> = {};
	for (const visitor of new Set(visitors)) {
		const email = VISITORS[visitor];
		if (email) cookies[visitor] = await cookieFor(browser, email);
	}
	return cookies;
}
