import { describe, expect, it } from 'vitest';
import { generateShow } from '$lib/results/generated-show';
import { buildResultsMessage, entriesOfExhibitor } from './results-message';

const links = {
	results: 'https://example.test/shows/generated-show/results',
	preferences: 'https://example.test/my/mail'
};

describe('buildResultsMessage', () => {
	const { results } = generateShow({ entries: 120, classesPerDivision: 6, exhibitors: 12 });

	it('gives each exhibitor every entry with award, score and comments', () => {
		const sweepWinner = results.divisions[0].sweepstakes.find((s) => s.winner)!;
		const mine = entriesOfExhibitor(results, sweepWinner.exhibitorId);
		const message = buildResultsMessage(
			results,
			{ id: sweepWinner.exhibitorId, name: sweepWinner.exhibitor },
			links
		)!;
		expect(message.subject).toBe('Your results: Generated Autumn Show');
		expect(message.text).toContain(`Dear ${sweepWinner.exhibitor},`);
		expect(message.text.match(/^Entry \d+, class/gm)).toHaveLength(mine.length);
		for (const { cls, entry } of mine) {
			expect(message.text).toContain(`Entry ${entry.number}, class ${cls.code}`);
			for (const c of entry.comments) expect(message.text).toContain(`Judges' comment: ${c}`);
		}
		// A blue-ribbon entry (90 and over: national handbook, from memory) says so.
		const blue = mine.find(({ entry }) => entry.level === 'blue');
		if (blue) {
			expect(message.text).toMatch(
				new RegExp(`Entry ${blue.entry.number}, [^\\n]*\\n  Award: [^\\n]*Blue ribbon`)
			);
		}
		expect(message.text).toContain(`sweepstakes in division ${results.divisions[0].code}`);
		expect(message.text).toContain(links.preferences);
		expect(message.html).toContain(links.results);
	});

	it('escapes names in the HTML part and sends nothing to someone without entries', () => {
		const [first] = results.divisions[0].classes[0].entries;
		first.plant = '<script>x</script>';
		const message = buildResultsMessage(results, { id: first.exhibitorId, name: 'A & B' }, links)!;
		expect(message.html).toContain('&lt;script&gt;');
		expect(message.html).not.toContain('<script>');
		expect(message.html).toContain('Dear A &amp; B,');
		expect(buildResultsMessage(results, { id: 'nobody', name: null }, links)).toBeNull();
	});
});
