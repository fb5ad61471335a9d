/**
 * Award cards: one per entry that won anything, four to a page of the society's paper (on Letter
 * each about 4 by 5¼ in, on A4 about 10 by 14 cm, with dashed cut lines) so a card can stand beside the plant on the bench. Each card gives the
 * award, the class, the variety, the entry number, the score and the judges' comment.
 */
import type { Content, TableCell, TDocumentDefinitions } from 'pdfmake/interfaces';
import { entryAwards, formatScore } from '$lib/results/labels';
import type { PaperSize } from '$lib/domain/society-settings';
import type { ResultClass, ResultEntry, ShowResults } from '$lib/results/types';
import { eachEntry } from '$lib/results/assemble';
import { renderPdf } from '../../pdf/render';
import { paperOf } from '../../pdf/paper';
import { clip } from './common';

const MARGIN = 18; // points (0.25 in)

/** Height of one card in points: the page less its margins, halved, less room for the cut lines. */
export function cardHeight(pageHeight: number): number {
	return Math.floor((pageHeight - 2 * MARGIN) / 2) - 6;
}

function card(results: ShowResults, cls: ResultClass, entry: ResultEntry): TableCell {
	const comment = entry.comments.join(' ');
	const stack: Content[] = [
		{ text: entryAwards(entry).join(' · '), fontSize: 22, bold: true, color: '#245a40' },
		{ text: `Class ${cls.code}: ${cls.name}`, fontSize: 12, margin: [0, 8, 0, 0] },
		{ text: entry.plant || '—', fontSize: 18, bold: true, margin: [0, 6, 0, 0] },
		{
			columns: [
				{ text: `Entry ${entry.number}`, fontSize: 12 },
				{ text: `Score ${formatScore(entry.score)}`, fontSize: 12, alignment: 'right' }
			],
			margin: [0, 8, 0, 0]
		}
	];
	if (comment) {
		stack.push(
			{ text: "Judges' comment", bold: true, fontSize: 10, margin: [0, 12, 0, 2] },
			{ text: clip(comment, 420), fontSize: 11, italics: true }
		);
	}
	stack.push({ text: results.show.name, style: 'small', margin: [0, 12, 0, 0] });
	return { stack, margin: [12, 14, 12, 8] };
}

/** The pdfmake definition of the award cards. */
export function awardCardsDefinition(
	results: ShowResults,
	paperSize: PaperSize
): TDocumentDefinitions {
	const paper = paperOf(paperSize);
	const cards: TableCell[] = [];
	for (const { cls, entry } of eachEntry(results)) {
		if (entryAwards(entry).length > 0) cards.push(card(results, cls, entry));
	}
	if (cards.length === 0) {
		return {
			info: { title: `Award cards: ${results.show.name}` },
			pageSize: paper.pageSize,
			content: [{ text: 'No entry won an award, so there are no cards to print.' }]
		};
	}
	const dashed = { dash: { length: 4, space: 4 } };
	const layout = {
		hLineColor: () => '#9aa59e',
		vLineColor: () => '#9aa59e',
		hLineStyle: () => dashed,
		vLineStyle: () => dashed
	};
	// One table per page (two rows of two cards): cheaper to lay out than one long table.
	const pages: Content[] = [];
	for (let i = 0; i < cards.length; i += 4) {
		const body: TableCell[][] = [[cards[i], cards[i + 1] ?? '']];
		if (i + 2 < cards.length) body.push([cards[i + 2], cards[i + 3] ?? '']);
		pages.push({
			table: { widths: ['*', '*'], heights: cardHeight(paper.height), body },
			layout,
			pageBreak: i > 0 ? 'before' : undefined
		});
	}
	return {
		info: { title: `Award cards: ${results.show.name}` },
		pageSize: paper.pageSize,
		pageMargins: [MARGIN, MARGIN, MARGIN, MARGIN],
		content: pages
	};
}

/** Renders the award cards to PDF on the society's paper. */
export function renderAwardCards(results: ShowResults, paperSize: PaperSize): Promise<Buffer> {
	return renderPdf(awardCardsDefinition(results, paperSize));
}
