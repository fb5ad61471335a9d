import { isStandInAddress } from './stand-in';
import { QueryTypes, type Transaction } from 'sequelize';
import { retryDelaySeconds } from '../../domain/backoff';
import { sequelize } from '../db';
import { sendMail, type OutgoingMail } from './transport';

/** A message to put in the outbox. */
export interface QueuedMail {
	kind: string;
	to: string;
	subject: string;
	text: string;
	html?: string;
	societyId?: string | null;
	showId?: string | null;
	recipientId?: string | null;
	/** Same key, same message: a second queueing with this key is ignored. */
	dedupeKey?: string | null;
}

/** Delivery counts of a set of outbox messages. */
export interface MailProgress {
	waiting: number;
	sending: number;
	sent: number;
	failed: number;
}

/** How often a message is tried before it is marked failed. */
export const MAX_ATTEMPTS = Number(process.env.CB_OUTBOX_MAX_ATTEMPTS ?? 8);

function baseDelaySeconds(): number {
	return Number(process.env.CB_OUTBOX_BASE_DELAY_SECONDS ?? 5);
}

/**
 * Writes messages to the outbox inside the caller's transaction, so they exist exactly when the
 * change that caused them is committed. Returns how many were new (dedupe keys already present
 * are skipped).
 */
export async function queueMail(
	messages: QueuedMail[],
	options: { transaction: Transaction }
): Promise<number> {
	let inserted = 0;
	const chunk = 500;
	// A walk-in exhibitor who left no address has a stand-in that must never be mailed.
	const deliverable = messages.filter((m) => !isStandInAddress(m.to));
	for (let i = 0; i < deliverable.length; i += chunk) {
		const part = deliverable.slice(i, i + chunk);
		const values: string[] = [];
		const bind: unknown[] = [];
		for (const m of part) {
			const n = bind.length;
			values.push(`(${Array.from({ length: 9 }, (_, k) => `$${n + k + 1}`).join(', ')})`);
			bind.push(
				m.kind,
				m.societyId ?? null,
				m.showId ?? null,
				m.recipientId ?? null,
				m.to,
				m.subject,
				m.text,
				m.html ?? null,
				m.dedupeKey ?? null
			);
		}
		const rows = await sequelize.query(
			`INSERT INTO outbox_messages
			   (kind, society_id, show_id, recipient_id, to_address, subject, text_body, html_body, dedupe_key)
			 VALUES ${values.join(', ')}
			 ON CONFLICT (dedupe_key) DO NOTHING
			 RETURNING id`,
			{ bind, type: QueryTypes.SELECT, transaction: options.transaction }
		);
		inserted += rows.length;
	}
	return inserted;
}

interface ClaimedRow {
	id: string;
	to_address: string;
	subject: string;
	text_body: string;
	html_body: string | null;
	attempts: number;
}

/**
 * Sends the messages that are due, at most `limit`, and records each outcome. Rows are claimed
 * with FOR UPDATE SKIP LOCKED and a lease, so several workers (or app instances) never take the
 * same message; a failed send waits with exponential back-off and is marked failed after
 * MAX_ATTEMPTS tries.
 */
export async function deliverDueMail(
	options: {
		limit?: number;
		send?: (mail: OutgoingMail & { messageId: string }) => Promise<unknown>;
	} = {}
): Promise<{ sent: number; retried: number; failed: number }> {
	const limit = options.limit ?? 20;
	const send = options.send ?? ((mail: OutgoingMail & { messageId: string }) => sendMail(mail));
	const claimed = await sequelize.query<ClaimedRow>(
		`UPDATE outbox_messages
		    SET status = 'sending', attempts = attempts + 1, locked_until = now() + interval '2 minutes'
		  WHERE id IN (
		        SELECT id FROM outbox_messages
		         WHERE (status = 'waiting' AND next_attempt_at <= now())
		            OR (status = 'sending' AND locked_until < now())
		         ORDER BY next_attempt_at, created_at
		         LIMIT $1
		           FOR UPDATE SKIP LOCKED)
		RETURNING id, to_address, subject, text_body, html_body, attempts`,
		{ bind: [limit], type: QueryTypes.SELECT }
	);
	const result = { sent: 0, retried: 0, failed: 0 };
	for (const row of claimed) {
		try {
			await send({
				to: row.to_address,
				subject: row.subject,
				text: row.text_body,
				html: row.html_body ?? undefined,
				messageId: `<${row.id}@crownbench.outbox>`
			});
			await sequelize.query(
				`UPDATE outbox_messages SET status = 'sent', sent_at = now(), locked_until = NULL, last_error = NULL
				  WHERE id = $1`,
				{ bind: [row.id] }
			);
			result.sent++;
		} catch (error) {
			const message = error instanceof Error ? error.message : String(error);
			const giveUp = row.attempts >= MAX_ATTEMPTS;
			await sequelize.query(
				`UPDATE outbox_messages
				    SET status = $2, last_error = $3, locked_until = NULL,
				        next_attempt_at = now() + make_interval(secs => $4)
				  WHERE id = $1`,
				{
					bind: [
						row.id,
						giveUp ? 'failed' : 'waiting',
						message.slice(0, 1000),
						retryDelaySeconds(row.attempts, baseDelaySeconds())
					]
				}
			);
			if (giveUp) result.failed++;
			else result.retried++;
		}
	}
	return result;
}

/** Delivery counts of a show's messages (optionally of one kind), for the chair's progress bar. */
export async function mailProgress(showId: string, kind?: string): Promise<MailProgress> {
	const rows = await sequelize.query<{ status: keyof MailProgress; n: string }>(
		`SELECT status, count(*) AS n FROM outbox_messages
		  WHERE show_id = $1 AND ($2::text IS NULL OR kind = $2)
		  GROUP BY status`,
		{ bind: [showId, kind ?? null], type: QueryTypes.SELECT }
	);
	const progress: MailProgress = { waiting: 0, sending: 0, sent: 0, failed: 0 };
	for (const r of rows) progress[r.status] = Number(r.n);
	return progress;
}

/** Puts one message back in line to be sent again now (the chair's "send again"). */
export async function resendMail(
	id: string,
	options: { transaction: Transaction }
): Promise<boolean> {
	const rows = await sequelize.query(
		`UPDATE outbox_messages
		    SET status = 'waiting', attempts = 0, next_attempt_at = now(), last_error = NULL, locked_until = NULL
		  WHERE id = $1 AND status <> 'sending'
		RETURNING id`,
		{ bind: [id], type: QueryTypes.SELECT, transaction: options.transaction }
	);
	return rows.length > 0;
}

/**
 * Runs deliverDueMail every `intervalMs` until stopped; rounds never overlap. Errors (a database
 * restart, say) are logged and the loop goes on.
 */
export function startOutboxWorker(
	intervalMs = Number(process.env.CB_OUTBOX_INTERVAL_MS ?? 2000)
): () => void {
	let stopped = false;
	let timer: NodeJS.Timeout | undefined;
	const round = async (): Promise<void> => {
		try {
			let batch;
			do {
				batch = await deliverDueMail();
			} while (!stopped && batch.sent + batch.retried + batch.failed > 0 && batch.sent > 0);
		} catch (error) {
			console.error('outbox worker:', error instanceof Error ? error.message : error);
		}
		if (!stopped) timer = setTimeout(() => void round(), intervalMs);
	};
	timer = setTimeout(() => void round(), 0);
	return () => {
		stopped = true;
		if (timer) clearTimeout(timer);
	};
}
