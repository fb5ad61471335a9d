import type { Content, TableCell, TDocumentDefinitions } from 'pdfmake/interfaces';
import { formatDateLong } from '../../domain/dates';
import type { ObtainedHow } from '../../domain/readiness';
import type { PaperSize } from '../../domain/society-settings';
import { paperOf } from '../pdf/paper';

/** What goes on one pot label. */
export interface PotLabel {
	varietyName: string;
	label: string | null;
	obtainedHow: ObtainedHow;
	obtainedOn: string;
}

/** Columns of labels across the page (Letter or A4: the columns share the width), and the size of one label in points (72 pt = 1 in). */
export const LABEL_COLUMNS = 4;
const LABEL_HEIGHT = 48;
const PAGE_MARGIN = 28;

const HOW_SHORT: Record<ObtainedHow, string> = {
	bought: 'bought',
	traded: 'traded',
	leaf: 'from a leaf',
	sucker: 'from a sucker',
	division: 'divided'
};

function labelCell(label: PotLabel): TableCell {
	return {
		stack: [
			{ text: label.varietyName, bold: true, fontSize: 9, lineHeight: 1 },
			...(label.label ? [{ text: label.label, fontSize: 7.5 }] : []),
			{
				text: `${HOW_SHORT[label.obtainedHow]}, ${formatDateLong(label.obtainedOn)}`,
				fontSize: 7.5,
				color: '#45524b'
			}
		],
		margin: [4, 4, 4, 2]
	};
}

/**
 * A sheet of small pot labels (variety and date, a name tag when the plant has one) in a grid
 * with dashed cutting lines, for newly potted plants, on the member's paper.
 */
export function potLabelsDocument(labels: PotLabel[], paperSize: PaperSize): TDocumentDefinitions {
	const rows: TableCell[][] = [];
	for (let i = 0; i < labels.length; i += LABEL_COLUMNS) {
		const row = labels.slice(i, i + LABEL_COLUMNS).map(labelCell);
		while (row.length < LABEL_COLUMNS) row.push({ text: '' });
		rows.push(row);
	}
	const dashed = () => ({ dash: { length: 3, space: 3 } });
	const content: Content = rows.length
		? {
				table: {
					widths: Array(LABEL_COLUMNS).fill('*'),
					heights: LABEL_HEIGHT,
					dontBreakRows: true,
					body: rows
				},
				layout: {
					hLineStyle: dashed,
					vLineStyle: dashed,
					hLineColor: () => '#6a756e',
					vLineColor: () => '#6a756e',
					hLineWidth: () => 0.5,
					vLineWidth: () => 0.5
				}
			}
		: { text: 'No plants chosen.' };
	return {
		pageSize: paperOf(paperSize).pageSize,
		pageMargins: [PAGE_MARGIN, PAGE_MARGIN, PAGE_MARGIN, PAGE_MARGIN],
		info: { title: 'Pot labels', creator: 'Crownbench' },
		content: [content]
	};
}
