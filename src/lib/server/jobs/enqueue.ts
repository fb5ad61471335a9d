import type { Transaction } from 'sequelize';
import { jobBoss, transactionDb } from './boss';
import { checkJobPayload, type JobName, type JobPayload } from './queues';

/** Per-job options: the transaction of the change, and retries (else the queue's own). */
export interface EnqueueOptions {
	transaction: Transaction;
	retryLimit?: number;
	retryDelay?: number;
}

/** The job's own retries where given (else its queue's), always with back-off. */
function retries(options: EnqueueOptions) {
	return {
		retryBackoff: true,
		...(options.retryLimit === undefined ? {} : { retryLimit: options.retryLimit }),
		...(options.retryDelay === undefined ? {} : { retryDelay: options.retryDelay })
	};
}

/**
 * Queues one job inside the caller's transaction: it exists exactly when the change that caused
 * it is committed. Its data is checked first (BadJobPayload). Returns the job id. The effect
 * happens once however often a job runs: each handler checks the row it works on first.
 */
export async function enqueue<N extends JobName>(
	name: N,
	data: JobPayload<N>,
	options: EnqueueOptions
): Promise<string | null> {
	const checked = checkJobPayload(name, data);
	return jobBoss().send(name, checked, {
		db: transactionDb(options.transaction),
		...retries(options)
	});
}

/** Queues many jobs of one queue in one statement, inside the caller's transaction. */
export async function enqueueMany<N extends JobName>(
	name: N,
	jobs: JobPayload<N>[],
	options: EnqueueOptions
): Promise<void> {
	if (jobs.length === 0) return;
	const rows = jobs.map((job) => ({
		name,
		data: checkJobPayload(name, job),
		...retries(options)
	}));
	await jobBoss().insert(rows, { db: transactionDb(options.transaction) });
}
