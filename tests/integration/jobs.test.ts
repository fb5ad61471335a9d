import { QueryTypes } from 'sequelize';
import { afterAll, describe, expect, it } from 'vitest';
import { sequelize } from '$lib/server/db';
import { checkReadiness } from '$lib/server/health';
import {
	keptShowPdf,
	requestShowPdfs,
	showPdfStates,
	SHOW_DOCUMENTS
} from '$lib/server/results/documents/show-pdf';
import { REMINDER_CRON, startJobWorker, workDueJobs } from '$lib/server/jobs/worker';
import { jobsFor } from './jobs';

afterAll(async () => {
	await sequelize.close();
});

describe('the job worker', () => {
	it('keeps the reminders’ hourly schedule and a heartbeat that /readyz reads', async () => {
		await sequelize.query('DELETE FROM worker_heartbeats');
		const before = await checkReadiness();
		expect(before.ready).toBe(false);
		expect(before.checks.database.ok).toBe(true);
		expect(before.checks.migrations).toMatchObject({ ok: true });
		expect(before.checks.jobs.detail).toMatch(/no job worker seen/);

		const stop = await startJobWorker();
		try {
			const [schedule] = await sequelize.query<{ cron: string; timezone: string }>(
				`SELECT cron, timezone FROM pgboss.schedule WHERE name = 'reminders-check'`,
				{ type: QueryTypes.SELECT }
			);
			expect(schedule).toEqual({ cron: REMINDER_CRON, timezone: 'UTC' });
			const ready = await checkReadiness();
			expect(ready.ready).toBe(true);
			expect(ready.checks.jobs.detail).toBe('1 worker(s) alive');
		} finally {
			await stop();
			// Leave no schedule or reminders behind for the files after this one.
			await sequelize.query(`DELETE FROM pgboss.schedule WHERE name = 'reminders-check'`);
			await sequelize.query(`DELETE FROM pgboss.job WHERE name = 'reminders-check'`);
			await sequelize.query(`DELETE FROM outbox_messages WHERE kind = 'entry-reminder'`);
		}
		expect((await checkReadiness()).checks.jobs.ok).toBe(false);
	});

	it('says which migration is missing', async () => {
		const [last] = await sequelize.query<{ name: string }>(
			'SELECT name FROM "SequelizeMeta" ORDER BY name DESC LIMIT 1',
			{ type: QueryTypes.SELECT }
		);
		await sequelize.query('DELETE FROM "SequelizeMeta" WHERE name = $1', { bind: [last.name] });
		try {
			expect((await checkReadiness()).checks.migrations).toEqual({
				ok: false,
				detail: `1 pending (run npm run db -- migrate): ${last.name}`
			});
		} finally {
			await sequelize.query('INSERT INTO "SequelizeMeta" (name) VALUES ($1)', {
				bind: [last.name]
			});
		}
	});
});

describe('whole-show PDFs', () => {
	it('are built off the request path once per publication and paper, then served unchanged', async () => {
		const [show] = await sequelize.query<{ id: string }>(
			`SELECT id FROM shows WHERE results_published_at IS NULL ORDER BY name LIMIT 1`,
			{ type: QueryTypes.SELECT }
		);
		await sequelize.query('UPDATE shows SET results_published_at = now() WHERE id = $1', {
			bind: [show.id]
		});
		try {
			expect((await showPdfStates(show.id)).map((d) => d.status)).toEqual(
				SHOW_DOCUMENTS.map(() => 'missing')
			);
			const queued = await sequelize.transaction((transaction) =>
				requestShowPdfs(show.id, { transaction })
			);
			expect(queued).toBe(3);
			expect((await showPdfStates(show.id)).map((d) => d.status)).toEqual([
				'waiting',
				'waiting',
				'waiting'
			]);
			expect(await keptShowPdf(show.id, 'award-sheets.pdf')).toBeNull();
			expect(await workDueJobs('show-pdf')).toBeGreaterThanOrEqual(3);
			const states = await showPdfStates(show.id);
			expect(states.map((d) => d.status)).toEqual(['ready', 'ready', 'ready']);
			const first = await keptShowPdf(show.id, 'award-sheets.pdf');
			expect(first?.subarray(0, 5).toString()).toBe('%PDF-');
			expect(first!.length).toBe(states[0].bytes);

			// Asked again: nothing is queued, the kept file is served as it was.
			expect(
				await sequelize.transaction((transaction) => requestShowPdfs(show.id, { transaction }))
			).toBe(0);
			expect((await keptShowPdf(show.id, 'award-sheets.pdf'))!.equals(first!)).toBe(true);
			const [pdfRow] = await sequelize.query<{ id: string }>(
				`SELECT id FROM show_pdfs WHERE show_id = $1 AND document = 'award-sheets.pdf'`,
				{ bind: [show.id], type: QueryTypes.SELECT }
			);
			expect((await jobsFor('show-pdf', 'pdfId', pdfRow.id)).map((j) => j.state)).toEqual([
				'completed'
			]);

			// A new publication (results withdrawn and published again) gets documents of its own.
			await sequelize.query('UPDATE shows SET results_published_at = now() WHERE id = $1', {
				bind: [show.id]
			});
			expect((await showPdfStates(show.id)).map((d) => d.status)).toEqual([
				'missing',
				'missing',
				'missing'
			]);
			expect(await keptShowPdf(show.id, 'award-sheets.pdf')).toBeNull();
		} finally {
			await sequelize.query('DELETE FROM show_pdfs WHERE show_id = $1', { bind: [show.id] });
			await sequelize.query('UPDATE shows SET results_published_at = NULL WHERE id = $1', {
				bind: [show.id]
			});
		}
	});
});
