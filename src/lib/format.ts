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
