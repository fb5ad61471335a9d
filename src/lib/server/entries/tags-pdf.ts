import QRCode from 'qrcode';
import type { Content, TDocumentDefinitions } from 'pdfmake/interfaces';
import type { PaperSize } from '$lib/domain/society-settings';
import type { TagEntry } from './desk';
import { paperOf } from '../pdf/paper';

/** The address a tag's QR code opens: the entry in Crownbench, by show and number. */
export function entryLink(origin: string, showSlug: string, number: number): string {
	return `${origin}/e/${encodeURIComponent(showSlug)}/${number}`;
}

const MARGIN = 36; // points (0.5 in)
const TAGS_PER_PAGE = 3;

/**
 * Entry tags: the judge-facing part shows only the anonymous number, the class, the variety and
 * a QR code; below a dashed fold line, the exhibitor's stub (name and number) folds away or
 * tears off so judges never see whose plant it is. Three to a page of the society's paper.
 */
export async function entryTagsDocument(
	show: { name: string; slug: string },
	entries: TagEntry[],
	origin: string,
	paperSize: PaperSize
): Promise<TDocumentDefinitions> {
	const paper = paperOf(paperSize);
	const lineWidth = paper.width - 2 * MARGIN;
	const tags: Content[] = [];
	for (const [i, entry] of entries.entries()) {
		const qr = await QRCode.toDataURL(entryLink(origin, show.slug, entry.number), {
			margin: 1,
			width: 240,
			errorCorrectionLevel: 'M'
		});
		tags.push({
			unbreakable: true,
			pageBreak: i > 0 && i % TAGS_PER_PAGE === 0 ? 'before' : undefined,
			margin: [0, 0, 0, 18],
			stack: [
				{
					columns: [
						{
							width: '*',
							stack: [
								{ text: show.name, style: 'small' },
								{ text: `Entry ${entry.number}`, fontSize: 34, bold: true, margin: [0, 4, 0, 4] },
								{ text: `Class ${entry.classLabel}`, fontSize: 12, bold: true },
								{ text: entry.plant || '—', fontSize: 12, margin: [0, 2, 0, 0] }
							]
						},
						{ width: 96, image: qr, fit: [96, 96] }
					]
				},
				{
					canvas: [
						{
							type: 'line',
							x1: 0,
							y1: 8,
							x2: lineWidth,
							y2: 8,
							dash: { length: 5, space: 4 },
							lineWidth: 1,
							lineColor: '#45524b'
						}
					]
				},
				{
					text: 'Fold back along the dashed line (or tear off) before the plant goes to the bench.',
					style: 'small',
					margin: [0, 2, 0, 4]
				},
				{
					columns: [
						{ text: `Exhibitor: ${entry.exhibitor}`, bold: true },
						{
							text: `Entry ${entry.number} · Class ${entry.classLabel.split(' ')[0]}`,
							alignment: 'right'
						}
					]
				}
			]
		});
	}
	if (!tags.length) tags.push({ text: 'No entries to print.' });
	return {
		info: { title: `Entry tags: ${show.name}` },
		pageSize: paper.pageSize,
		pageMargins: [MARGIN, MARGIN, MARGIN, MARGIN],
		content: tags
	};
}
