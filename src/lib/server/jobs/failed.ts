/**
 * Jobs that failed for good, for the society admin: what it was, when, how often it was tried and
 * the last error; "try again" puts it back in line (and its row, for mail and documents).
 * Jobs stay in pg-boss's table a year before its archive (see boss.ts); the rows they work on
 * keep their error besides.
 */
import { QueryTypes, type Transaction } from 'sequelize';
import { sequelize } from '../db';
import { JOB_SCHEMA, jobBoss, transactionDb } from './boss';
import { JOB_LABELS, JOB_NAMES, type JobName } from './queues';

/** One failed job as the admin sees it (no recipient address: a member's name at most). */
export interface FailedJob {
	id: string;
	queue: JobName;
	label: string;
	/** What it was about, in plain words: the e-mail's subject, the refund's amount, the document. */
	about: string;
	attempts: number;
	error: string;
	failedAt: string;
}

interface FailedRow {
	id: string;
	name: JobName;
	retry_count: number;
	output: { message?: string; value?: { message?: string } } | null;
	completed_on: Date;
	subject: string | null;
	outbox_status: string | null;
	refund_cents: number | null;
	refund_status: string | null;
	document: string | null;
	pdf_status: string | null;
}

function errorOf(output: FailedRow['output']): string {
	return output?.message ?? output?.value?.message ?? 'No error was recorded.';
}

function aboutOf(row: FailedRow): string {
	if (row.name === 'mail-send') return row.subject ?? 'An e-mail no longer in the outbox';
	if (row.name === 'refund-send') {
		return row.refund_cents === null
			? 'A refund no longer on record'
			: `A refund of ${(row.refund_cents / 100).toFixed(2)}`;
	}
	if (row.name === 'show-pdf') return row.document ?? 'A document no longer kept';
	return JOB_LABELS[row.name];
}

/**
 * The society's failed jobs, newest first (at most 200). A failed job whose work was done since
 * (the e-mail sent again by the chair, the document built again) is left out.
 */
export async function listFailedJobs(societyId: string): Promise<FailedJob[]> {
	const rows = await sequelize.query<FailedRow>(
		`SELECT j.id, j.name, j.retry_count, j.output, j.completed_on,
		        o.subject, o.status AS outbox_status, r.amount_cents AS refund_cents,
		        r.status AS refund_status, p.document, p.status AS pdf_status
		   FROM ${JOB_SCHEMA}.job j
		   LEFT JOIN outbox_messages o ON j.name = 'mail-send' AND o.id::text = j.data->>'messageId'
		   LEFT JOIN refunds r ON j.name = 'refund-send' AND r.id::text = j.data->>'refundId'
		   LEFT JOIN show_pdfs p ON j.name = 'show-pdf' AND p.id::text = j.data->>'pdfId'
		  WHERE j.state = 'failed' AND j.name IN (:jobNames) AND j.data->>'societyId' = :societyId
		    AND (o.status IS NULL OR o.status = 'failed')
		    AND (r.status IS NULL OR r.status = 'requested')
		    AND (p.status IS NULL OR p.status = 'failed')
		  ORDER BY j.completed_on DESC
		  LIMIT 200`,
		{ replacements: { societyId, jobNames: JOB_NAMES }, type: QueryTypes.SELECT }
	);
	return rows.map((row) => ({
		id: row.id,
		queue: row.name,
		label: JOB_LABELS[row.name],
		about: aboutOf(row),
		attempts: row.retry_count + 1,
		error: errorOf(row.output),
		failedAt: row.completed_on.toISOString()
	}));
}

/**
 * Puts one of the society's failed jobs back in line, in the caller's transaction: the job (its
 * gets one more try) and the row it works on. False when there is no such failed job.
 */
export async function retryFailedJob(
	societyId: string,
	jobId: string,
	options: { transaction: Transaction }
): Promise<boolean> {
	const { transaction } = options;
	const [job] = await sequelize.query<{ name: JobName; data: Record<string, string> }>(
		`SELECT name, data FROM ${JOB_SCHEMA}.job
		  WHERE id = :jobId AND state = 'failed' AND data->>'societyId' = :societyId
		  FOR UPDATE`,
		{ replacements: { jobId, societyId }, type: QueryTypes.SELECT, transaction }
	);
	if (!job) return false;
	if (job.name === 'mail-send') {
		await sequelize.query(
			`UPDATE outbox_messages SET status = 'waiting', attempts = 0, last_error = NULL, locked_until = NULL
			  WHERE id = :messageId AND status = 'failed'`,
			{ replacements: { messageId: job.data.messageId ?? null }, transaction }
		);
	} else if (job.name === 'show-pdf') {
		await sequelize.query(
			`UPDATE show_pdfs SET status = 'waiting', last_error = NULL WHERE id = :pdfId AND status = 'failed'`,
			{ replacements: { pdfId: job.data.pdfId ?? null }, transaction }
		);
	}
	// pg-boss's retry gives the job one more try.
	await jobBoss().retry(job.name, jobId, { db: transactionDb(transaction) });
	return true;
}
