/**
 * The award sheets of a show: the top awards, every class with its entries (entry number,
 * variety, exhibitor, score, award) and the sweepstakes standings of each division.
 */
import type { Content, TableCell, TDocumentDefinitions } from 'pdfmake/interfaces';
import { awardLine, formatScore } from '$lib/results/labels';
import type { PaperSize } from '$lib/domain/society-settings';
import type { ResultDivision, ShowResults } from '$lib/results/types';
import { paperOf } from '../../pdf/paper';
import { renderPdf } from '../../pdf/render';
import { showHeading } from './common';

const header = (labels: string[]): TableCell[] =>
	labels.map((text) => ({ text, style: 'tableHeader' }));

function topAwardsTable(results: ShowResults): Content {
	if (results.topAwards.length === 0) {
		return { text: 'No top awards were given.', italics: true };
	}
	return {
		table: {
			headerRows: 1,
			widths: ['*', 'auto', 'auto', '*', '*', 'auto'],
			body: [
				header(['Top award', 'Class', 'Entry', 'Variety', 'Exhibitor', 'Score']),
				...results.topAwards.map((t) => [
					{ text: t.name, bold: true },
					t.classCode,
					String(t.number),
					t.plant,
					t.exhibitor,
					formatScore(t.score)
				])
			]
		},
		layout: 'lightHorizontalLines'
	};
}

function sweepstakesTable(
	division: ResultDivision,
	system: ShowResults['show']['system']
): Content {
	if (division.sweepstakes.length === 0) {
		return { text: 'No ribbons were given in this division.', italics: true };
	}
	const levels =
		system === 'merit'
			? (['blue', 'red', 'white'] as const)
			: (['first', 'second', 'third', 'honourable'] as const);
	const labels: Record<string, string> = {
		blue: 'Blue',
		red: 'Red',
		white: 'White',
		first: 'First',
		second: 'Second',
		third: 'Third',
		honourable: 'Hon. mention'
	};
	return {
		table: {
			headerRows: 1,
			widths: ['*', ...levels.map(() => 'auto' as const), 'auto'],
			body: [
				header(['Exhibitor', ...levels.map((l) => labels[l]), '']),
				...division.sweepstakes.map((row) => [
					row.exhibitor,
					...levels.map((l) => String(row[l])),
					row.winner ? { text: 'Sweepstakes', bold: true } : ''
				])
			]
		},
		layout: 'lightHorizontalLines'
	};
}

/** One short line naming the award settings the results were decided under. */
function settingsLine(results: ShowResults): Content {
	if (results.show.awardSettings.length === 0) return [];
	return {
		text: `Settings used: ${results.show.awardSettings.join('; ')}.`,
		style: 'small',
		margin: [0, 0, 0, 8]
	};
}

/** The pdfmake definition of the award sheets. */
export function awardSheetsDefinition(
	results: ShowResults,
	paperSize: PaperSize
): TDocumentDefinitions {
	const content: Content[] = [
		...showHeading(results, 'Award sheets'),
		settingsLine(results),
		{ text: 'Top awards', style: 'heading' },
		topAwardsTable(results)
	];
	if (results.undecided.length > 0) {
		content.push({ text: 'Not decided by the rules', style: 'heading' }, { ul: results.undecided });
	}
	for (const division of results.divisions) {
		content.push({
			text: `Division ${division.code}: ${division.name}`,
			style: 'heading',
			fontSize: 15,
			pageBreak: 'before'
		});
		for (const cls of division.classes) {
			content.push({ text: `Class ${cls.code}: ${cls.name}`, style: 'heading' });
			if (cls.entries.length === 0) {
				content.push({ text: 'No entries.', italics: true });
				continue;
			}
			content.push({
				table: {
					headerRows: 1,
					widths: [34, '*', '*', 34, '*'],
					body: [
						header(['Entry', 'Variety', 'Exhibitor', 'Score', 'Award']),
						...cls.entries.map((e) => [
							String(e.number),
							e.plant,
							e.exhibitor,
							{ text: formatScore(e.score), alignment: 'right' as const },
							awardLine(e)
						])
					]
				},
				layout: 'lightHorizontalLines'
			});
		}
		content.push(
			{ text: `Sweepstakes, division ${division.code}`, style: 'heading' },
			sweepstakesTable(division, results.show.system)
		);
	}
	return {
		info: { title: `Award sheets: ${results.show.name}` },
		pageSize: paperOf(paperSize).pageSize,
		pageMargins: [40, 40, 40, 48],
		footer: (page, pages) => ({
			text: `${results.show.name} · award sheets · page ${page} of ${pages}`,
			style: 'small',
			alignment: 'center'
		}),
		content
	};
}

/** Renders the award sheets to PDF on the society's paper. */
export function renderAwardSheets(results: ShowResults, paperSize: PaperSize): Promise<Buffer> {
	return renderPdf(awardSheetsDefinition(results, paperSize));
}
