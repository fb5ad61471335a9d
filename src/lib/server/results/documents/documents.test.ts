import { describe, expect, it } from 'vitest';
import { PDFParse } from 'pdf-parse';
import { DEFAULT_AWARD_RULES } from '$lib/domain/awards';
import { generateShow } from '$lib/results/generated-show';
import { eachEntry } from '$lib/results/assemble';
import { entryAwards } from '$lib/results/labels';
import { renderAwardCards } from './award-cards';
import { renderAwardSheets } from './award-sheets';
import { A4_POINTS, LETTER_POINTS, readPdf } from '../../pdf/read-pdf';
import { LABEL_SHEETS, renderRibbonLabels, ribbonLabels } from './ribbon-labels';

async function textOf(buffer: Buffer): Promise<{ text: string; pages: number }> {
	const parser = new PDFParse({ data: new Uint8Array(buffer) });
	const result = await parser.getText();
	await parser.destroy();
	return { text: result.text.replace(/\s+/g, ' '), pages: result.total };
}

describe('results documents of a small show', () => {
	const { results } = generateShow({ entries: 60, classesPerDivision: 4, exhibitors: 8 });
	const all = [...eachEntry(results)];
	const awarded = all.filter(({ entry }) => entryAwards(entry).length > 0);

	it('award sheets hold every class, the top awards and the sweepstakes', async () => {
		const { text } = await textOf(await renderAwardSheets(results, 'letter'));
		expect(text).toContain('Award sheets: Generated Autumn Show');
		// The settings line, here today's defaults (see describeAwardSettings).
		expect(text).toContain(
			'Settings used: Panel score: mean of the judges, half up to one decimal; Top awards: a plant may take several.'
		);
		const top = results.topAwards[0];
		expect(top).toBeDefined();
		expect(text).toMatch(new RegExp(`Best in show ${top.classCode} ${top.number} `));
		for (const d of results.divisions) {
			expect(text).toContain(`Sweepstakes, division ${d.code}`);
			const winner = d.sweepstakes.find((s) => s.winner);
			if (winner) expect(text).toContain(`${winner.exhibitor} ${winner.blue} ${winner.red}`);
		}
		// Each entry's row: number, variety, exhibitor, score and award, in that order.
		for (const { entry } of all.slice(0, 20)) {
			const score = entry.score === null ? '–' : String(entry.score);
			expect(text).toContain(`${entry.number} ${entry.plant} ${entry.exhibitor} ${score}`);
		}
		// Blue ribbon from 90 (national handbook, from memory): a 90+ entry's row says so.
		const blue = all.find(({ entry }) => entry.score !== null && entry.score >= 90)!;
		expect(text).toMatch(
			new RegExp(
				`${blue.entry.number} ${blue.entry.plant} ${blue.entry.exhibitor} [\\d.]+ [^]*?Blue ribbon`
			)
		);
	});

	it(
		'award sheets name other award settings when the show sets them',
		{ timeout: 60_000 },
		async () => {
			const rules = {
				...DEFAULT_AWARD_RULES,
				system: 'placement' as const,
				honorableMentions: { rule: 'number' as const, count: 3 },
				meanRounding: 'whole' as const,
				topAwardsPerPlant: 'one' as const
			};
			const placed = generateShow({ entries: 30, classesPerDivision: 3, exhibitors: 6, rules });
			const { text } = await textOf(await renderAwardSheets(placed.results, 'letter'));
			expect(text).toContain(
				'Settings used: Honorable mentions: up to 3 per class; Panel score: mean of the judges, half up to whole points; Top awards: one per plant, in the order listed.'
			);
		}
	);

	it('award cards: one per awarded entry with award, class, variety, score and comment', async () => {
		const { text, pages } = await textOf(await renderAwardCards(results, 'letter'));
		expect(pages).toBe(Math.ceil(awarded.length / 4));
		for (const { cls, entry } of awarded) {
			expect(text).toContain(`Class ${cls.code}: ${cls.name}`);
			expect(text).toContain(`Entry ${entry.number} Score ${entry.score}`);
		}
		const commented = awarded.find(({ entry }) => entry.comments.length > 0)!;
		expect(text).toContain(commented.entry.comments[0]);
		expect(text.match(/Entry \d+ Score/g)).toHaveLength(awarded.length);
	});

	it('ribbon labels: one per award, thirty to a page', async () => {
		const labels = ribbonLabels(results);
		const expected = awarded.reduce((n, { entry }) => n + entryAwards(entry).length, 0);
		expect(labels).toHaveLength(expected);
		const { text, pages } = await textOf(await renderRibbonLabels(results, 'letter'));
		expect(pages).toBe(Math.ceil(expected / 30));
		expect(text.match(/Class \d+ · Entry \d+/g)).toHaveLength(expected);
		expect(text.match(/Best in class/g)?.length).toBe(
			labels.filter((l) => l.award === 'Best in class').length
		);
	});
});

describe('results documents on each paper size', () => {
	const { results } = generateShow({ entries: 60, classesPerDivision: 4, exhibitors: 8 });
	const awarded = [...eachEntry(results)].filter(({ entry }) => entryAwards(entry).length > 0);
	const labels = ribbonLabels(results).length;
	// Page sizes in points: A4 (ISO 216) and US Letter (ANSI/ASME Y14.1).
	const papers = [
		['a4', A4_POINTS],
		['letter', LETTER_POINTS]
	] as const;

	it.each(papers)('award sheets come out on %s', async (paper, size) => {
		const pdf = await readPdf(await renderAwardSheets(results, paper));
		expect(pdf.sizes.length).toBeGreaterThan(1);
		for (const page of pdf.sizes) expect(page).toEqual(size);
	});

	it.each(papers)('award cards fit four to a %s page', async (paper, size) => {
		const pdf = await readPdf(await renderAwardCards(results, paper));
		// A card taller than half the page would push the cards onto more pages.
		expect(pdf.pages).toBe(Math.ceil(awarded.length / 4));
		for (const page of pdf.sizes) expect(page).toEqual(size);
		expect(pdf.text.match(/Entry \d+ Score/g)).toHaveLength(awarded.length);
	});

	it.each(papers)('ribbon labels fill whole sheets of %s', async (paper, size) => {
		const sheet = LABEL_SHEETS[paper];
		// The grid lies inside the page (label sheets: common practice sizes).
		expect(sheet.perRow * sheet.width + (sheet.perRow - 1) * sheet.gap).toBeLessThan(size.width);
		expect(sheet.top + sheet.rows * sheet.height).toBeLessThan(size.height - 20);
		const pdf = await readPdf(await renderRibbonLabels(results, paper));
		expect(pdf.pages).toBe(Math.ceil(labels / (sheet.perRow * sheet.rows)));
		for (const page of pdf.sizes) expect(page).toEqual(size);
		expect(pdf.text.match(/Class \d+ · Entry \d+/g)).toHaveLength(labels);
	});

	it('an A4 label sheet holds 21 labels and a Letter one 30', () => {
		expect(LABEL_SHEETS.a4.perRow * LABEL_SHEETS.a4.rows).toBe(21); // common practice
		expect(LABEL_SHEETS.letter.perRow * LABEL_SHEETS.letter.rows).toBe(30); // common practice
	});
});

// Generous timeouts: the machine may be busy. Speed is measured by the benchmark, not here.
describe('results documents of a large show (2,000 entries)', { timeout: 180_000 }, () => {
	const { results } = generateShow({
		entries: 2000,
		divisions: 3,
		classesPerDivision: 40,
		exhibitors: 150,
		seed: 11
	});
	const all = [...eachEntry(results)];

	it('award sheets list every entry', async () => {
		const { text } = await textOf(await renderAwardSheets(results, 'letter'));
		// Every entry's row, and the top awards table's rows, which name the entry too.
		const rows = text.match(/\b\d+ (?:[A-Z][a-z]+ ){2}Exhibitor \d+ Testwood /g) ?? [];
		expect(results.topAwards.length).toBeGreaterThan(0);
		expect(rows).toHaveLength(2000 + results.topAwards.length);
		const last = all[all.length - 1].entry;
		expect(text).toContain(`${last.number} ${last.plant} ${last.exhibitor}`);
	});

	it('award cards and labels cover every awarded entry', async () => {
		const awarded = all.filter(({ entry }) => entryAwards(entry).length > 0).length;
		expect(awarded).toBeGreaterThan(500);
		const cards = await textOf(await renderAwardCards(results, 'letter'));
		expect(cards.text.match(/Entry \d+ Score/g)).toHaveLength(awarded);
		const labels = await textOf(await renderRibbonLabels(results, 'letter'));
		expect(labels.text.match(/Class \d+ · Entry \d+/g)).toHaveLength(ribbonLabels(results).length);
	});
});
