import { expect, request, type APIRequestContext, type Browser } from '@playwright/test';
import { signIn } from './session';

/** A session cookie header ("name=value") for an address, from a real e-mail link sign-in. */
export async function cookieFor(browser: Browser, email: string): Promise<string> {
	const context = await browser.newContext();
	const page = await context.newPage();
	await signIn(page, email);
	const session = (await context.cookies()).find((c) => c.name.endsWith('authjs.session-token'));
	expect(session, `session for ${email}`).toBeTruthy();
	await context.close();
	return `${session!.name}=${session!.value}`;
}

/**
 * A request context that sends only the given session cookie (none: signed out) and this app's
 * Origin, as the app's own forms do. Its cookie jar never carries anyone else's session.
 */
export async function requestAs(baseURL: string, cookie?: string): Promise<APIRequestContext> {
	return request.newContext({
		baseURL,
		extraHTTPHeaders: { ...(cookie ? { cookie } : {}), origin: baseURL }
	});
}

/** The words of `words` that occur in `text` (case-insensitive). */
export function wordsIn(text: string, words: readonly string[]): string[] {
	const lower = text.toLowerCase();
	return words.filter((w) => w && lower.includes(w.toLowerCase()));
}
