/**
 * Money as integer cents (minor units), never floating point. Every currency we accept has two
 * decimal places, so one cent is 1/100 of the unit.
 */

/** Currencies a society can keep its dues and fees in (all with two decimal places). */
export const CURRENCIES = ['USD', 'CAD', 'GBP', 'EUR', 'AUD', 'NZD'] as const;

export type Currency = (typeof CURRENCIES)[number];

/** True when the value names a currency we accept. */
export function isCurrency(value: unknown): value is Currency {
	return typeof value === 'string' && (CURRENCIES as readonly string[]).includes(value);
}

const AMOUNT = /^(\d{1,7})(?:[.,](\d{1,2}))?$/;

/**
 * Reads an amount typed by a person ("25", "25.5", "25.50", "1,000.00" is refused) into cents,
 * without floating point. Returns null for anything that is not a plain non-negative amount.
 */
export function parseAmountToCents(text: string): number | null {
	const match = AMOUNT.exec(text.trim().replace(/^[$€£]\s*/, ''));
	if (!match) return null;
	const whole = Number(match[1]);
	const fraction = match[2] ? Number(match[2].padEnd(2, '0')) : 0;
	return whole * 100 + fraction;
}

/** Writes cents as a plain decimal amount, e.g. 2550 → "25.50", for form fields. */
export function centsToDecimal(cents: number): string {
	assertCents(cents);
	const sign = cents < 0 ? '-' : '';
	const abs = Math.abs(cents);
	return `${sign}${Math.trunc(abs / 100)}.${String(abs % 100).padStart(2, '0')}`;
}

/** Formats cents with the currency for people, e.g. 2550 USD → "$25.50". */
export function formatMoney(cents: number, currency: string, locale = 'en-US'): string {
	const format = new Intl.NumberFormat(locale, { style: 'currency', currency });
	// Intl accepts an exact decimal string, so no cent is lost to floating point.
	return format.format(centsToDecimal(cents) as unknown as number);
}

/** Adds amounts in cents, refusing anything that is not a whole number of cents. */
export function sumCents(amounts: readonly number[]): number {
	let total = 0;
	for (const a of amounts) {
		assertCents(a);
		total += a;
	}
	return total;
}

function assertCents(cents: number): void {
	if (!Number.isSafeInteger(cents)) {
		throw new RangeError(`An amount must be a whole number of cents, not ${cents}.`);
	}
}
