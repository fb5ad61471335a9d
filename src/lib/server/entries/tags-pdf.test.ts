import { describe, expect, it } from 'vitest';
import { PDFParse } from 'pdf-parse';
import { renderPdf } from '../pdf/render';
import { A4_POINTS, LETTER_POINTS, readPdf } from '../pdf/read-pdf';
import { entryLink, entryTagsDocument } from './tags-pdf';

describe('entry tags', () => {
	it('put number, class and variety above the fold and the exhibitor only on the stub', async () => {
		const doc = await entryTagsDocument(
			{ name: 'Spring Show', slug: 'spring' },
			[
				{
					number: 17,
					classLabel: '12 Semiminiatures',
					plant: 'Quiet Meadow Frost',
					exhibitor: 'Wren Halloway'
				}
			],
			'https://cb.example',
			'letter'
		);
		const pdf = await renderPdf(doc);
		const parser = new PDFParse({ data: new Uint8Array(pdf) });
		const { text } = await parser.getText();
		await parser.destroy();
		const fold = text.indexOf('Fold back along the dashed line');
		expect(fold).toBeGreaterThan(0);
		for (const judgeFacing of ['Entry 17', 'Class 12 Semiminiatures', 'Quiet Meadow Frost']) {
			expect(text.indexOf(judgeFacing)).toBeGreaterThanOrEqual(0);
			expect(text.indexOf(judgeFacing)).toBeLessThan(fold);
		}
		expect(text.indexOf('Wren Halloway')).toBeGreaterThan(fold);
		expect(pdf.toString('latin1')).toMatch(/\/Subtype\s*\/Image/); // the QR code
	});

	it.each([
		['a4', A4_POINTS],
		['letter', LETTER_POINTS]
	] as const)('fit three to a %s page', async (paper, size) => {
		const entries = Array.from({ length: 7 }, (_, i) => ({
			number: i + 1,
			classLabel: '3 Standards',
			plant: `Seedling ${i + 1}`,
			exhibitor: 'Wren Halloway'
		}));
		const doc = await entryTagsDocument(
			{ name: 'Spring', slug: 'spring' },
			entries,
			'https://cb.example',
			paper
		);
		const pdf = await readPdf(await renderPdf(doc));
		expect(pdf.pages).toBe(3);
		for (const page of pdf.sizes) expect(page).toEqual(size);
	});

	it('link to the entry by show and number', () => {
		expect(entryLink('https://cb.example', 'spring show', 5)).toBe(
			'https://cb.example/e/spring%20show/5'
		);
	});
});
