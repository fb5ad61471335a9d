import type { Content, TableCell, TDocumentDefinitions } from 'pdfmake/interfaces';
import type { PaperSize } from '$lib/domain/society-settings';
import type { PaperClass, PaperPanel } from './paper-sheets';
import { paperOf } from '../pdf/paper';

const MARGIN = 36; // points (0.5 in)

/** Blank rows printed after a class's entries, for plants entered or moved on the day. */
const SPARE_ROWS = 3;

/**
 * Paper judging sheets for when tablets fail: one page (or more) per class, in the landscape of
 * the society's paper, with the entry numbers, the class's scale of points as columns of empty
 * boxes (each headed by its most points), a total and room for comments, and lines for the
 * judges to sign. No exhibitor is named. The panel's clerk types the sheet in afterwards.
 */
export function paperSheetsDocument(
	show: { name: string },
	classes: PaperClass[],
	paperSize: PaperSize
): TDocumentDefinitions {
	const paper = paperOf(paperSize);
	const content: Content[] = [];
	classes.forEach((c, i) => {
		const header: TableCell[] = [
			{ text: 'Entry', bold: true },
			...c.criteria.map((k) => ({ text: `${k.label} (of ${k.maxPoints})`, bold: true })),
			{ text: 'Total', bold: true },
			{ text: 'Comments', bold: true }
		];
		const row = (number: string, plant: string): TableCell[] => [
			{
				stack: [
					{ text: number, bold: true, fontSize: 14 },
					{ text: plant, style: 'small' }
				]
			},
			...c.criteria.map(() => ({ text: ' ' })),
			{ text: ' ' },
			{ text: ' ' }
		];
		const body: TableCell[][] = [
			header,
			...c.entries.map((e) => row(String(e.number), e.plant)),
			...Array.from({ length: SPARE_ROWS }, () => row(' ', ' '))
		];
		content.push(
			{
				text: `${show.name} · judging sheet`,
				style: 'small',
				pageBreak: i > 0 ? 'before' : undefined
			},
			{ text: `Class ${c.code} ${c.name}`, fontSize: 18, bold: true, margin: [0, 2, 0, 2] },
			{
				text: [
					`Division ${c.division} · Panel: ${c.panel ?? 'not yet seated'} · `,
					`Scale of points: ${c.scaleName ?? 'none chosen'}`
				].join(''),
				margin: [0, 0, 0, 4]
			},
			{
				text: 'Write the points given for each criterion (at most the number in brackets), the total, and a short comment.',
				style: 'small',
				margin: [0, 0, 0, 6]
			},
			{
				table: {
					headerRows: 1,
					dontBreakRows: true,
					widths: [54, ...c.criteria.map(() => 'auto' as const), 40, '*'],
					heights: (r: number) => (r === 0 ? 0 : 34),
					body
				}
			},
			{
				margin: [0, 18, 0, 0],
				columns: [
					{ text: 'Judge: ______________________', width: '*' },
					{ text: 'Judge: ______________________', width: '*' },
					{ text: 'Panel clerk: ______________________', width: '*' }
				]
			}
		);
	});
	if (!content.length) content.push({ text: 'This show has no classes yet.' });
	return {
		info: { title: `Judging sheets: ${show.name}` },
		pageSize: paper.pageSize,
		pageOrientation: 'landscape',
		pageMargins: [MARGIN, MARGIN, MARGIN, MARGIN],
		content
	};
}

/** The class list of each panel: its judges and clerk, and the classes it judges with entry numbers. */
export function panelClassListDocument(
	show: { name: string },
	panels: PaperPanel[],
	paperSize: PaperSize
): TDocumentDefinitions {
	const paper = paperOf(paperSize);
	const content: Content[] = [];
	panels.forEach((p, i) => {
		content.push(
			{
				text: `${show.name} · class list`,
				style: 'small',
				pageBreak: i > 0 ? 'before' : undefined
			},
			{ text: `Panel ${p.name}`, fontSize: 18, bold: true, margin: [0, 2, 0, 2] },
			{
				text: `Judges: ${p.judges.length ? p.judges.join(', ') : 'none seated'} · Clerk: ${p.clerk ?? 'none'}`,
				margin: [0, 0, 0, 8]
			},
			p.classes.length
				? {
						table: {
							headerRows: 1,
							widths: [70, '*', 50, '*'],
							body: [
								[
									{ text: 'Class', bold: true },
									{ text: 'Name', bold: true },
									{ text: 'Entries', bold: true },
									{ text: 'Entry numbers', bold: true }
								],
								...p.classes.map((c) => [
									c.code,
									c.name,
									String(c.entries.length),
									c.entries.length ? c.entries.join(', ') : '—'
								])
							]
						}
					}
				: { text: 'This panel judges no class yet.' }
		);
	});
	if (!content.length) content.push({ text: 'This show has no panels yet.' });
	return {
		info: { title: `Class lists: ${show.name}` },
		pageSize: paper.pageSize,
		pageMargins: [MARGIN, MARGIN, MARGIN, MARGIN],
		content
	};
}
