import { describe, expect, it } from 'vitest';
import { PDFParse } from 'pdf-parse';
import { renderPdf } from '../pdf/render';
import { LABEL_COLUMNS, potLabelsDocument } from './pot-labels-pdf';
import { A4_POINTS, LETTER_POINTS, readPdf } from '../pdf/read-pdf';

async function textOf(buffer: Buffer): Promise<{ text: string; pages: number }> {
	const parser = new PDFParse({ data: new Uint8Array(buffer) });
	const result = await parser.getText();
	await parser.destroy();
	return { text: result.text, pages: result.pages.length };
}

describe('potLabelsDocument', () => {
	it('puts each plant on a label with its variety, how and when it was potted', async () => {
		const buffer = await renderPdf(
			potLabelsDocument(
				[
					{
						varietyName: 'Harbor Dusk',
						label: 'window sill',
						obtainedHow: 'sucker',
						obtainedOn: '2027-03-12'
					},
					{
						varietyName: "Wren's Ladder",
						label: null,
						obtainedHow: 'leaf',
						obtainedOn: '2028-02-29'
					}
				],
				'a4'
			)
		);
		expect(buffer.subarray(0, 5).toString()).toBe('%PDF-');
		const { text } = await textOf(buffer);
		expect(text).toContain('Harbor Dusk');
		expect(text).toContain('window sill');
		expect(text).toContain('from a sucker, 12 March 2027');
		expect(text).toContain("Wren's Ladder");
		expect(text).toContain('from a leaf, 29 February 2028');
	});

	it('fills more pages when there are many labels, and says so when there are none', async () => {
		const many = Array.from({ length: 90 }, (_, i) => ({
			varietyName: `Seedling ${i + 1}`,
			label: null,
			obtainedHow: 'bought' as const,
			obtainedOn: '2027-01-05'
		}));
		const { text, pages } = await textOf(await renderPdf(potLabelsDocument(many, 'letter')));
		expect(text).toContain('Seedling 90');
		expect(pages).toBeGreaterThan(1);
		const empty = await textOf(await renderPdf(potLabelsDocument([], 'a4')));
		expect(empty.text).toContain('No plants chosen.');
	});

	it.each([
		['a4', A4_POINTS],
		['letter', LETTER_POINTS]
	] as const)('print on %s with every label on the sheet', async (paper, size) => {
		const many = Array.from({ length: 90 }, (_, i) => ({
			varietyName: `Seedling ${i + 1}`,
			label: null,
			obtainedHow: 'bought' as const,
			obtainedOn: '2027-01-05'
		}));
		const pdf = await readPdf(await renderPdf(potLabelsDocument(many, paper)));
		for (const page of pdf.sizes) expect(page).toEqual(size);
		expect(pdf.text.match(/Seedling \d+ /g)).toHaveLength(90);
		// Rows of 48 pt within 28 pt margins: whole rows per page, never more pages than that needs.
		const rowsPerPage = Math.floor((size.height - 2 * 28) / 48);
		expect(pdf.pages).toBeLessThanOrEqual(Math.ceil(90 / LABEL_COLUMNS / (rowsPerPage - 1)));
	});
});
