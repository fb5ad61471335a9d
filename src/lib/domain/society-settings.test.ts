import { describe, expect, it } from 'vitest';
import {
	isCountryCode,
	isPaperSize,
	isTimeZone,
	pdfPageSize,
	settingsFrom
} from './society-settings';

describe('society settings', () => {
	it.each([
		// IANA time zone database names (tz database, maintained by IANA).
		['America/New_York', true],
		['Europe/London', true],
		['Australia/Sydney', true],
		['UTC', true],
		['Mars/Olympus', false],
		['', false],
		[42, false]
	])('time zone %s known: %s', (zone, known) => {
		expect(isTimeZone(zone)).toBe(known);
	});

	it.each([
		// ISO 3166-1 alpha-2 codes are two upper-case letters.
		['US', true],
		['GB', true],
		['us', false],
		['USA', false]
	])('country code %s: %s', (code, ok) => {
		expect(isCountryCode(code)).toBe(ok);
	});

	it('maps paper sizes to the page sizes pdfmake names (US Letter, ISO 216 A4)', () => {
		expect(pdfPageSize('letter')).toBe('LETTER');
		expect(pdfPageSize('a4')).toBe('A4');
		expect(isPaperSize('legal')).toBe(false);
	});

	it('falls back to the defaults for unknown stored values and keeps known ones', () => {
		expect(
			settingsFrom({
				country: 'GB',
				lengthUnit: 'cm',
				paperSize: 'a4',
				timeZone: 'Europe/London',
				currency: 'GBP'
			})
		).toEqual({
			country: 'GB',
			lengthUnit: 'cm',
			paperSize: 'a4',
			timeZone: 'Europe/London',
			currency: 'GBP'
		});
		expect(
			settingsFrom({
				lengthUnit: 'yards',
				paperSize: 'legal',
				timeZone: 'Nowhere',
				currency: 'XXX'
			})
		).toEqual({
			country: 'US',
			lengthUnit: 'in',
			paperSize: 'letter',
			timeZone: 'America/New_York',
			currency: 'USD'
		});
	});
});
