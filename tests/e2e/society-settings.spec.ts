import { expect, test } from '@playwright/test';
import { expectAccessible } from './support/axe';
import { withDb } from './support/judging-fixture';
import { readPdf } from '../../src/lib/server/pdf/read-pdf';

// Page sizes in points: A4 210 x 297 mm (ISO 216), US Letter 8.5 x 11 in (ANSI/ASME Y14.1).
const A4 = { width: 595.28, height: 841.89 };
const LETTER = { width: 612, height: 792 };

interface Demo {
	societyId: string;
	settings: Record<string, string>;
	slug: string;
	classId: string;
	className: string;
	maxDiameterIn: string | null;
}

/** The demo society's settings and its published spring show's first class, to put back after. */
async function readDemo(): Promise<Demo> {
	return withDb(async (db) => {
		const { rows } = await db.query(
			`SELECT so.id AS society_id, so.country, so.length_unit, so.paper_size, so.time_zone,
			        so.currency, so.updated_at::text AS updated_at, s.slug, c.id AS class_id,
			        c.name AS class_name, c.max_diameter_in::text AS max_diameter_in
			   FROM societies so
			   JOIN shows s ON s.society_id = so.id AND s.schedule_published_at IS NOT NULL
			   JOIN classes c ON c.show_id = s.id
			  WHERE so.slug = 'larkspur-valley' AND s.slug LIKE 'larkspur-spring-%'
			  ORDER BY c.position LIMIT 1`
		);
		const r = rows[0];
		return {
			societyId: r.society_id,
			settings: {
				country: r.country,
				length_unit: r.length_unit,
				paper_size: r.paper_size,
				time_zone: r.time_zone,
				currency: r.currency,
				updated_at: r.updated_at
			},
			slug: r.slug,
			classId: r.class_id,
			className: r.class_name,
			maxDiameterIn: r.max_diameter_in
		};
	});
}

test('a society on cm, A4 and pounds sees its schedule that way, and the demo keeps its defaults', async ({
	page
}) => {
	const demo = await readDemo();
	// The demo society keeps the defaults: inches, Letter, US dollars.
	expect(demo.settings).toMatchObject({ length_unit: 'in', paper_size: 'letter', currency: 'USD' });
	try {
		await withDb(async (db) => {
			await db.query(
				`UPDATE societies SET country = 'GB', length_unit = 'cm', paper_size = 'a4',
				        time_zone = 'Europe/London', currency = 'GBP' WHERE id = $1`,
				[demo.societyId]
			);
			// miniature up to 6 in (growers' references, DOMAIN.md)
			await db.query(`UPDATE classes SET max_diameter_in = 6 WHERE id = $1`, [demo.classId]);
		});

		await page.goto(`/shows/${demo.slug}`);
		// 6 in = 15.24 cm: NIST SP 811
		await expect(page.getByText(/up to 15\.2 cm \(6 in\) across/).first()).toBeVisible();
		await expect(page.getByText('Entry fee: £2.00 per entry.')).toBeVisible();
		await expectAccessible(page);

		const pdf = await readPdf(
			await (await page.request.get(`/shows/${demo.slug}/schedule.pdf`)).body()
		);
		expect(pdf.sizes.length).toBeGreaterThan(0);
		for (const size of pdf.sizes) expect(size).toEqual(A4);
		expect(pdf.text).toContain('up to 15.2 cm (6 in) across');
	} finally {
		await withDb(async (db) => {
			const s = demo.settings;
			await db.query(
				`UPDATE societies SET country = $2, length_unit = $3, paper_size = $4, time_zone = $5,
				        currency = $6, updated_at = $7 WHERE id = $1`,
				[
					demo.societyId,
					s.country,
					s.length_unit,
					s.paper_size,
					s.time_zone,
					s.currency,
					s.updated_at
				]
			);
			await db.query(`UPDATE classes SET max_diameter_in = $2 WHERE id = $1`, [
				demo.classId,
				demo.maxDiameterIn
			]);
		});
	}

	// Put back: Letter and dollars again.
	await page.goto(`/shows/${demo.slug}`);
	await expect(page.getByText('Entry fee: $2.00 per entry.')).toBeVisible();
	await expect(page.getByText(/15\.2 cm \(6 in\)/)).toHaveCount(0);
	const pdf = await readPdf(
		await (await page.request.get(`/shows/${demo.slug}/schedule.pdf`)).body()
	);
	for (const size of pdf.sizes) expect(size).toEqual(LETTER);
});
