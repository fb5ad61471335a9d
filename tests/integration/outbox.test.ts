import { afterAll, beforeEach, describe, expect, it } from 'vitest';
import { QueryTypes } from 'sequelize';
import { sequelize } from '$lib/server/db';
import { config } from '$lib/server/config';
import { workDueJobs } from '$lib/server/jobs/worker';
import { enqueue } from '$lib/server/jobs/enqueue';
import { BadJobPayload } from '$lib/server/jobs/queues';
import { listFailedJobs, retryFailedJob } from '$lib/server/jobs/failed';
import { mailProgress, queueMail, resendMail } from '$lib/server/mail/outbox';
import { mailFor } from '../e2e/support/mail';
import { jobsFor, makeJobsDue, workAllJobs } from './jobs';

const MAX_ATTEMPTS = config().outboxMaxAttempts;

const fake = process.env.CB_DEV_MAIL_URL ?? 'http://127.0.0.1:2536';
const run = `${Date.now()}`;

async function refuse(count: number | 'off'): Promise<void> {
	const query = count === 'off' ? 'until=off' : `count=${count}`;
	const response = await fetch(`${fake}/refuse?${query}`, { method: 'POST' });
	expect(response.ok).toBe(true);
}

async function rows(kind: string) {
	return sequelize.query<{ id: string; status: string; attempts: number }>(
		'SELECT id, status, attempts FROM outbox_messages WHERE kind = $1 ORDER BY to_address',
		{ bind: [kind], type: QueryTypes.SELECT }
	);
}

async function deliverAll(): Promise<void> {
	await workAllJobs('mail-send');
}

const mail = (kind: string, to: string, dedupeKey?: string) => ({
	kind,
	to,
	subject: `Test ${kind}`,
	text: `Hello ${to}`,
	dedupeKey
});

beforeEach(async () => {
	await refuse('off');
});

afterAll(async () => {
	await refuse('off');
	await sequelize.close();
});

describe('mail outbox', () => {
	it('writes nothing, and queues no job, when the transaction that queued it rolls back', async () => {
		const kind = `rollback-${run}`;
		let messageId = '';
		await expect(
			sequelize.transaction(async (transaction) => {
				await queueMail([mail(kind, `a-${run}@crownbench.test`)], { transaction });
				[{ id: messageId }] = await sequelize.query<{ id: string }>(
					'SELECT id FROM outbox_messages WHERE kind = $1',
					{ bind: [kind], type: QueryTypes.SELECT, transaction }
				);
				// Not yet committed: no other connection (no worker) sees the job.
				expect(await jobsFor('mail-send', 'messageId', messageId)).toHaveLength(0);
				throw new Error('publishing failed half-way');
			})
		).rejects.toThrow('publishing failed');
		expect(await rows(kind)).toEqual([]);
		expect(await jobsFor('mail-send', 'messageId', messageId)).toEqual([]);
	});

	it('queues one mail-send job per new message, in the same transaction', async () => {
		const kind = `job-${run}`;
		await sequelize.transaction(async (transaction) => {
			await queueMail([mail(kind, `j-${run}@crownbench.test`)], { transaction });
		});
		const [row] = await rows(kind);
		const jobs = await jobsFor('mail-send', 'messageId', row.id);
		expect(jobs.map((j) => j.state)).toEqual(['created']);
		await deliverAll();
		expect((await jobsFor('mail-send', 'messageId', row.id)).map((j) => j.state)).toEqual([
			'completed'
		]);
	});

	it('queues a message once per dedupe key', async () => {
		const kind = `dedupe-${run}`;
		const first = await sequelize.transaction((transaction) =>
			queueMail([mail(kind, `b-${run}@crownbench.test`, `k-${run}`)], { transaction })
		);
		const second = await sequelize.transaction((transaction) =>
			queueMail([mail(kind, `b-${run}@crownbench.test`, `k-${run}`)], { transaction })
		);
		expect([first, second]).toEqual([1, 0]);
		expect(await rows(kind)).toHaveLength(1);
	});

	it('survives an SMTP server that refuses mail for a while: every message arrives once', async () => {
		const kind = `outage-${run}`;
		const addresses = Array.from({ length: 6 }, (_, i) => `outage${i}-${run}@crownbench.test`);
		await sequelize.transaction((transaction) =>
			queueMail(
				addresses.map((a) => mail(kind, a)),
				{ transaction }
			)
		);
		await refuse(9); // every message refused once, three of them twice
		await workDueJobs('mail-send');
		const afterFirstRound = await rows(kind);
		expect(afterFirstRound.map((r) => [r.status, r.attempts])).toEqual(
			Array(6).fill(['waiting', 1])
		);
		// Each job waits out its back-off before its next try.
		expect(await workDueJobs('mail-send')).toBe(0);
		await deliverAll();

		const final = await rows(kind);
		expect(final.map((r) => r.status)).toEqual(Array(6).fill('sent'));
		for (const address of addresses) {
			expect(await mailFor(address)).toHaveLength(1);
		}
	});

	it('two workers at once never send the same message twice', async () => {
		const kind = `parallel-${run}`;
		const addresses = Array.from({ length: 30 }, (_, i) => `par${i}-${run}@crownbench.test`);
		await sequelize.transaction((transaction) =>
			queueMail(
				addresses.map((a) => mail(kind, a)),
				{ transaction }
			)
		);
		await Promise.all([
			workDueJobs('mail-send'),
			workDueJobs('mail-send'),
			workDueJobs('mail-send')
		]);
		await deliverAll();
		for (const address of addresses) {
			expect(await mailFor(address)).toHaveLength(1);
		}
	});

	it('runs a job twice, sends once: a message already sent is not sent again', async () => {
		const kind = `twice-${run}`;
		const address = `twice-${run}@crownbench.test`;
		await sequelize.transaction((transaction) => queueMail([mail(kind, address)], { transaction }));
		const [row] = await rows(kind);
		await deliverAll();
		// A second job for the same message (a lost answer, a worker that died after sending).
		await sequelize.transaction((transaction) =>
			enqueue('mail-send', { messageId: row.id, societyId: null }, { transaction })
		);
		await deliverAll();
		expect(await mailFor(address)).toHaveLength(1);
		expect((await rows(kind))[0]).toMatchObject({ status: 'sent', attempts: 1 });
	});

	it('marks a message failed after its last try, and sends it when asked again', async () => {
		const kind = `failing-${run}`;
		const address = `fail-${run}@crownbench.test`;
		await sequelize.transaction((transaction) => queueMail([mail(kind, address)], { transaction }));
		await refuse(MAX_ATTEMPTS);
		await deliverAll();
		const [row] = await rows(kind);
		expect(row.status).toBe('failed');
		expect(row.attempts).toBe(MAX_ATTEMPTS);
		expect(await mailFor(address)).toHaveLength(0);
		// The job failed for good is kept, with the mail server's refusal as its error.
		const [job] = await jobsFor('mail-send', 'messageId', row.id);
		expect(job.state).toBe('failed');
		expect(job.retry_count).toBe(MAX_ATTEMPTS - 1);

		await refuse('off');
		expect(await sequelize.transaction((transaction) => resendMail(row.id, { transaction }))).toBe(
			true
		);
		await deliverAll();
		expect((await rows(kind))[0].status).toBe('sent');
		expect(await mailFor(address)).toHaveLength(1);
	});

	it('counts progress per show', async () => {
		const [show] = await sequelize.query<{ id: string }>('SELECT id FROM shows LIMIT 1', {
			type: QueryTypes.SELECT
		});
		const kind = `progress-${run}`;
		await sequelize.transaction((transaction) =>
			queueMail(
				[
					{ ...mail(kind, `p1-${run}@crownbench.test`), showId: show.id },
					{ ...mail(kind, `p2-${run}@crownbench.test`), showId: show.id }
				],
				{ transaction }
			)
		);
		expect(await mailProgress(show.id, kind)).toEqual({
			waiting: 2,
			sending: 0,
			sent: 0,
			failed: 0
		});
		await deliverAll();
		expect(await mailProgress(show.id, kind)).toEqual({
			waiting: 0,
			sending: 0,
			sent: 2,
			failed: 0
		});
	});

	it('lists a failed e-mail for its society admin, and tries it again when asked', async () => {
		const [society] = await sequelize.query<{ id: string }>('SELECT id FROM societies LIMIT 1', {
			type: QueryTypes.SELECT
		});
		const kind = `admin-retry-${run}`;
		const address = `admin-retry-${run}@crownbench.test`;
		await sequelize.transaction((transaction) =>
			queueMail([{ ...mail(kind, address), societyId: society.id }], { transaction })
		);
		await refuse(MAX_ATTEMPTS);
		await deliverAll();
		const [row] = await rows(kind);
		const failed = (await listFailedJobs(society.id)).find((j) => j.about === `Test ${kind}`);
		expect(failed).toMatchObject({ queue: 'mail-send', label: 'E-mail', attempts: MAX_ATTEMPTS });
		expect(failed!.error).toMatch(/refus|4\d\d|5\d\d/i);
		// Another society's admin neither sees it nor can try it again.
		expect(
			await sequelize.transaction((transaction) =>
				retryFailedJob('00000000-0000-4000-8000-000000000000', failed!.id, { transaction })
			)
		).toBe(false);
		await refuse('off');
		expect(
			await sequelize.transaction((transaction) =>
				retryFailedJob(society.id, failed!.id, { transaction })
			)
		).toBe(true);
		await deliverAll();
		expect((await rows(kind))[0].status).toBe('sent');
		expect(await mailFor(address)).toHaveLength(1);
		expect((await listFailedJobs(society.id)).some((j) => j.id === failed!.id)).toBe(false);
		expect(row.status).toBe('failed');
	});

	it('refuses a malformed job payload with its reason, and fails such a job for good, kept', async () => {
		await expect(
			sequelize.transaction((transaction) =>
				enqueue('mail-send', { messageId: 'not-an-id', societyId: null }, { transaction })
			)
		).rejects.toThrow(/"mail-send" job is malformed: messageId expects an id/);
		await expect(
			sequelize.transaction((transaction) =>
				enqueue(
					'mail-send',
					{ messageId: '00000000-0000-4000-8000-000000000000', extra: 1 } as never,
					{ transaction }
				)
			)
		).rejects.toThrow(BadJobPayload);
		// A job written past the check (by hand, by an older version) fails once, for good.
		const [{ id }] = await sequelize.query<{ id: string }>(
			`INSERT INTO pgboss.job (name, data, retry_limit) VALUES ('mail-send', '{"messageId": 7}', 5)
			 RETURNING id`,
			{ type: QueryTypes.SELECT }
		);
		await makeJobsDue('mail-send');
		await workDueJobs('mail-send');
		const [bad] = await sequelize.query<{
			state: string;
			retry_count: number;
			output: { message: string };
		}>('SELECT state, retry_count, output FROM pgboss.job WHERE id = $1', {
			bind: [id],
			type: QueryTypes.SELECT
		});
		expect(bad.state).toBe('failed');
		expect(bad.retry_count).toBe(0);
		expect(bad.output.message).toMatch(/messageId expects an id/);
	});
});
