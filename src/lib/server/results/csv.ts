/**
 * The results as CSV for the society newsletter: one row per entry with its division, class,
 * variety, exhibitor, score and every award. Judges' comments only when asked (the chair's copy).
 */
import Papa from 'papaparse';
import { eachEntry } from '$lib/results/assemble';
import { LEVEL_LABELS, formatScore } from '$lib/results/labels';
import type { ShowResults } from '$lib/results/types';

const STATES: Record<string, string> = { scored: 'judged', not_judged: 'not judged', waiting: '' };

/** Builds the CSV text (with a header row; cells that look like formulas are made inert). */
export function buildResultsCsv(
	results: ShowResults,
	options: { includeComments?: boolean } = {}
): string {
	const fields = [
		'division',
		'class',
		'class name',
		'entry',
		'variety',
		'exhibitor',
		'score',
		'ribbon or place',
		'best in class',
		'top awards',
		'sweepstakes',
		'judged'
	];
	if (options.includeComments) fields.push("judges' comments");
	const winners = new Set<string>();
	for (const d of results.divisions) {
		for (const s of d.sweepstakes) if (s.winner) winners.add(`${d.id}:${s.exhibitorId}`);
	}
	const data: string[][] = [];
	for (const { division, cls, entry } of eachEntry(results)) {
		const row = [
			division.code,
			cls.code,
			cls.name,
			String(entry.number),
			entry.plant,
			entry.exhibitor,
			entry.score === null ? '' : formatScore(entry.score),
			entry.level ? LEVEL_LABELS[entry.level] : '',
			entry.bestInClass ? 'yes' : '',
			entry.topAwards.join('; '),
			winners.has(`${division.id}:${entry.exhibitorId}`) ? 'division winner' : '',
			STATES[entry.state]
		];
		if (options.includeComments) row.push(entry.comments.join(' / '));
		data.push(row);
	}
	return Papa.unparse({ fields, data }, { escapeFormulae: true, newline: '\r\n' });
}

/** A CSV download answer with a safe file name. */
export function csvResponse(text: string, fileName: string, cache = 'private, no-store'): Response {
	const safe = fileName.replace(/[^A-Za-z0-9._-]+/g, '-');
	return new Response(`\uFEFF${text}`, {
		headers: {
			'content-type': 'text/csv; charset=utf-8',
			'content-disposition': `attachment; filename="${safe}"`,
			'cache-control': cache
		}
	});
}
