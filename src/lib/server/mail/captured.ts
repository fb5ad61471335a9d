import { config } from '../config';
import { devMailEnabled } from '../startup-checks';

/** A message caught by the local SMTP fake (development and tests only). */
export interface CapturedMail {
	id: number;
	from: string;
	to: string[];
	subject: string;
	text: string;
	date: string;
}

/** Reads the messages the local SMTP fake caught; null when the fake is not configured. */
export async function listCapturedMail(): Promise<CapturedMail[] | null> {
	const base = config().devMailUrl;
	if (!base || !devMailEnabled()) return null;
	const response = await fetch(`${base}/messages`);
	if (!response.ok) throw new Error(`SMTP fake answered ${response.status}`);
	const all = (await response.json()) as CapturedMail[];
	return all
		.slice(0, 100)
		.map(({ id, from, to, subject, text, date }) => ({ id, from, to, subject, text, date }));
}
