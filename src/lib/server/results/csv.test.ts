import { describe, expect, it } from 'vitest';
import Papa from 'papaparse';
import { generateShow } from '$lib/results/generated-show';
import { eachEntry } from '$lib/results/assemble';
import { buildResultsCsv } from './csv';

describe('buildResultsCsv', () => {
	const { results } = generateShow({ entries: 80, classesPerDivision: 5, exhibitors: 10 });
	const all = [...eachEntry(results)];

	it('has one row per entry with its score and awards', () => {
		const parsed = Papa.parse<Record<string, string>>(buildResultsCsv(results), { header: true });
		expect(parsed.errors).toEqual([]);
		expect(parsed.data).toHaveLength(80);
		for (const { cls, entry } of all) {
			const row = parsed.data.find((r) => r.entry === String(entry.number))!;
			expect(row.class).toBe(cls.code);
			expect(row.variety).toBe(entry.plant);
			expect(row.score).toBe(entry.score === null ? '' : String(entry.score));
			// Merit marks blue 90, red 80, white 70: national handbook, from memory (DOMAIN.md).
			const expected =
				entry.score === null
					? ''
					: entry.score >= 90
						? 'Blue ribbon'
						: entry.score >= 80
							? 'Red ribbon'
							: entry.score >= 70
								? 'White ribbon'
								: '';
			expect(row['ribbon or place']).toBe(expected);
		}
		const winners = parsed.data.filter((r) => r.sweepstakes === 'division winner');
		expect(winners.length).toBeGreaterThan(0);
		expect(parsed.data.filter((r) => r['top awards'] === 'Best in show')).toHaveLength(
			results.topAwards.length
		);
	});

	it('leaves comments out unless asked, and makes formula-like cells inert', () => {
		const { results: tricky } = generateShow({ entries: 5, classesPerDivision: 1 });
		tricky.divisions[0].classes[0].entries[0].plant = '=HYPERLINK("http://x")';
		tricky.divisions[0].classes[0].entries[0].comments = ['Lovely symmetry'];
		const open = buildResultsCsv(tricky);
		expect(open).not.toContain('Lovely symmetry');
		expect(open).toContain(`"'=HYPERLINK(""http://x"")"`);
		expect(buildResultsCsv(tricky, { includeComments: true })).toContain('Lovely symmetry');
	});
});
