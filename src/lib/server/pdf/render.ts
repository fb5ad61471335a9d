import { readFileSync } from 'node:fs';
import path from 'node:path';
import pdfmakeModule from 'pdfmake';
import type { TDocumentDefinitions } from 'pdfmake/interfaces';
import { config } from '$lib/server/config';

/** The Source Sans 3 files shipped in fonts/ (TTF: pdfmake cannot read WOFF2). */
const FONT_FILES = {
	normal: 'SourceSans3-Regular.ttf',
	bold: 'SourceSans3-Bold.ttf',
	italics: 'SourceSans3-It.ttf',
	bolditalics: 'SourceSans3-BoldIt.ttf'
} as const;

/** The parts of pdfmake 0.3's server API we use (its published types describe 0.2). */
interface PdfMakeServer {
	virtualfs: { writeFileSync(name: string, data: Buffer): void };
	setFonts(fonts: Record<string, Record<string, string>>): void;
	setUrlAccessPolicy(allow: (url: string) => boolean): void;
	setLocalAccessPolicy(allow: (path: string) => boolean): void;
	createPdf(doc: TDocumentDefinitions): { getBuffer(): Promise<Uint8Array> };
}

const pdfmake = pdfmakeModule as unknown as PdfMakeServer;

let ready = false;

/** Loads the shipped fonts into pdfmake's virtual file system once; no file or URL is read later. */
function prepare(): void {
	if (ready) return;
	const dir = config().fontsDir;
	for (const file of Object.values(FONT_FILES)) {
		pdfmake.virtualfs.writeFileSync(file, readFileSync(path.join(dir, file)));
	}
	pdfmake.setFonts({ SourceSans3: { ...FONT_FILES } });
	pdfmake.setUrlAccessPolicy(() => false);
	pdfmake.setLocalAccessPolicy(() => false);
	ready = true;
}

/** Crownbench's document defaults: shipped font, readable sizes, our colors. */
export const PDF_DEFAULTS: Pick<TDocumentDefinitions, 'defaultStyle' | 'styles'> = {
	defaultStyle: { font: 'SourceSans3', fontSize: 10, color: '#1f2a24' },
	styles: {
		title: { fontSize: 18, bold: true, margin: [0, 0, 0, 6] },
		heading: { fontSize: 13, bold: true, margin: [0, 10, 0, 4], color: '#245a40' },
		small: { fontSize: 8, color: '#45524b' },
		tableHeader: { bold: true, fillColor: '#eef6f1' }
	}
};

/** Renders a document definition to a PDF buffer with the shipped fonts. */
export async function renderPdf(doc: TDocumentDefinitions): Promise<Buffer> {
	prepare();
	const merged: TDocumentDefinitions = {
		...doc,
		defaultStyle: { ...PDF_DEFAULTS.defaultStyle, ...doc.defaultStyle },
		styles: { ...PDF_DEFAULTS.styles, ...doc.styles }
	};
	const buffer = await pdfmake.createPdf(merged).getBuffer();
	return Buffer.from(buffer);
}

/** A PDF download answer with a safe file name. */
export function pdfResponse(buffer: Buffer, fileName: string): Response {
	const safe = fileName.replace(/[^A-Za-z0-9._-]+/g, '-');
	return new Response(new Uint8Array(buffer), {
		headers: {
			'content-type': 'application/pdf',
			'content-disposition': `inline; filename="${safe}"`,
			'cache-control': 'private, no-store'
		}
	});
}
