/**
 * The job worker: works every queue, keeps pg-boss's maintenance and the reminders' schedule, and
 * writes a heartbeat that /readyz reads. Run in the app process (unless CB_WORKER=off) or on its
 * own (`npm run worker`); any number of workers may run on one database: pg-boss hands each job
 * to one of them at a time, and each job's effect checks its row first (once only).
 */
import os from 'node:os';
import type PgBoss from 'pg-boss';
import { todayIn } from '../../domain/dates';
import { config } from '../config';
import { sequelize } from '../db';
import { errorFields, logger } from '../log';
import { deliverMessage } from '../mail/outbox';
import { sendRefund } from '../payments/refunds';
import { queueDueReminders } from '../plants/reminders';
import { forgetJobBoss, JOB_SCHEMA, jobBoss } from './boss';
import { BadJobPayload, checkJobPayload, type JobName } from './queues';
import { buildShowPdfJob } from '../results/documents/show-pdf';

/** The reminders' schedule: minute 7 of every hour (cron, UTC); one job per slot for all workers. */
export const REMINDER_CRON = '7 * * * *';

/** A worker counts as alive for /readyz while its heartbeat is younger than this. */
export const HEARTBEAT_FRESH_SECONDS = 60;
const HEARTBEAT_EVERY_MS = 15_000;

type Job = PgBoss.JobWithMetadata<unknown>;

/** One job's effect; `lastAttempt` when the queue will not try it again after a failure. */
type Effect = (job: Job, lastAttempt: boolean) => Promise<string>;

const EFFECTS: Record<JobName, Effect> = {
	'mail-send': async (job, lastAttempt) =>
		deliverMessage(checkJobPayload('mail-send', job.data).messageId, { lastAttempt }),
	'refund-send': async (job) => sendRefund(checkJobPayload('refund-send', job.data).refundId),
	'reminders-check': async (job) => {
		checkJobPayload('reminders-check', job.data);
		const queued = await queueDueReminders((zone) => todayIn(zone));
		return `queued ${queued} reminder(s)`;
	},
	'show-pdf': async (job, lastAttempt) =>
		buildShowPdfJob(checkJobPayload('show-pdf', job.data).pdfId, { lastAttempt })
};

/** How many jobs of each queue one fetch takes (each is settled on its own). */
const BATCH: Record<JobName, number> = {
	'mail-send': 25,
	'refund-send': 10,
	'reminders-check': 1,
	'show-pdf': 1
};

/**
 * Fails a job for good (no more tries), its reason kept as its output: a malformed job would fail
 * the same way every time.
 */
async function failForGood(name: string, id: string, error: Error): Promise<void> {
	await sequelize.query(
		`UPDATE ${JOB_SCHEMA}.job
		    SET state = 'failed', completed_on = now(), output = CAST(:output AS jsonb)
		  WHERE name = :name AND id = :id AND state = 'active'`,
		{
			replacements: {
				name,
				id,
				output: JSON.stringify({ name: error.name, message: error.message })
			}
		}
	);
}

/**
 * Runs one fetched batch: each job settled on its own (a failure goes back to the queue for its
 * next try with back-off, or stays failed with its error); pg-boss completes the rest.
 */
export async function runJobs(boss: PgBoss, name: JobName, jobs: Job[]): Promise<void> {
	for (const job of jobs) {
		const lastAttempt = job.retryCount >= job.retryLimit;
		const started = performance.now();
		try {
			const outcome = await EFFECTS[name](job, lastAttempt);
			logger().info({
				msg: 'job',
				queue: name,
				jobId: job.id,
				outcome,
				ms: performance.now() - started
			});
		} catch (error) {
			const failure = error instanceof Error ? error : new Error(String(error));
			if (failure instanceof BadJobPayload) await failForGood(name, job.id, failure);
			else await boss.fail(name, job.id, { name: failure.name, message: failure.message });
			logger().warn({
				msg: 'job failed',
				queue: name,
				jobId: job.id,
				attempt: job.retryCount + 1,
				forGood: lastAttempt || failure instanceof BadJobPayload,
				error: errorFields(failure).message
			});
		}
	}
}

async function beat(id: string): Promise<void> {
	await sequelize.query(
		`INSERT INTO worker_heartbeats (id) VALUES (:id)
		 ON CONFLICT (id) DO UPDATE SET seen_at = now()`,
		{ replacements: { id } }
	);
}

/**
 * Starts pg-boss (maintenance, schedule) and a worker on every queue; returns the stop function
 * (waits for the jobs in hand, then removes the heartbeat).
 */
export async function startJobWorker(): Promise<() => Promise<void>> {
	const c = config();
	const boss = jobBoss();
	boss.on('error', (error) => logger().error({ msg: 'job queue error', ...errorFields(error) }));
	try {
		await boss.start();
	} catch (error) {
		forgetJobBoss();
		throw error;
	}
	for (const name of Object.keys(EFFECTS) as JobName[]) {
		await boss.work(
			name,
			{ includeMetadata: true, batchSize: BATCH[name], pollingIntervalSeconds: c.jobsPollSeconds },
			(jobs) => runJobs(boss, name, jobs)
		);
	}
	if (c.reminders) await boss.schedule('reminders-check', REMINDER_CRON, {}, { tz: 'UTC' });
	else await boss.unschedule('reminders-check');
	const id = `${os.hostname()}:${process.pid}:${crypto.randomUUID().slice(0, 8)}`;
	await beat(id);
	const timer = setInterval(() => {
		beat(id).catch((error: unknown) =>
			logger().warn({ msg: 'worker heartbeat failed', error: errorFields(error).message })
		);
	}, HEARTBEAT_EVERY_MS);
	timer.unref();
	logger().info({ msg: 'job worker started', worker: id, reminders: c.reminders });
	return async () => {
		clearInterval(timer);
		await boss.stop({ graceful: true, timeout: 10_000, close: false });
		await sequelize
			.query('DELETE FROM worker_heartbeats WHERE id = :id', { replacements: { id } })
			.catch(() => undefined);
	};
}

/** How many workers wrote a heartbeat lately (for /readyz). */
export async function liveWorkers(): Promise<number> {
	const [row] = await sequelize.query<{ n: string }>(
		`SELECT count(*) AS n FROM worker_heartbeats WHERE seen_at > now() - make_interval(secs => :freshSeconds)`,
		{ replacements: { freshSeconds: HEARTBEAT_FRESH_SECONDS }, type: 'SELECT' as never }
	);
	return Number(row?.n ?? 0);
}

/**
 * Works the queue's jobs that are due now in this process, batch after batch, until none is left
 * or `max` were taken; returns how many were taken. For tests and one-off runs: the worker does
 * the same on its own.
 */
export async function workDueJobs(name: JobName, max = 1000): Promise<number> {
	const boss = jobBoss();
	let taken = 0;
	while (taken < max) {
		const jobs = await boss.fetch(name, {
			batchSize: Math.min(BATCH[name] * 2, max - taken),
			includeMetadata: true
		});
		if (jobs.length === 0) break;
		await runJobs(boss, name, jobs);
		await boss.complete(
			name,
			jobs.map((job) => job.id)
		);
		taken += jobs.length;
	}
	return taken;
}
