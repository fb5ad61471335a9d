/**
 * The ribbon label sheet: one label for every ribbon, place, best in class and top award, to stick
 * on the ribbons before they go on the bench. Thirty labels to a letter page (3 across, 10 down,
 * each 2⅝ by 1 in), the common size of address label sheets (common practice).
 */
import type { Content, TableCell, TDocumentDefinitions } from 'pdfmake/interfaces';
import { entryAwards, formatScore } from '$lib/results/labels';
import { eachEntry } from '$lib/results/assemble';
import type { ShowResults } from '$lib/results/types';
import { renderPdf } from './render';
import { clip } from './results-common';

const LABEL_WIDTH = 189; // 2.625 in
const LABEL_HEIGHT = 72; // 1 in
const GAP = 9; // 0.125 in between columns
const PER_ROW = 3;
const ROWS = 10;

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
export function ribbonLabelsDefinition(results: ShowResults): TDocumentDefinitions {
	const labels = ribbonLabels(results);
	if (labels.length === 0) {
		return {
			info: { title: `Ribbon labels: ${results.show.name}` },
			pageSize: 'LETTER',
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
	for (let p = 0; p < cells.length; p += PER_ROW * ROWS) {
		const body: TableCell[][] = [];
		for (let i = p; i < Math.min(p + PER_ROW * ROWS, cells.length); i += PER_ROW) {
			const row: TableCell[] = [];
			for (let k = 0; k < PER_ROW; k++) {
				if (k > 0) row.push('');
				row.push(cells[i + k] ?? '');
			}
			body.push(row);
		}
		pages.push({
			table: {
				widths: [LABEL_WIDTH, GAP, LABEL_WIDTH, GAP, LABEL_WIDTH],
				heights: LABEL_HEIGHT,
				body
			},
			layout,
			pageBreak: p > 0 ? 'before' : undefined
		});
	}
	return {
		info: { title: `Ribbon labels: ${results.show.name}` },
		pageSize: 'LETTER',
		pageMargins: [13.5, 36, 13.5, 20],
		content: pages
	};
}

/** Renders the ribbon label sheet to PDF. */
export function renderRibbonLabels(results: ShowResults): Promise<Buffer> {
	return renderPdf(ribbonLabelsDefinition(results));
}
