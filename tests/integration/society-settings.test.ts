import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { Division, Show, ShowClass, Society, sequelize } from '$lib/server/db';
import { renderPdf } from '$lib/server/pdf/render';
import { A4_POINTS, LETTER_POINTS, readPdf } from '$lib/server/pdf/read-pdf';
import { scheduleDocument } from '$lib/server/shows/schedule-pdf';
import { loadPublicSchedule } from '$lib/server/shows/public-schedule';
import { listShowsTakingEntries } from '$lib/server/shows/shows';
import { loadSocietySettings } from '$lib/server/people/society-settings';
import { societyToday } from '$lib/server/people/society-today';

// A society of its own, set up the way a British society would be: cm, A4, Europe/London, GBP.
// Its twin keeps the defaults (in, Letter, America/New_York, USD). Neither touches the demo rows.
const stamp = Date.now().toString(36);
let british: Society;
let american: Society;
const shows: Show[] = [];

async function showOf(society: Society, slug: string): Promise<Show> {
	const show = await Show.create({
		societyId: society.id,
		slug,
		name: `Winter Show ${slug}`,
		entriesOpen: '2027-01-01',
		entriesClose: '2027-01-10',
		entryDay: '2027-01-15',
		judgingDay: '2027-01-16',
		entryFeeCents: 150,
		schedulePublishedAt: new Date('2026-12-01T12:00:00Z')
	} as never);
	const division = await Division.create({
		showId: show.id,
		code: 'A',
		name: 'Horticulture',
		position: 1
	} as never);
	await ShowClass.create({
		showId: show.id,
		divisionId: division.id,
		code: '1',
		name: 'Miniatures',
		position: 1,
		maxDiameterIn: '6.00' // miniature up to 6 in (growers' references, DOMAIN.md)
	} as never);
	shows.push(show);
	return show;
}

beforeAll(async () => {
	british = await Society.create({
		name: 'Testwood Violet Circle',
		slug: `testwood-${stamp}`,
		country: 'GB',
		lengthUnit: 'cm',
		paperSize: 'a4',
		timeZone: 'Europe/London',
		currency: 'GBP'
	} as never);
	american = await Society.create({
		name: 'Testwood Violet Club',
		slug: `testwood-us-${stamp}`
	} as never);
	await showOf(british, `winter-gb-${stamp}`);
	await showOf(american, `winter-us-${stamp}`);
});

afterAll(async () => {
	const ids = shows.map((s) => s.id);
	await ShowClass.destroy({ where: { showId: ids } });
	await Division.destroy({ where: { showId: ids } });
	await Show.destroy({ where: { id: ids } });
	await Society.destroy({ where: { id: [british.id, american.id] } });
	await sequelize.close();
});

describe('a society set to cm, A4, Europe/London and GBP', () => {
	it('reads its settings back', async () => {
		expect(await loadSocietySettings(british.id)).toEqual({
			country: 'GB',
			lengthUnit: 'cm',
			paperSize: 'a4',
			timeZone: 'Europe/London',
			currency: 'GBP'
		});
	});

	it('prints its schedule on A4 with the class limit in cm first and the fee in pounds', async () => {
		const { show, divisions, settings } = await loadPublicSchedule(`winter-gb-${stamp}`, null);
		const pdf = await readPdf(await renderPdf(scheduleDocument(show, divisions, settings)));
		for (const page of pdf.sizes) expect(page).toEqual(A4_POINTS); // A4: ISO 216
		expect(pdf.text).toContain('up to 15.2 cm (6 in) across'); // 6 in = 15.24 cm: NIST SP 811
		expect(pdf.text).toContain('Entry fee: £1.50 per entry.');
	});

	it('while a society on the defaults prints on Letter, inches first, in dollars', async () => {
		const { show, divisions, settings } = await loadPublicSchedule(`winter-us-${stamp}`, null);
		const pdf = await readPdf(await renderPdf(scheduleDocument(show, divisions, settings)));
		for (const page of pdf.sizes) expect(page).toEqual(LETTER_POINTS); // ANSI/ASME Y14.1
		expect(pdf.text).toContain('up to 6 in (15.2 cm) across');
		expect(pdf.text).toContain('Entry fee: $1.50 per entry.');
	});

	it('starts its day at midnight in London, not in New York', async () => {
		// Europe/London is GMT (UTC+0) in January, America/New_York EST (UTC-5): IANA tz database.
		const before = new Date('2027-01-10T23:59:30Z');
		const after = new Date('2027-01-11T00:00:30Z');
		expect(await societyToday(british.id, { now: before })).toBe('2027-01-10');
		expect(await societyToday(british.id, { now: after })).toBe('2027-01-11');
		expect(await societyToday(american.id, { now: after })).toBe('2027-01-10');

		// Entries close on 10 January: the British show stops taking them at midnight in London,
		// the American one still takes them until midnight in New York.
		const open = async (now: Date) =>
			(await listShowsTakingEntries([british.id, american.id], now)).map((s) => s.slug).sort();
		expect(await open(before)).toEqual([`winter-gb-${stamp}`, `winter-us-${stamp}`]);
		expect(await open(after)).toEqual([`winter-us-${stamp}`]);
	});
});
