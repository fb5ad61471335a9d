/**
 * The placements e-mail: one message per exhibitor with every entry's award, score and the
 * judges' comments, and a link to the public results.
 */
import { eachEntry } from '$lib/results/assemble';
import { awardLine, formatScore } from '$lib/results/labels';
import type { ResultClass, ResultEntry, ShowResults } from '$lib/results/types';
import { escapeHtml } from '../mail/escape';

/** One exhibitor's entries, in schedule order. */
export function entriesOfExhibitor(
	results: ShowResults,
	exhibitorId: string
): { cls: ResultClass; entry: ResultEntry }[] {
	const mine: { cls: ResultClass; entry: ResultEntry }[] = [];
	for (const { cls, entry } of eachEntry(results)) {
		if (entry.exhibitorId === exhibitorId) mine.push({ cls, entry });
	}
	return mine;
}

/** Composes the message for one exhibitor; null when they had no entry in the show. */
export function buildResultsMessage(
	results: ShowResults,
	exhibitor: { id: string; name: string | null },
	links: { results: string; preferences: string }
): { subject: string; text: string; html: string } | null {
	const mine = entriesOfExhibitor(results, exhibitor.id);
	if (mine.length === 0) return null;
	const show = results.show;
	const greeting = exhibitor.name ? `Dear ${exhibitor.name},` : 'Hello,';
	const intro = `the results of ${show.name} (${show.societyName}) are out. Here is how your ${mine.length === 1 ? 'entry' : `${mine.length} entries`} placed:`;
	const sweeps = results.divisions.filter((d) =>
		d.sweepstakes.some((s) => s.winner && s.exhibitorId === exhibitor.id)
	);
	const tops = results.topAwards.filter((t) => t.exhibitorId === exhibitor.id);

	const textLines = [greeting, '', intro, ''];
	for (const { cls, entry } of mine) {
		textLines.push(
			`Entry ${entry.number}, class ${cls.code} (${cls.name}): ${entry.plant}`,
			`  Award: ${awardLine(entry)}`,
			`  Score: ${formatScore(entry.score)}`
		);
		for (const c of entry.comments) textLines.push(`  Judges' comment: ${c}`);
		textLines.push('');
	}
	for (const t of tops) textLines.push(`Congratulations: ${t.name} for entry ${t.number}.`);
	for (const d of sweeps) textLines.push(`Congratulations: sweepstakes in division ${d.code}.`);
	if (tops.length + sweeps.length > 0) textLines.push('');
	textLines.push(
		`All results: ${links.results}`,
		'',
		`You get this because you exhibited in the show. To stop results e-mails, change your mail settings: ${links.preferences}`
	);

	const rows = mine
		.map(({ cls, entry }) => {
			const comments = entry.comments
				.map((c) => `<br><em>Judges' comment: ${escapeHtml(c)}</em>`)
				.join('');
			return `<tr><td style="padding:6px;border-top:1px solid #d6dbd3">${entry.number}</td><td style="padding:6px;border-top:1px solid #d6dbd3">${escapeHtml(cls.code)} ${escapeHtml(cls.name)}</td><td style="padding:6px;border-top:1px solid #d6dbd3">${escapeHtml(entry.plant)}${comments}</td><td style="padding:6px;border-top:1px solid #d6dbd3;text-align:right">${escapeHtml(formatScore(entry.score))}</td><td style="padding:6px;border-top:1px solid #d6dbd3"><strong>${escapeHtml(awardLine(entry))}</strong></td></tr>`;
		})
		.join('\n');
	const cheers = [
		...tops.map((t) => `${escapeHtml(t.name)} for entry ${t.number}`),
		...sweeps.map((d) => `sweepstakes in division ${escapeHtml(d.code)}`)
	];
	const html = `<!doctype html><html><body style="font-family: sans-serif; color: #1f2a24">
<p>${escapeHtml(greeting)}</p>
<p>${escapeHtml(intro)}</p>
<table style="border-collapse:collapse" role="presentation">
<tr><th style="padding:6px;text-align:left">Entry</th><th style="padding:6px;text-align:left">Class</th><th style="padding:6px;text-align:left">Variety</th><th style="padding:6px;text-align:right">Score</th><th style="padding:6px;text-align:left">Award</th></tr>
${rows}
</table>
${cheers.length > 0 ? `<p><strong>Congratulations:</strong> ${cheers.join('; ')}.</p>` : ''}
<p><a href="${escapeHtml(links.results)}">All results of the show</a></p>
<p style="font-size:14px">You get this because you exhibited in the show. To stop results e-mails, <a href="${escapeHtml(links.preferences)}">change your mail settings</a>.</p>
</body></html>`;
	return { subject: `Your results: ${show.name}`, text: textLines.join('\n'), html };
}
