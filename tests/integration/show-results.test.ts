import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { QueryTypes } from 'sequelize';
import { PDFParse } from 'pdf-parse';
import { sequelize } from '$lib/server/db';
import { workDueJobs } from '$lib/server/jobs/worker';
import { makeJobsDue } from './jobs';
import { renderAwardSheets } from '$lib/server/results/documents/award-sheets';
import { eachEntry } from '$lib/results/assemble';
import { awardLine } from '$lib/results/labels';
import {
	loadPublicResults,
	loadResultsMail,
	loadShowResults,
	publishResultsAndTell,
	resendResultsMail
} from '$lib/server/results/show-results';
import { mailFor } from '../e2e/support/mail';

// The judged autumn show of the demo seed (seeders/20261206000500-demo-judged-autumn-show.cjs):
// invented scores; each expected score is the mean of the two judges' totals (100 less the
// deductions), e.g. entry 1: (96 + 95) / 2 = 95.5.
const fake = process.env.CB_DEV_MAIL_URL ?? 'http://127.0.0.1:2536';
let showId = '';
let slug = '';
let chairId = '';

async function refuse(count: number | 'off'): Promise<void> {
	const query = count === 'off' ? 'until=off' : `count=${count}`;
	expect((await fetch(`${fake}/refuse?${query}`, { method: 'POST' })).ok).toBe(true);
}

async function resultsMailFor(address: string) {
	return (await mailFor(address)).filter((m) => m.subject.startsWith('Your results: Autumn Show'));
}

beforeAll(async () => {
	const [show] = await sequelize.query<{ id: string; slug: string }>(
		`SELECT id, slug FROM shows WHERE slug LIKE 'larkspur-autumn-%'`,
		{ type: QueryTypes.SELECT }
	);
	showId = show.id;
	slug = show.slug;
	const [chair] = await sequelize.query<{ id: string }>(
		`SELECT id FROM users WHERE email = 'chair@crownbench.test'`,
		{ type: QueryTypes.SELECT }
	);
	chairId = chair.id;
	await refuse('off');
});

afterAll(async () => {
	await refuse('off');
	await sequelize.close();
});

describe('publishing results with placements e-mails', () => {
	it('before publishing, the public read gives no results at all', async () => {
		const found = await loadPublicResults(slug);
		expect(found?.show.publishedAt).toBeNull();
		expect(found?.results).toBeNull();
	});

	it('a publish that fails half-way leaves no e-mail and no published results', async () => {
		await expect(
			sequelize.transaction(async (transaction) => {
				await publishResultsAndTell({ id: chairId }, showId, {
					transaction,
					origin: 'http://127.0.0.1'
				});
				throw new Error('power cut');
			})
		).rejects.toThrow('power cut');
		const [{ n }] = await sequelize.query<{ n: string }>(
			'SELECT count(*) AS n FROM outbox_messages WHERE show_id = $1',
			{ bind: [showId], type: QueryTypes.SELECT }
		);
		expect(Number(n)).toBe(0);
		expect((await loadPublicResults(slug))?.results).toBeNull();
	});

	it('publishes, and queues one message per exhibitor who wants one', async () => {
		const outcome = await sequelize.transaction((transaction) =>
			publishResultsAndTell({ id: chairId }, showId, {
				transaction,
				origin: 'http://127.0.0.1'
			})
		);
		// Exhibitors: member, exhibitor1, 2, 3, 4, 6 and 7; exhibitor7 turned results e-mails off.
		expect(outcome.queued).toBe(6);
		const { messages } = await loadResultsMail(showId);
		expect(messages.map((m) => m.to).sort()).toEqual(
			[
				'exhibitor1@crownbench.test',
				'exhibitor2@crownbench.test',
				'exhibitor3@crownbench.test',
				'exhibitor4@crownbench.test',
				'exhibitor6@crownbench.test',
				'member@crownbench.test'
			].sort()
		);
	});

	it('stores the awards the scores earn', async () => {
		const results = (await loadShowResults(showId))!;
		const lines = new Map(
			[...eachEntry(results)].map(({ entry }) => [entry.number, [entry.score, awardLine(entry)]])
		);
		// Merit marks blue 90, red 80, white 70: national handbook, from memory (DOMAIN.md).
		expect(Object.fromEntries(lines)).toEqual({
			1: [95.5, 'Best in class, Blue ribbon'],
			2: [91.5, 'Blue ribbon'],
			3: [87.5, 'Red ribbon'],
			4: [79, 'White ribbon'],
			5: [97, 'Best in show, Best in class, Blue ribbon'],
			6: [89.5, 'Red ribbon'],
			7: [82.5, 'Red ribbon'],
			8: [73, 'White ribbon'],
			9: [93.5, 'Best in class, Blue ribbon'],
			10: [91.5, 'Blue ribbon'],
			11: [84.5, 'Red ribbon'],
			12: [66, 'No award'],
			13: [94.5, 'Best trailer, Best in class, Blue ribbon'],
			14: [92, 'Blue ribbon'],
			15: [81.5, 'Red ribbon'],
			16: [null, 'Not judged']
		});
		// Sweepstakes: most blue ribbons in the division (2012 convention results, DOMAIN.md);
		// in division B two exhibitors have one blue each, and the show shares a tie.
		const [a, b] = results.divisions;
		expect(a.sweepstakes.filter((s) => s.winner).map((s) => [s.exhibitor, s.blue])).toEqual([
			['Imogen Tallis', 2]
		]);
		expect(b.sweepstakes.filter((s) => s.winner).map((s) => s.exhibitor)).toEqual([
			'Lucien Ashdown-Reyes',
			'Oksana Veretenko-Bly'
		]);
		const { comments } = results.divisions[0].classes[0].entries[0];
		expect([...comments].sort()).toEqual([
			'Crisp, even rosette; remove two spent blossoms.',
			'Good bloom count for the pot.'
		]);
	});

	it('the award sheets from the database hold the right awards', async () => {
		const results = (await loadShowResults(showId))!;
		const parser = new PDFParse({
			data: new Uint8Array(await renderAwardSheets(results, 'letter'))
		});
		const text = (await parser.getText()).text.replace(/\s+/g, ' ');
		await parser.destroy();
		expect(text).toMatch(/Best in show 2 5 \S.* Imogen Tallis 97/);
		expect(text).toMatch(/Best trailer 4 13 \S.* Lucien Ashdown-Reyes 94\.5/);
		expect(text).toMatch(/1 \S.* Wren Halloway 95\.5 Best in class, Blue ribbon/);
	});

	it('the public read now gives the results, without the judges comments', async () => {
		const found = (await loadPublicResults(slug))!;
		expect(found.results?.topAwards.map((t) => t.name)).toEqual(['Best in show', 'Best trailer']);
		expect(JSON.stringify(found.results)).not.toContain('spent blossoms');
		// Unpublishing shows at once, although the results were cached (the key is the time).
		await sequelize.query('UPDATE shows SET results_published_at = NULL WHERE id = $1', {
			bind: [showId]
		});
		expect((await loadPublicResults(slug))?.results).toBeNull();
		await sequelize.query('UPDATE shows SET results_published_at = now() WHERE id = $1', {
			bind: [showId]
		});
		expect((await loadPublicResults(slug))?.results).not.toBeNull();
	});

	it('every placements e-mail arrives once, although the mail server refused for a while', async () => {
		await refuse(9); // every message refused once, three of them twice
		await workDueJobs('mail-send');
		expect((await loadResultsMail(showId)).progress).toEqual({
			waiting: 6,
			sending: 0,
			sent: 0,
			failed: 0
		});
		for (let round = 0; round < 10; round++) {
			await makeJobsDue('mail-send');
			await workDueJobs('mail-send');
			if ((await loadResultsMail(showId)).progress.sent === 6) break;
		}
		expect((await loadResultsMail(showId)).progress).toEqual({
			waiting: 0,
			sending: 0,
			sent: 6,
			failed: 0
		});
		const [memberMail] = await resultsMailFor('member@crownbench.test');
		expect(await resultsMailFor('member@crownbench.test')).toHaveLength(1);
		expect(memberMail.text).toContain('Entry 1, class 1');
		expect(memberMail.text).toContain('Award: Best in class, Blue ribbon');
		expect(memberMail.text).toContain('Score: 95.5');
		expect(memberMail.text).toContain("Judges' comment: Good bloom count for the pot.");
		expect(memberMail.text).toContain('Entry 12, class 3');
		expect(memberMail.text).toContain(`/shows/${slug}/results`);
		for (const address of ['exhibitor1', 'exhibitor2', 'exhibitor3', 'exhibitor4', 'exhibitor6']) {
			expect(await resultsMailFor(`${address}@crownbench.test`)).toHaveLength(1);
		}
		expect(await resultsMailFor('exhibitor7@crownbench.test')).toHaveLength(0);
	});

	it('a second queueing sends nothing twice; the chair can resend one message of this show only', async () => {
		const again = await sequelize.transaction(async (transaction) => {
			const { queueResultsMail } = await import('$lib/server/results/show-results');
			return queueResultsMail(showId, { transaction, origin: 'http://127.0.0.1' });
		});
		expect(again).toBe(0);
		const { messages } = await loadResultsMail(showId);
		const member = messages.find((m) => m.to === 'member@crownbench.test')!;
		const [otherShow] = await sequelize.query<{ id: string }>(
			`SELECT id FROM shows WHERE id <> $1 LIMIT 1`,
			{ bind: [showId], type: QueryTypes.SELECT }
		);
		expect(
			await sequelize.transaction((transaction) =>
				resendResultsMail(otherShow.id, member.id, { transaction })
			)
		).toBe(false);
		expect(
			await sequelize.transaction((transaction) =>
				resendResultsMail(showId, member.id, { transaction })
			)
		).toBe(true);
		await workDueJobs('mail-send');
		expect(await resultsMailFor('member@crownbench.test')).toHaveLength(2);
	});
});
