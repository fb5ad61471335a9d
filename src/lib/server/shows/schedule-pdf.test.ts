import { describe, expect, it } from 'vitest';
import { DEFAULT_AWARD_RULES } from '$lib/domain/awards';
import type { ScheduleDivision, ShowSettings } from './schedule';
import { A4_POINTS, LETTER_POINTS, readPdf } from '../pdf/read-pdf';
import { renderPdf } from '../pdf/render';
import { scheduleDocument } from './schedule-pdf';

const show: ShowSettings & { societyName: string; entryFeeCents: number } = {
	id: 'x',
	slug: 'spring',
	name: 'Spring Show',
	venue: 'Hall',
	publicHours: '',
	entriesOpen: '2027-03-01',
	entriesClose: '2027-03-20',
	entryDay: '2027-03-26',
	judgingDay: '2027-03-27',
	possessionMonths: 3,
	maxEntriesPerClass: 2,
	maxEntriesPerVariety: 1,
	requireGoodStanding: false,
	awardRules: DEFAULT_AWARD_RULES,
	schedulePublished: true,
	generalRules: '',
	committee: '',
	societyName: 'Testwood Growers',
	entryFeeCents: 150
};

const divisions: ScheduleDivision[] = [
	{
		id: 'd',
		code: 'A',
		name: 'Horticulture',
		kind: 'horticulture',
		classes: [
			{
				id: 'c',
				divisionId: 'd',
				code: '1',
				name: 'Miniatures',
				description: null,
				habit: 'single_crown',
				sizeClasses: ['miniature'],
				blossomTypes: [],
				blossomColours: [],
				foliage: 'any',
				minCrowns: null,
				maxCrowns: null,
				collectionSize: null,
				speciesOnly: false,
				maxDiameterIn: 6, // miniature up to 6 in (growers' references, DOMAIN.md)
				possessionMonths: null,
				maxEntriesPerExhibitor: null,
				maxEntriesPerVariety: null,
				maxPotIn: null,
				plantKind: 'any',
				genera: [],
				growthForms: [],
				rootTypes: [],
				scaleId: null,
				scaleName: null
			},
			{
				id: 'g',
				divisionId: 'd',
				code: '2',
				name: 'Miniature Sinningia species',
				description: null,
				habit: 'any',
				sizeClasses: ['miniature'],
				blossomTypes: [],
				blossomColours: [],
				foliage: 'any',
				minCrowns: null,
				maxCrowns: null,
				collectionSize: null,
				speciesOnly: true,
				maxDiameterIn: null,
				possessionMonths: null,
				maxEntriesPerExhibitor: null,
				maxEntriesPerVariety: null,
				maxPotIn: null,
				plantKind: 'other_gesneriad',
				genera: ['sinningia'],
				growthForms: ['rosette'],
				rootTypes: ['tuberous'],
				scaleId: null,
				scaleName: null
			}
		]
	}
];

describe('scheduleDocument', () => {
	it('prints on A4 with lengths in cm first and the fee in pounds for a British society', async () => {
		const doc = scheduleDocument(show, divisions, {
			paperSize: 'a4',
			lengthUnit: 'cm',
			currency: 'GBP'
		});
		const pdf = await readPdf(await renderPdf(doc));
		for (const page of pdf.sizes) expect(page).toEqual(A4_POINTS); // ISO 216
		expect(pdf.text).toContain('up to 15.2 cm (6 in) across'); // 6 in = 15.24 cm: NIST SP 811
		expect(pdf.text).toContain('Entry fee: £1.50 per entry.');
	});

	it('prints on Letter with inches first and the fee in dollars by default settings', async () => {
		const doc = scheduleDocument(show, divisions, {
			paperSize: 'letter',
			lengthUnit: 'in',
			currency: 'USD'
		});
		const pdf = await readPdf(await renderPdf(doc));
		for (const page of pdf.sizes) expect(page).toEqual(LETTER_POINTS); // ANSI/ASME Y14.1
		expect(pdf.text).toContain('up to 6 in (15.2 cm) across');
		expect(pdf.text).toContain('Entry fee: $1.50 per entry.');
	});

	it('prints the group, genus, growth form, root type and the genus’s own size limit', async () => {
		const doc = scheduleDocument(show, divisions, {
			paperSize: 'letter',
			lengthUnit: 'in',
			currency: 'USD'
		});
		const text = (await readPdf(await renderPdf(doc))).text.replace(/\s+/g, ' ');
		expect(text).toContain('gesneriads other than African violets');
		expect(text).toContain('genus: Sinningia');
		expect(text).toContain('growth: rosette');
		expect(text).toContain('tuberous');
		expect(text).toContain('species only');
		// Miniature Sinningia: leaf blade at most 2.5 in (The Gesneriad Society convention show
		// schedule 2018; New England chapter schedule 2022)
		expect(text).toContain('size: miniature (leaf blade up to 2.5 in (6.4 cm))');
	});
});
