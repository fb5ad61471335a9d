import { describe, expect, it } from 'vitest';
import { formatDate, formatDateTime, formatDayIn } from './format';

// Offsets and short names from the IANA tz database: America/New_York EST (UTC-5) in winter;
// Europe/London GMT (UTC+0) in winter, UTC+1 in summer (written GMT+1 in en-US);
// Pacific/Auckland NZST (UTC+12) in July.
describe('formatDateTime', () => {
	it.each<[string, string, string]>([
		['2026-12-16T00:30:00Z', 'America/New_York', 'Dec 15, 2026, 7:30 PM EST'],
		['2026-12-16T00:30:00Z', 'Europe/London', 'Dec 16, 2026, 12:30 AM GMT'],
		['2027-07-01T12:00:00Z', 'Europe/London', 'Jul 1, 2027, 1:00 PM GMT+1'],
		['2027-07-01T12:00:00Z', 'Pacific/Auckland', 'Jul 2, 2027, 12:00 AM GMT+12'],
		['2027-07-01T12:00:00Z', 'UTC', 'Jul 1, 2027, 12:00 PM UTC']
	])('%s in %s is %s', (instant, zone, expected) => {
		expect(formatDateTime(instant, zone)).toBe(expected);
		expect(formatDateTime(new Date(instant), zone)).toBe(expected);
	});

	it('gives nothing for no moment or an unreadable one', () => {
		expect(formatDateTime(null, 'UTC')).toBe('');
		expect(formatDateTime('not a date', 'UTC')).toBe('');
	});
});

describe('formatDayIn', () => {
	it('writes the day in the society zone, which may be the day before UTC', () => {
		expect(formatDayIn('2026-12-16T00:30:00Z', 'America/New_York')).toBe(formatDate('2026-12-15'));
		expect(formatDayIn('2026-12-16T00:30:00Z', 'Europe/London')).toBe(formatDate('2026-12-16'));
		expect(formatDate('2026-12-15')).toBe('Tue, December 15, 2026'); // a Tuesday (calendar)
	});
});
