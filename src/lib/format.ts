import { todayIn } from './domain/dates';

const dateFormat = new Intl.DateTimeFormat('en-US', {
	weekday: 'short',
	day: 'numeric',
	month: 'long',
	year: 'numeric',
	timeZone: 'UTC'
});

/** Formats an ISO calendar date (YYYY-MM-DD) for people, without time-zone shifts. */
export function formatDate(iso: string | null | undefined): string {
	if (!iso) return '';
	const d = new Date(`${iso.slice(0, 10)}T00:00:00Z`);
	return Number.isNaN(d.getTime()) ? iso : dateFormat.format(d);
}

const dateTimeFormats = new Map<string, Intl.DateTimeFormat>();

function dateTimeFormat(timeZone: string): Intl.DateTimeFormat {
	let format = dateTimeFormats.get(timeZone);
	if (!format) {
		format = new Intl.DateTimeFormat('en-US', {
			year: 'numeric',
			month: 'short',
			day: 'numeric',
			hour: 'numeric',
			minute: '2-digit',
			timeZone,
			timeZoneName: 'short'
		});
		dateTimeFormats.set(timeZone, format);
	}
	return format;
}

function instantOf(value: string | Date | null | undefined): Date | null {
	if (value === null || value === undefined || value === '') return null;
	const date = value instanceof Date ? value : new Date(value);
	return Number.isNaN(date.getTime()) ? null : date;
}

/**
 * Formats a moment (published at, sent at, paid at, an audit row) for people in the society's
 * time zone, with the zone's short name, e.g. `Dec 15, 2026, 7:30 PM EST`. The same text on the
 * server and in any browser, whatever their own zone.
 */
export function formatDateTime(value: string | Date | null | undefined, timeZone: string): string {
	const date = instantOf(value);
	if (!date) return '';
	// Some runtimes put a narrow no-break space before AM/PM; one plain space everywhere.
	return dateTimeFormat(timeZone)
		.format(date)
		.replace(/[\u202f\u00a0]/g, ' ');
}

/** The calendar day a moment falls on in the society's time zone, written as formatDate does. */
export function formatDayIn(value: string | Date | null | undefined, timeZone: string): string {
	const date = instantOf(value);
	return date ? formatDate(todayIn(timeZone, date)) : '';
}
