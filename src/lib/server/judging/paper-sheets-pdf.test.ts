import { describe, expect, it } from 'vitest';
import { panelClassListDocument, paperSheetsDocument } from './paper-sheets-pdf';
import { renderPdf } from '../pdf/render';
import { A4_POINTS, LETTER_POINTS, readPdf } from '../pdf/read-pdf';

// The default scale for single-crowned standards: symmetry 25, condition 25, quantity of bloom 25,
// size and type of blossom 15, color of blossom 10 ("A Beginner's Guide to Judging", African
// Violet Magazine, May/June 1993, rev. 2020; DOMAIN.md).
const SCALE = [
	{ key: 'symmetry', label: 'Symmetry', maxPoints: 25 },
	{ key: 'condition', label: 'Condition', maxPoints: 25 },
	{ key: 'quantity', label: 'Quantity of bloom', maxPoints: 25 },
	{ key: 'size', label: 'Size and type of blossom', maxPoints: 15 },
	{ key: 'color', label: 'Color of blossom', maxPoints: 10 }
];

const classes = [
	{
		id: 'c1',
		code: '3',
		name: 'Standards, blue blossoms',
		division: 'I Standards',
		panel: 'Bench One',
		scaleName: 'Standard single crown',
		criteria: SCALE,
		entries: [
			{ id: 'e1', number: 417, plant: 'Quiet Harbor Dawn' },
			{ id: 'e2', number: 152, plant: 'Lantern Moss' }
		]
	},
	{
		id: 'c2',
		code: '4',
		name: 'Standards, pink blossoms',
		division: 'I Standards',
		panel: null,
		scaleName: 'Standard single crown',
		criteria: SCALE,
		entries: [{ id: 'e3', number: 838, plant: 'Wicker Robin' }]
	}
];

describe('paper judging sheets', () => {
	it('read back: one class a page, its entry numbers, the scale of points with its most points, comments', async () => {
		const pdf = await renderPdf(paperSheetsDocument({ name: 'Spring Show' }, classes, 'letter'));
		const { text, pages, sizes } = await readPdf(pdf);
		expect(pages).toBe(2);
		// Landscape Letter.
		expect(sizes[0]).toEqual({ width: LETTER_POINTS.height, height: LETTER_POINTS.width });
		const [first, second] = text.split('Class 4 Standards, pink blossoms');
		expect(first).toContain('Class 3 Standards, blue blossoms');
		expect(first).toContain('Panel: Bench One');
		for (const heading of [
			'Symmetry (of 25)',
			'Condition (of 25)',
			'Quantity of bloom (of 25)',
			'Size and type of blossom (of 15)',
			'Color of blossom (of 10)',
			'Total',
			'Comments'
		]) {
			expect(first).toContain(heading);
		}
		expect(first).toMatch(/417/);
		expect(first).toMatch(/152/);
		expect(first).not.toMatch(/838/);
		expect(second).toMatch(/838/);
		expect(second).toContain('Panel: not yet seated');
	});

	it('prints on A4 when the society uses A4', async () => {
		const pdf = await renderPdf(paperSheetsDocument({ name: 'Spring Show' }, classes, 'a4'));
		const { sizes } = await readPdf(pdf);
		expect(sizes[0].width).toBeCloseTo(A4_POINTS.height, 0);
	});

	it('names no exhibitor', async () => {
		const doc = paperSheetsDocument({ name: 'Spring Show' }, classes, 'letter');
		expect(JSON.stringify(doc)).not.toMatch(/exhibitor/i);
	});
});

describe('class list per panel', () => {
	it('read back: judges, clerk, classes with their entry numbers', async () => {
		const pdf = await renderPdf(
			panelClassListDocument(
				{ name: 'Spring Show' },
				[
					{
						id: 'p1',
						name: 'Bench One',
						judges: ['Ada Fenwick', 'Milo Terrance'],
						clerk: 'Rue Oakley',
						clerkId: 'u-rue',
						classes: [
							{ id: 'c1', code: '3', name: 'Standards, blue blossoms', entries: [152, 417] }
						]
					}
				],
				'letter'
			)
		);
		const { text } = await readPdf(pdf);
		expect(text).toContain('Panel Bench One');
		expect(text).toContain('Judges: Ada Fenwick, Milo Terrance · Clerk: Rue Oakley');
		expect(text).toContain('Standards, blue blossoms');
		expect(text).toContain('152, 417');
	});
});
