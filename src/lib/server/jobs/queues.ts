/**
 * The job queues and what each job carries, checked with zod when it is queued and again when a
 * worker takes it: a malformed job is refused with its reason (and, taken, fails for good with
 * that reason kept), never run on guesses. The queues themselves are made by the migration
 * 20261215400100-create-job-queue.cjs.
 */
import { z } from 'zod';

const id = z.uuid({ error: 'expects an id (a UUID)' });
const societyId = id.nullable();

export const JOB_PAYLOADS = {
	/** One message of the mail outbox (outbox_messages.id). */
	'mail-send': z.strictObject({ messageId: id, societyId }),
	/** One requested refund (refunds.id), sent with its idempotency key. */
	'refund-send': z.strictObject({ refundId: id, societyId }),
	/** The hourly look for shows whose entries close soon (queues the reminders). */
	'reminders-check': z.strictObject({}),
	/** A whole-show PDF (show_pdfs.id) to build. */
	'show-pdf': z.strictObject({ pdfId: id, societyId })
} as const;

export type JobName = keyof typeof JOB_PAYLOADS;
export type JobPayload<N extends JobName> = z.infer<(typeof JOB_PAYLOADS)[N]>;

export const JOB_NAMES = Object.keys(JOB_PAYLOADS) as JobName[];

/** Plain words for each kind of job, for the society admin's list. */
export const JOB_LABELS: Record<JobName, string> = {
	'mail-send': 'E-mail',
	'refund-send': 'Refund',
	'reminders-check': 'Entry reminders',
	'show-pdf': 'Show PDF'
};

/** A job's data that does not fit its queue: the reason, in plain words. */
export class BadJobPayload extends Error {
	constructor(name: string, reason: string) {
		super(`A "${name}" job ${reason}`);
		this.name = 'BadJobPayload';
	}
}

/** Checks a job's data against its queue's schema; throws BadJobPayload with the reason. */
export function checkJobPayload<N extends JobName>(name: N, data: unknown): JobPayload<N> {
	const schema = JOB_PAYLOADS[name] as unknown as z.ZodType<JobPayload<N>> | undefined;
	if (!schema) throw new BadJobPayload(String(name), 'has no queue of that name.');
	const parsed = schema.safeParse(data);
	if (!parsed.success) {
		const reasons = parsed.error.issues.map((i) =>
			i.path.length > 0 ? `${i.path.join('.')} ${i.message}` : i.message
		);
		throw new BadJobPayload(name, `is malformed: ${reasons.join('; ')}.`);
	}
	return parsed.data;
}
