import type { Content, TDocumentDefinitions } from 'pdfmake/interfaces';
import type { SocietySettings } from '$lib/domain/society-settings';
import { describeClass, describeShowRules, paragraphsOf } from '$lib/schedule-text';
import type { ScheduleDivision, ShowSettings } from './schedule';
import { paperOf } from '../pdf/paper';

/** Typed text as PDF paragraphs (line breaks kept). */
function paragraphs(text: string): Content[] {
	return paragraphsOf(text).map((p) => ({
		text: p,
		margin: [0, 0, 0, 4] as [number, number, number, number]
	}));
}

/**
 * The printable show schedule, made from the same data as the public schedule page, on the
 * society's paper and with lengths in its unit first and fees in its currency.
 */
export function scheduleDocument(
	show: ShowSettings & { societyName: string },
	divisions: ScheduleDivision[],
	settings: Pick<SocietySettings, 'paperSize' | 'lengthUnit' | 'currency'>
): TDocumentDefinitions {
	const text = describeShowRules(show, settings.currency);
	const content: Content[] = [
		{ text: show.name, style: 'title' },
		{ text: show.societyName, style: 'small', margin: [0, 0, 0, 8] },
		{ text: 'Dates and place', style: 'heading' },
		{ ul: text.dates },
		{ text: 'Rules', style: 'heading' },
		{ ul: text.rules }
	];
	if (show.generalRules.trim()) {
		content.push({ text: 'General rules', style: 'heading' }, ...paragraphs(show.generalRules));
	}
	if (show.committee.trim()) {
		content.push({ text: 'Show committee', style: 'heading' }, ...paragraphs(show.committee));
	}
	for (const division of divisions) {
		content.push({ text: `Division ${division.code}: ${division.name}`, style: 'heading' });
		if (!division.classes.length) content.push({ text: 'No classes yet.', style: 'small' });
		for (const c of division.classes) {
			content.push({
				unbreakable: true,
				margin: [0, 0, 0, 6],
				stack: [
					{ text: `Class ${c.code}. ${c.name}`, bold: true },
					...(c.description ? [{ text: c.description }] : []),
					{ text: describeClass(c, settings.lengthUnit).join(' · '), style: 'small' }
				]
			});
		}
	}
	return {
		info: { title: `Schedule: ${show.name}` },
		pageSize: paperOf(settings.paperSize).pageSize,
		pageMargins: [48, 48, 48, 56],
		footer: (current, count) => ({
			text: `${show.name} · page ${current} of ${count}`,
			alignment: 'center',
			style: 'small'
		}),
		content
	};
}
