import { CURRENCIES, isCurrency, type Currency } from './money';
import { isLengthUnit, type LengthUnit } from './units';

/** Paper sizes a society prints on: US Letter (8.5 x 11 in) or ISO A4 (210 x 297 mm). */
export const PAPER_SIZES = ['letter', 'a4'] as const;
export type PaperSize = (typeof PAPER_SIZES)[number];

/** The settings of a society that decide how every page and document shows things. */
export interface SocietySettings {
	/** ISO 3166-1 alpha-2 country code, upper case (e.g. US, CA, GB). */
	country: string;
	/** The unit lengths are shown in first; the other follows in brackets. */
	lengthUnit: LengthUnit;
	paperSize: PaperSize;
	/** An IANA time zone name (e.g. America/New_York): "today" and dates are read in it. */
	timeZone: string;
	currency: Currency;
}

/** What a society has before anyone changes it (the settings of the first societies). */
export const DEFAULT_SOCIETY_SETTINGS: SocietySettings = {
	country: 'US',
	lengthUnit: 'in',
	paperSize: 'letter',
	timeZone: 'America/New_York',
	currency: 'USD'
};

export { CURRENCIES };

/** True for a paper size we print on. */
export function isPaperSize(value: unknown): value is PaperSize {
	return value === 'letter' || value === 'a4';
}

/** True for a time zone name the runtime knows (IANA names, e.g. Europe/London, UTC). */
export function isTimeZone(value: unknown): value is string {
	if (typeof value !== 'string' || value.length === 0 || value.length > 64) return false;
	try {
		new Intl.DateTimeFormat('en-US', { timeZone: value });
		return true;
	} catch {
		return false;
	}
}

/** True for a two-letter country code of the form ISO 3166-1 alpha-2 uses (upper case). */
export function isCountryCode(value: unknown): value is string {
	return typeof value === 'string' && /^[A-Z]{2}$/.test(value);
}

/** The pdfmake page size of a paper size. */
export function pdfPageSize(paper: PaperSize): 'LETTER' | 'A4' {
	return paper === 'a4' ? 'A4' : 'LETTER';
}

/**
 * Reads stored settings, falling back to the defaults for any value that is missing or unknown
 * (so a document can always be printed).
 */
export function settingsFrom(
	stored: Partial<Record<keyof SocietySettings, unknown>>
): SocietySettings {
	const d = DEFAULT_SOCIETY_SETTINGS;
	return {
		country: isCountryCode(stored.country) ? stored.country : d.country,
		lengthUnit: isLengthUnit(stored.lengthUnit) ? stored.lengthUnit : d.lengthUnit,
		paperSize: isPaperSize(stored.paperSize) ? stored.paperSize : d.paperSize,
		timeZone: isTimeZone(stored.timeZone) ? stored.timeZone : d.timeZone,
		currency: isCurrency(stored.currency) ? stored.currency : d.currency
	};
}
