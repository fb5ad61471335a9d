import { describe, expect, it } from 'vitest';
import { PDFParse } from 'pdf-parse';
import { renderPdf } from './render';
import { potLabelsDocument } from './pot-labels';

async function textOf(buffer: Buffer): Promise<{ text: string; pages: number }> {
	const parser = new PDFParse({ data: new Uint8Array(buffer) });
	const result = await parser.getText();
	await parser.destroy();
	return { text: result.text, pages: result.pages.length };
}

describe('potLabelsDocument', () => {
	it('puts each plant on a label with its variety, how and when it was potted', async () => {
		const buffer = await renderPdf(
			potLabelsDocument([
				{
					varietyName: 'Harbor Dusk',
					label: 'window sill',
					obtainedHow: 'sucker',
					obtainedOn: '2027-03-12'
				},
				{ varietyName: "Wren's Ladder", label: null, obtainedHow: 'leaf', obtainedOn: '2028-02-29' }
			])
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
		const { text, pages } = await textOf(await renderPdf(potLabelsDocument(many)));
		expect(text).toContain('Seedling 90');
		expect(pages).toBeGreaterThan(1);
		const empty = await textOf(await renderPdf(potLabelsDocument([])));
		expect(empty.text).toContain('No plants chosen.');
	});
});
