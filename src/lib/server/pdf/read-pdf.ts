import { PDFParse } from 'pdf-parse';

/** What the tests read back from a rendered PDF: its text, page count and each page's size. */
export interface PdfFacts {
	text: string;
	pages: number;
	/** Width and height of each page in points, rounded to 0.01 pt. */
	sizes: { width: number; height: number }[];
}

/** Reads a PDF back (for tests): text with whitespace collapsed, pages and page sizes. */
export async function readPdf(buffer: Buffer | Uint8Array): Promise<PdfFacts> {
	const parser = new PDFParse({ data: new Uint8Array(buffer) });
	try {
		const text = await parser.getText();
		const info = await parser.getInfo({ parsePageInfo: true });
		const round = (n: number) => Math.round(n * 100) / 100;
		return {
			text: text.text.replace(/\s+/g, ' '),
			pages: text.total,
			sizes: (info.pages ?? []).map((p) => ({ width: round(p.width), height: round(p.height) }))
		};
	} finally {
		await parser.destroy();
	}
}

/** Page sizes in points: A4 210 x 297 mm (ISO 216), US Letter 8.5 x 11 in (ANSI/ASME Y14.1). */
export const A4_POINTS = { width: 595.28, height: 841.89 };
export const LETTER_POINTS = { width: 612, height: 792 };
