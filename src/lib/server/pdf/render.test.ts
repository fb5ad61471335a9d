import { describe, expect, it } from 'vitest';
import { PDFParse } from 'pdf-parse';
import { renderPdf } from './render';

describe('renderPdf', () => {
	it('makes a PDF with the shipped font whose text can be read back', async () => {
		const buffer = await renderPdf({
			content: [{ text: 'Best in show: entry 17', style: 'title' }, 'Größe 15,2 cm']
		});
		expect(buffer.subarray(0, 5).toString()).toBe('%PDF-');
		const parser = new PDFParse({ data: new Uint8Array(buffer) });
		const { text } = await parser.getText();
		await parser.destroy();
		expect(text).toContain('Best in show: entry 17');
		expect(text).toContain('Größe 15,2 cm');
		expect(buffer.toString('latin1')).toContain('SourceSans3');
	});
});
