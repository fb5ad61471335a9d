import { addDays, addMonths } from 'date-fns';

/** A plain calendar date, written `YYYY-MM-DD`, with no time and no time zone. */
export type IsoDate = string;

const ISO_DATE = /^(\d{4})-(\d{2})-(\d{2})$/;

const MONTH_NAMES = [
	'January',
	'February',
	'March',
	'April',
	'May',
	'June',
	'July',
	'August',
	'September',
	'October',
	'November',
	'December'
] as const;

interface CalendarDay {
	year: number;
	month: number; // 1-12
	day: number;
}

function readIsoDate(value: IsoDate): CalendarDay | null {
	const match = typeof value === 'string' ? ISO_DATE.exec(value) : null;
	if (!match) return null;
	const [year, month, day] = [Number(match[1]), Number(match[2]), Number(match[3])];
	const utc = new Date(0);
	utc.setUTCFullYear(year, month - 1, day);
	if (
		utc.getUTCFullYear() !== year ||
		utc.getUTCMonth() !== month - 1 ||
		utc.getUTCDate() !== day
	) {
		return null;
	}
	return { year, month, day };
}

function toCalendarDay(value: IsoDate): CalendarDay {
	const parts = readIsoDate(value);
	if (!parts) {
		throw new RangeError(`'${String(value)}' is not a calendar date written YYYY-MM-DD.`);
	}
	return parts;
}

function writeIsoDate({ year, month, day }: CalendarDay): IsoDate {
	if (year < 0 || year > 9999) {
		throw new RangeError(`The year ${year} is outside 0000-9999.`);
	}
	const pad = (n: number, width: number) => String(n).padStart(width, '0');
	return `${pad(year, 4)}-${pad(month, 2)}-${pad(day, 2)}`;
}

/**
 * Runs a date-fns calendar step on a plain date. date-fns steps on the local
 * calendar fields of a Date, so we hand it a Date at local noon built from the
 * calendar fields and read the calendar fields back: no zone offset and no
 * daylight-saving change can move the result by a day.
 */
function stepCalendar(value: IsoDate, step: (date: Date) => Date): IsoDate {
	const { year, month, day } = toCalendarDay(value);
	const local = new Date(2000, 0, 1, 12);
	local.setFullYear(year, month - 1, day);
	const moved = step(local);
	return writeIsoDate({
		year: moved.getFullYear(),
		month: moved.getMonth() + 1,
		day: moved.getDate()
	});
}

function assertWholeNumber(name: string, value: number): void {
	if (!Number.isInteger(value)) {
		throw new RangeError(`${name} must be a whole number, not ${value}.`);
	}
}

/**
 * Tells whether a value is a real calendar date written `YYYY-MM-DD`
 * (so '2027-02-29' is not), for checking untyped input before using it.
 */
export function isIsoDate(value: unknown): value is IsoDate {
	return typeof value === 'string' && readIsoDate(value) !== null;
}

/**
 * Turns a calendar date into the Date at midnight UTC of that day, for storage
 * or sorting. Throws a RangeError when the text is not a real `YYYY-MM-DD` date.
 */
export function parseIsoDate(value: IsoDate): Date {
	const { year, month, day } = toCalendarDay(value);
	const date = new Date(Date.UTC(2000, 0, 1));
	date.setUTCFullYear(year, month - 1, day);
	return date;
}

/**
 * Writes the UTC calendar day of a Date as `YYYY-MM-DD`, the inverse of
 * `parseIsoDate`, so a date read from the database never shifts by a zone.
 */
export function formatIsoDate(date: Date): IsoDate {
	if (Number.isNaN(date.getTime())) {
		throw new RangeError('Cannot write an invalid Date as a calendar date.');
	}
	return writeIsoDate({
		year: date.getUTCFullYear(),
		month: date.getUTCMonth() + 1,
		day: date.getUTCDate()
	});
}

/**
 * Writes a calendar date the way a grower reads it, e.g. '28 February 2029',
 * for messages that name a date.
 */
export function formatDateLong(value: IsoDate): string {
	const { year, month, day } = toCalendarDay(value);
	return `${day} ${MONTH_NAMES[month - 1]} ${year}`;
}

/**
 * Compares two calendar dates: negative when `a` is earlier, 0 when the same
 * day, positive when later. Usable as an `Array.prototype.sort` comparator.
 */
export function compareIsoDates(a: IsoDate, b: IsoDate): number {
	return parseIsoDate(a).getTime() - parseIsoDate(b).getTime();
}

/**
 * Tells whether `date` falls on or between `from` and `to` (both days
 * included), e.g. whether entries are open today.
 */
export function isOnOrBetween(date: IsoDate, from: IsoDate, to: IsoDate): boolean {
	return compareIsoDates(date, from) >= 0 && compareIsoDates(date, to) <= 0;
}

/**
 * Adds whole calendar days (negative to go back), e.g. for "the day before".
 */
export function addCalendarDays(date: IsoDate, days: number): IsoDate {
	assertWholeNumber('days', days);
	return stepCalendar(date, (d) => addDays(d, days));
}

/**
 * Adds whole calendar months (negative to go back). A day that does not
 * exist in the target month clamps to that month's last day, so
 * 2025-01-31 + 1 month is 2025-02-28 and 2028-02-29 + 12 months is 2029-02-28.
 */
export function addCalendarMonths(date: IsoDate, months: number): IsoDate {
	assertWholeNumber('months', months);
	return stepCalendar(date, (d) => addMonths(d, months));
}

/**
 * The first day on which a plant acquired on `acquiredOn` has been grown for
 * `months` calendar months: the same day of the month, `months` later (or the
 * last day of a shorter month). Show rules ask for a possession period.
 */
export function possessionReachedOn(acquiredOn: IsoDate, months: number): IsoDate {
	assertWholeNumber('months', months);
	if (months < 0) {
		throw new RangeError(`A possession period cannot be negative, not ${months} months.`);
	}
	return addCalendarMonths(acquiredOn, months);
}

/**
 * Tells whether a plant acquired on `acquiredOn` has been grown for at least
 * `months` calendar months by the show date, i.e. whether the show date is on
 * or after `possessionReachedOn(acquiredOn, months)`.
 */
export function hasPossessionPeriod(
	acquiredOn: IsoDate,
	showDate: IsoDate,
	months: number
): boolean {
	return compareIsoDates(showDate, possessionReachedOn(acquiredOn, months)) >= 0;
}

const dayFormats = new Map<string, Intl.DateTimeFormat>();

/**
 * The calendar date it is at `now` in a time zone (an IANA name such as Europe/London): a
 * society's "today", which decides whether entries are open, which reminders go out and how long
 * a plant has been grown. Throws a RangeError for a zone the runtime does not know.
 */
export function todayIn(timeZone: string, now: Date = new Date()): IsoDate {
	let format = dayFormats.get(timeZone);
	if (!format) {
		format = new Intl.DateTimeFormat('en-US', {
			timeZone,
			year: 'numeric',
			month: '2-digit',
			day: '2-digit'
		});
		dayFormats.set(timeZone, format);
	}
	const parts = Object.fromEntries(format.formatToParts(now).map((p) => [p.type, p.value]));
	return writeIsoDate({
		year: Number(parts.year),
		month: Number(parts.month),
		day: Number(parts.day)
	});
}
