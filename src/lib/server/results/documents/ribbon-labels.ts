/**
 * The ribbon label sheet: one label for every ribbon, place, best in class and top award, to stick
 * on the ribbons before they go on the bench, laid out for the common address label sheet of the
 * society's paper (common practice): on Letter thirty labels (3 across, 10 down, each 2⅝ by 1 in),
 * on A4 twenty-one (3 across, 7 down, each 63.5 by 38.1 mm).
 */
import type { Content, TableCell, TDocumentDefinitions } from 'pdfmake/interfaces';
import { entryAwards, formatScore } from '$lib/results/labels';
import { eachEntry } from '$lib/results/assemble';
import type { PaperSize } from '$lib/domain/society-settings';
import type { ShowResults } from '$lib/results/types';
import { renderPdf } from '../../pdf/render';
import { paperOf } from '../../pdf/paper';
import { clip } from './common';

/** One label sheet: labels across and down, a label's size, the gap between columns (points). */
export interface LabelSheet {
	perRow: number;
	rows: number;
	width: number;
	height: number;
	gap: number;
	top: number;
}

/** The label sheet of each paper size (72 pt = 1 in = 25.4 mm). */
export const LABEL_SHEETS: Record<PaperSize, LabelSheet> = {
	// 2.625 x 1 in labels, 0.125 in between columns, 0.5 in top margin
	letter: { perRow: 3, rows: 10, width: 189, height: 72, gap: 9, top: 36 },
	// 63.5 x 38.1 mm labels, 2.5 mm between columns, 15.1 mm top margin
	a4: { perRow: 3, rows: 7, width: 180, height: 108, gap: 7.09, top: 42.8 }
};

/** One label's text for each award of each entry, in schedule order. */
export function ribbonLabels(
	results: ShowResults
): { award: string; line: string; plant: string }[] {
	const labels: { award: string; line: string; plant: string }[] = [];
	for (const { cls, entry } of eachEntry(results)) {
		for (const award of entryAwards(entry)) {
			labels.push({
				award,
				line: `Class ${cls.code} · Entry ${entry.number} · ${formatScore(entry.score)}`,
				plant: clip(entry.plant, 38)
			});
		}
	}
	return labels;
}

/** The pdfmake definition of the label sheet. */
export function ribbonLabelsDefinition(
	results: ShowResults,
	paperSize: PaperSize
): TDocumentDefinitions {
	const paper = paperOf(paperSize);
	const { perRow, rows, width, height, gap, top } = LABEL_SHEETS[paperSize];
	const side = (paper.width - perRow * width - (perRow - 1) * gap) / 2;
	const labels = ribbonLabels(results);
	if (labels.length === 0) {
		return {
			info: { title: `Ribbon labels: ${results.show.name}` },
			pageSize: paper.pageSize,
			content: [{ text: 'No ribbons were given, so there are no labels to print.' }]
		};
	}
	const cells: TableCell[] = labels.map((l) => ({
		stack: [
			{ text: l.award, bold: true, fontSize: 11 },
			{ text: l.line, fontSize: 9 },
			{ text: l.plant, fontSize: 9, italics: true }
		],
		margin: [8, 10, 6, 0]
	}));
	const layout = {
		hLineWidth: () => 0,
		vLineWidth: () => 0,
		paddingLeft: () => 0,
		paddingRight: () => 0,
		paddingTop: () => 0,
		paddingBottom: () => 0
	};
	// One table per page: cheaper to lay out than one long table, and rows never split.
	const pages: Content[] = [];
	for (let p = 0; p < cells.length; p += perRow * rows) {
		const body: TableCell[][] = [];
		for (let i = p; i < Math.min(p + perRow * rows, cells.length); i += perRow) {
			const row: TableCell[] = [];
			for (let k = 0; k < perRow; k++) {
				if (k > 0) row.push('');
				row.push(cells[i + k] ?? '');
			}
			body.push(row);
		}
		pages.push({
			table: {
				widths: Array.from({ length: 2 * perRow - 1 }, (_, k) => (k % 2 ? gap : width)),
				heights: height,
				body
			},
			layout,
			pageBreak: p > 0 ? 'before' : undefined
		});
	}
	return {
		info: { title: `Ribbon labels: ${results.show.name}` },
		pageSize: paper.pageSize,
		pageMargins: [side, top, side, 20],
		content: pages
	};
}

/** Renders the ribbon label sheet to PDF on the society's paper. */
export function renderRibbonLabels(results: ShowResults, paperSize: PaperSize): Promise<Buffer> {
	return renderPdf(ribbonLabelsDefinition(results, paperSize));
}
