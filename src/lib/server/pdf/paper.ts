import { pdfPageSize, type PaperSize } from '$lib/domain/society-settings';

/** What a document needs to know about its paper: pdfmake's name and the size in points. */
export interface Paper {
	pageSize: 'LETTER' | 'A4';
	/** Page width and height in points (72 pt = 1 in). */
	width: number;
	height: number;
}

/**
 * Page sizes in points: US Letter 8.5 x 11 in (ANSI/ASME Y14.1) and A4 210 x 297 mm (ISO 216),
 * as pdfmake draws them.
 */
const SIZES: Record<PaperSize, { width: number; height: number }> = {
	letter: { width: 612, height: 792 },
	a4: { width: 595.28, height: 841.89 }
};

/** The paper a society prints on, for the document definitions. */
export function paperOf(size: PaperSize): Paper {
	return { pageSize: pdfPageSize(size), ...SIZES[size] };
}
