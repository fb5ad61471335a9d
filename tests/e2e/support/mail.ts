/** Reads the local SMTP fake that the test command starts (CB_DEV_MAIL_URL). */
const base = process.env.CB_DEV_MAIL_URL ?? 'http://127.0.0.1:2536';

export interface CaughtMail {
	id: number;
	to: string[];
	subject: string;
	text: string;
}

/** Messages caught for an address, newest first. */
export async function mailFor(address: string): Promise<CaughtMail[]> {
	const response = await fetch(`${base}/messages?to=${encodeURIComponent(address.toLowerCase())}`);
	if (!response.ok) throw new Error(`SMTP fake answered ${response.status}`);
	return (await response.json()) as CaughtMail[];
}

/** The highest message id caught so far for an address (0 when none). */
export async function lastMailId(address: string): Promise<number> {
	const messages = await mailFor(address);
	return messages[0]?.id ?? 0;
}

/** Waits for a message newer than `afterId` for the address and returns it. */
export async function waitForMail(
	address: string,
	afterId: number,
	timeoutMs = 15_000
): Promise<CaughtMail> {
	const until = Date.now() + timeoutMs;
	while (Date.now() < until) {
		const fresh = (await mailFor(address)).find((m) => m.id > afterId);
		if (fresh) return fresh;
		await new Promise((r) => setTimeout(r, 150));
	}
	throw new Error(`no mail for ${address} within ${timeoutMs} ms`);
}

/** The first link in a message's text. */
export function firstLink(mail: CaughtMail): string {
	const match = mail.text.match(/https?:\/\/\S+/);
	if (!match) throw new Error(`no link in "${mail.subject}"`);
	return match[0];
}
