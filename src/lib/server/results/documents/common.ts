import type { Content } from 'pdfmake/interfaces';
import { formatDate } from '$lib/format';
import type { ShowResults } from '$lib/results/types';

/** The show's name, society, venue and judging day, as the head of every results document. */
export function showHeading(results: ShowResults, title: string): Content[] {
	const { show } = results;
	const place = [show.societyName, show.venue, formatDate(show.judgingDay)].filter(Boolean);
	return [
		{ text: `${title}: ${show.name}`, style: 'title' },
		{ text: place.join(' · '), style: 'small', margin: [0, 0, 0, 8] }
	];
}

/** Cuts text to at most `max` characters at a word boundary, with an ellipsis. */
export function clip(text: string, max: number): string {
	if (text.length <= max) return text;
	const cut = text.slice(0, max - 1);
	const space = cut.lastIndexOf(' ');
	return `${(space > max * 0.6 ? cut.slice(0, space) : cut).trimEnd()}…`;
}
