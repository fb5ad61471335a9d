import { afterEach, describe, expect, it } from 'vitest';
import fc from 'fast-check';
import {
	addCalendarDays,
	addCalendarMonths,
	compareIsoDates,
	formatDateLong,
	formatIsoDate,
	hasPossessionPeriod,
	isIsoDate,
	isOnOrBetween,
	parseIsoDate,
	possessionReachedOn,
	todayIn
} from './dates';

// possession period 3 months: state council show rules 2018 (DOMAIN.md)
const POSSESSION_MONTHS = 3;

describe('addCalendarMonths', () => {
	it.each([
		['2025-01-15', 1, '2025-02-15', 'same day of the month'],
		['2025-01-31', 1, '2025-02-28', 'end of month clamps'],
		['2028-01-31', 1, '2028-02-29', 'end of month clamps to a leap day'],
		['2025-11-30', 3, '2026-02-28', 'month end, common year'],
		['2027-11-30', 3, '2028-02-29', 'month end, leap year 2028'],
		['2028-02-29', 12, '2029-02-28', 'leap day plus a year'],
		['2028-02-29', 48, '2032-02-29', 'leap day to the next leap day'],
		['2025-08-31', 1, '2025-09-30', '31st into a 30-day month'],
		['2025-10-15', 3, '2026-01-15', 'across a year end'],
		['2025-03-31', -1, '2025-02-28', 'going back clamps too'],
		['2025-03-31', 0, '2025-03-31', 'zero months is the same day']
	])('%s + %s months = %s (%s)', (date, months, expected) => {
		expect(addCalendarMonths(date, months)).toBe(expected);
	});

	it.each([1.5, Number.NaN, Number.POSITIVE_INFINITY])('rejects %s months', (months) => {
		expect(() => addCalendarMonths('2025-01-01', months)).toThrow(RangeError);
	});

	it.each(['2025-02-30', '2025-13-01', '25-01-01', '2025-1-1', '2025-01-01T00:00:00Z', ''])(
		'rejects the date %j',
		(date) => {
			expect(() => addCalendarMonths(date, 1)).toThrow(RangeError);
		}
	);
});

describe('possessionReachedOn', () => {
	it.each([
		// possession period 3 months: state council show rules 2018 (DOMAIN.md)
		['2025-01-15', POSSESSION_MONTHS, '2025-04-15'],
		// possession period 3 months: state council show rules 2018 (DOMAIN.md)
		['2025-11-30', POSSESSION_MONTHS, '2026-02-28'],
		// possession period 3 months: state council show rules 2018 (DOMAIN.md)
		['2027-11-30', POSSESSION_MONTHS, '2028-02-29'],
		// possession period 3 months: state council show rules 2018 (DOMAIN.md)
		['2026-05-31', POSSESSION_MONTHS, '2026-08-31'],
		['2028-02-29', 12, '2029-02-28'],
		['2025-06-01', 0, '2025-06-01']
	])('a plant got on %s has been grown %s months on %s', (acquiredOn, months, expected) => {
		expect(possessionReachedOn(acquiredOn, months)).toBe(expected);
	});

	it.each([-1, 2.5])('rejects a possession period of %s months', (months) => {
		expect(() => possessionReachedOn('2025-01-01', months)).toThrow(RangeError);
	});
});

describe('hasPossessionPeriod', () => {
	it.each([
		// possession period 3 months: state council show rules 2018 (DOMAIN.md)
		['2025-01-15', '2025-04-15', true, 'reached on the same day of the month'],
		['2025-01-15', '2025-04-14', false, 'one day before is not enough'],
		['2025-01-15', '2025-04-16', true, 'a day after'],
		['2025-11-30', '2026-02-28', true, 'month end clamps, common year'],
		['2025-11-30', '2026-02-27', false, 'the day before the clamped end'],
		['2027-11-30', '2028-02-29', true, 'month end clamps, leap year 2028'],
		['2027-11-30', '2028-02-28', false, 'leap year: 28 February is one day short'],
		['2025-06-01', '2025-05-17', false, 'acquired after the show'],
		['2024-01-01', '2025-05-17', true, 'long grown']
	])('acquired %s, show %s -> %s (%s)', (acquiredOn, showDate, expected) => {
		// possession period 3 months: state council show rules 2018 (DOMAIN.md)
		expect(hasPossessionPeriod(acquiredOn, showDate, POSSESSION_MONTHS)).toBe(expected);
	});

	it('a show with no possession period accepts a plant got on the show day', () => {
		expect(hasPossessionPeriod('2025-05-17', '2025-05-17', 0)).toBe(true);
	});
});

describe('plain date helpers', () => {
	it.each<[unknown, boolean]>([
		['2028-02-29', true],
		['2027-02-29', false],
		['2025-04-31', false],
		['0001-01-01', true],
		['0050-06-15', true],
		['2025-1-01', false],
		[' 2025-01-01', false],
		[20250101, false],
		[null, false]
	])('isIsoDate(%j) is %s', (value, expected) => {
		expect(isIsoDate(value)).toBe(expected);
	});

	it('parses to midnight UTC and writes back the same day', () => {
		expect(parseIsoDate('2025-05-17').toISOString()).toBe('2025-05-17T00:00:00.000Z');
		expect(formatIsoDate(parseIsoDate('2025-05-17'))).toBe('2025-05-17');
		expect(formatIsoDate(parseIsoDate('0050-06-15'))).toBe('0050-06-15');
		expect(formatIsoDate(new Date('2025-05-17T23:59:59.999Z'))).toBe('2025-05-17');
		expect(() => formatIsoDate(new Date(Number.NaN))).toThrow(RangeError);
	});

	it.each([
		['2029-02-28', '28 February 2029'],
		['2025-01-05', '5 January 2025'],
		['2025-12-31', '31 December 2025']
	])('formatDateLong(%s) is %s', (date, expected) => {
		expect(formatDateLong(date)).toBe(expected);
	});

	it('compares and sorts calendar dates', () => {
		expect(compareIsoDates('2025-01-01', '2025-01-02')).toBeLessThan(0);
		expect(compareIsoDates('2025-01-02', '2025-01-02')).toBe(0);
		expect(compareIsoDates('2026-01-01', '2025-12-31')).toBeGreaterThan(0);
		expect(['2025-03-01', '2024-12-31', '2025-02-28'].sort(compareIsoDates)).toEqual([
			'2024-12-31',
			'2025-02-28',
			'2025-03-01'
		]);
	});

	it.each([
		['2025-04-30', false],
		['2025-05-01', true],
		['2025-05-10', true],
		['2025-05-11', false]
	])('isOnOrBetween(%s, 2025-05-01, 2025-05-10) is %s', (date, expected) => {
		expect(isOnOrBetween(date, '2025-05-01', '2025-05-10')).toBe(expected);
	});

	it.each([
		['2028-02-28', 1, '2028-02-29'],
		['2028-02-29', 1, '2028-03-01'],
		['2025-01-01', -1, '2024-12-31'],
		['2025-03-30', 1, '2025-03-31']
	])('%s + %s days = %s', (date, days, expected) => {
		expect(addCalendarDays(date, days)).toBe(expected);
	});
});

describe('time zones never shift a day', () => {
	const original = process.env.TZ;
	afterEach(() => {
		if (original === undefined) delete process.env.TZ;
		else process.env.TZ = original;
	});

	it.each([
		'UTC',
		'Pacific/Kiritimati', // UTC+14
		'Pacific/Pago_Pago', // UTC-11
		'America/Sao_Paulo', // daylight saving once began at midnight
		'America/New_York',
		'Australia/Lord_Howe', // half-hour daylight saving
		'Asia/Tokyo'
	])('gives the same answers in %s', (zone) => {
		process.env.TZ = zone;
		expect(Intl.DateTimeFormat().resolvedOptions().timeZone).toBe(zone);
		expect(addCalendarMonths('2025-01-31', 1)).toBe('2025-02-28');
		expect(addCalendarMonths('2018-08-04', 3)).toBe('2018-11-04'); // Sao Paulo DST began at midnight 4 Nov 2018
		expect(addCalendarMonths('2028-02-29', 12)).toBe('2029-02-28');
		expect(addCalendarDays('2018-11-03', 1)).toBe('2018-11-04');
		expect(addCalendarDays('2025-03-09', 1)).toBe('2025-03-10');
		// possession period 3 months: state council show rules 2018 (DOMAIN.md)
		expect(possessionReachedOn('2025-11-30', POSSESSION_MONTHS)).toBe('2026-02-28');
		expect(formatIsoDate(parseIsoDate('2025-05-17'))).toBe('2025-05-17');
	});
});

describe('properties', () => {
	const isoDate = fc
		.date({
			min: new Date('1950-01-01T00:00:00Z'),
			max: new Date('2150-12-31T00:00:00Z'),
			noInvalidDate: true
		})
		.map((d) => formatIsoDate(d));
	const daysIn = (year: number, month: number) => new Date(Date.UTC(year, month, 0)).getUTCDate();

	it('adding months keeps the day of the month, or clamps to the last day', () => {
		fc.assert(
			fc.property(isoDate, fc.integer({ min: -600, max: 600 }), (date, months) => {
				const result = addCalendarMonths(date, months);
				const [y, m, d] = date.split('-').map(Number);
				const [ry, rm, rd] = result.split('-').map(Number);
				expect((ry - y) * 12 + (rm - m)).toBe(months);
				expect(rd).toBe(Math.min(d, daysIn(ry, rm)));
			})
		);
	});

	it('possession is reached on one day, and not on the day before', () => {
		fc.assert(
			fc.property(isoDate, fc.integer({ min: 1, max: 36 }), (acquiredOn, months) => {
				const reached = possessionReachedOn(acquiredOn, months);
				expect(hasPossessionPeriod(acquiredOn, reached, months)).toBe(true);
				expect(hasPossessionPeriod(acquiredOn, addCalendarDays(reached, -1), months)).toBe(false);
				expect(compareIsoDates(reached, acquiredOn)).toBeGreaterThan(0);
			})
		);
	});

	it('parsing and writing a date round-trips', () => {
		fc.assert(
			fc.property(isoDate, (date) => {
				expect(isIsoDate(date)).toBe(true);
				expect(formatIsoDate(parseIsoDate(date))).toBe(date);
			})
		);
	});
});

describe('todayIn', () => {
	// Offsets from the IANA tz database: Europe/London GMT (UTC+0) in winter and BST (UTC+1) from
	// the last Sunday of March at 01:00 UTC; America/New_York EST (UTC-5) in winter and EDT (UTC-4)
	// in summer; Pacific/Auckland NZDT (UTC+13) in December.
	it.each<[string, string, string, string]>([
		['2026-12-15T23:30:00Z', 'Europe/London', '2026-12-15', '23:30 GMT, still the 15th'],
		['2026-12-16T00:30:00Z', 'Europe/London', '2026-12-16', '00:30 GMT, already the 16th'],
		['2026-12-16T00:30:00Z', 'America/New_York', '2026-12-15', '19:30 EST the evening before'],
		['2026-12-16T04:59:00Z', 'America/New_York', '2026-12-15', '23:59 EST, one minute to midnight'],
		['2026-12-16T05:00:00Z', 'America/New_York', '2026-12-16', 'midnight EST'],
		['2026-12-15T11:00:00Z', 'Pacific/Auckland', '2026-12-16', 'midnight NZDT is 11:00 UTC'],
		['2027-06-30T23:30:00Z', 'Europe/London', '2027-07-01', '00:30 BST, summer time'],
		['2027-06-30T23:30:00Z', 'America/New_York', '2027-06-30', '19:30 EDT'],
		['2027-03-28T00:59:00Z', 'Europe/London', '2027-03-28', 'the night summer time begins'],
		['2026-12-16T00:30:00Z', 'UTC', '2026-12-16', 'UTC itself']
	])('at %s in %s it is %s (%s)', (instant, zone, expected) => {
		expect(todayIn(zone, new Date(instant))).toBe(expected);
	});

	it('gives two different days at one instant in two zones', () => {
		const instant = new Date('2026-12-16T02:00:00Z');
		expect(todayIn('Europe/London', instant)).toBe('2026-12-16');
		expect(todayIn('America/New_York', instant)).toBe('2026-12-15');
	});

	it('refuses a zone the runtime does not know', () => {
		expect(() => todayIn('Mars/Olympus_Mons')).toThrow(RangeError);
	});
});
