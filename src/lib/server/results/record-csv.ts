/**
 * A society's record of varieties as CSV: one row per variety with its entries, how often it
 * placed, each ribbon or place, and its best and average scores (no exhibitors, no comments).
 */
import Papa from 'papaparse';
import type { AwardLevel } from '$lib/domain/awards';
import type { VarietyRecord } from '$lib/domain/record';
import { LEVEL_LABELS, formatScore } from '$lib/results/labels';

/** Builds the CSV text (a header row; cells that look like formulas are made inert). */
export function buildRecordCsv(rows: readonly VarietyRecord[], levels: AwardLevel[]): string {
	const fields = [
		'variety',
		'shows',
		'entries',
		'placed',
		...levels.map((l) => LEVEL_LABELS[l].toLowerCase()),
		'best score',
		'average score'
	];
	const data = rows.map((r) => [
		r.variety,
		String(r.shows),
		String(r.entries),
		String(r.placed),
		...levels.map((l) => String(r.counts[l])),
		r.bestScore === null ? '' : formatScore(r.bestScore),
		r.averageScore === null ? '' : formatScore(r.averageScore)
	]);
	return Papa.unparse({ fields, data }, { escapeFormulae: true, newline: '\r\n' });
}
