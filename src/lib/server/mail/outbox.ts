import { isStandInAddress } from './stand-in';
import { QueryTypes, type Transaction } from 'sequelize';
import { config } from '../config';
import { sequelize } from '../db';
import { enqueue, enqueueMany } from '../jobs/enqueue';
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

/**
 * Writes messages to the outbox inside the caller's transaction, with one `mail-send` job each,
 * so they exist exactly when the change that caused them is committed. Returns how many were new
 * (dedupe keys already present are skipped, and get no job).
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
		const replacements: Record<string, unknown> = {};
		for (const [k, m] of part.entries()) {
			const columns = Object.entries({
				kind: m.kind,
				societyId: m.societyId ?? null,
				showId: m.showId ?? null,
				recipientId: m.recipientId ?? null,
				to: m.to,
				subject: m.subject,
				text: m.text,
				html: m.html ?? null,
				dedupeKey: m.dedupeKey ?? null
			});
			values.push(`(${columns.map(([name]) => `:${name}${k}`).join(', ')})`);
			for (const [name, value] of columns) replacements[`${name}${k}`] = value;
		}
		const rows = await sequelize.query(
			`INSERT INTO outbox_messages
			   (kind, society_id, show_id, recipient_id, to_address, subject, text_body, html_body, dedupe_key)
			 VALUES ${values.join(', ')}
			 ON CONFLICT (dedupe_key) DO NOTHING
			 RETURNING id, society_id`,
			{ replacements, type: QueryTypes.SELECT, transaction: options.transaction }
		);
		await enqueueMany(
			'mail-send',
			(rows as { id: string; society_id: string | null }[]).map((r) => ({
				messageId: r.id,
				societyId: r.society_id
			})),
			mailRetries(options.transaction)
		);
		inserted += rows.length;
	}
	return inserted;
}

/** The mail job's retries: CB_OUTBOX_MAX_ATTEMPTS tries in all, the first after `base` s. */
function mailRetries(transaction: Transaction) {
	const c = config();
	return {
		transaction,
		retryLimit: c.outboxMaxAttempts - 1,
		retryDelay: c.outboxBaseDelaySeconds
	};
}

interface ClaimedRow {
	id: string;
	to_address: string;
	subject: string;
	text_body: string;
	html_body: string | null;
}

/** What became of one message when its job ran. */
export type DeliveryOutcome = 'sent' | 'not-due' | 'retry' | 'failed';

/**
 * Sends one outbox message: the `mail-send` job's effect. The row is claimed first (waiting, or
 * sending with its lease run out), so a message already sent, or being sent by another worker,
 * is not sent again; the Message-ID is the row's, so a receiver can tell a repeat after a lost
 * answer. A failed send is recorded on the row and thrown, for the queue to try again with
 * back-off; on the `lastAttempt` the row is marked failed.
 */
export async function deliverMessage(
	messageId: string,
	options: {
		lastAttempt: boolean;
		send?: (mail: OutgoingMail & { messageId: string }) => Promise<unknown>;
	}
): Promise<DeliveryOutcome> {
	const send = options.send ?? ((mail: OutgoingMail & { messageId: string }) => sendMail(mail));
	const [row] = await sequelize.query<ClaimedRow>(
		`UPDATE outbox_messages
		    SET status = 'sending', attempts = attempts + 1, locked_until = now() + interval '2 minutes'
		  WHERE id = :messageId
		    AND (status = 'waiting' OR (status = 'sending' AND locked_until < now()))
		RETURNING id, to_address, subject, text_body, html_body`,
		{ replacements: { messageId }, type: QueryTypes.SELECT }
	);
	if (!row) return 'not-due';
	try {
		await send({
			to: row.to_address,
			subject: row.subject,
			text: row.text_body,
			html: row.html_body ?? undefined,
			messageId: `<${row.id}@crownbench.outbox>`
		});
	} catch (error) {
		const message = error instanceof Error ? error.message : String(error);
		await sequelize.query(
			`UPDATE outbox_messages SET status = :status, last_error = :lastError, locked_until = NULL
			  WHERE id = :messageId`,
			{
				replacements: {
					messageId: row.id,
					status: options.lastAttempt ? 'failed' : 'waiting',
					lastError: message.slice(0, 1000)
				}
			}
		);
		throw error;
	}
	await sequelize.query(
		`UPDATE outbox_messages SET status = 'sent', sent_at = now(), locked_until = NULL, last_error = NULL
		  WHERE id = :messageId`,
		{ replacements: { messageId: row.id } }
	);
	return 'sent';
}

/** Delivery counts of a show's messages (optionally of one kind), for the chair's progress bar. */
export async function mailProgress(showId: string, kind?: string): Promise<MailProgress> {
	const rows = await sequelize.query<{ status: keyof MailProgress; n: string }>(
		`SELECT status, count(*) AS n FROM outbox_messages
		  WHERE show_id = :showId AND (CAST(:kind AS text) IS NULL OR kind = :kind)
		  GROUP BY status`,
		{ replacements: { showId, kind: kind ?? null }, type: QueryTypes.SELECT }
	);
	const progress: MailProgress = { waiting: 0, sending: 0, sent: 0, failed: 0 };
	for (const r of rows) progress[r.status] = Number(r.n);
	return progress;
}

/**
 * Puts one message back in line to be sent again now, with a new job in the same transaction (the
 * chair's "send again", the admin's "try again" of a failed e-mail).
 */
export async function resendMail(
	id: string,
	options: { transaction: Transaction }
): Promise<boolean> {
	const rows = await sequelize.query<{ id: string; society_id: string | null }>(
		`UPDATE outbox_messages
		    SET status = 'waiting', attempts = 0, next_attempt_at = now(), last_error = NULL, locked_until = NULL
		  WHERE id = :id AND status <> 'sending'
		RETURNING id, society_id`,
		{ replacements: { id }, type: QueryTypes.SELECT, transaction: options.transaction }
	);
	if (rows.length === 0) return false;
	await enqueue(
		'mail-send',
		{ messageId: rows[0].id, societyId: rows[0].society_id },
		mailRetries(options.transaction)
	);
	return true;
}
