import { QueryTypes, type Transaction } from 'sequelize';
import type { AuditAction, AuditPage, AuditRow } from '$lib/audit';
import type { AuditQuery } from '$lib/schemas/audit';
import { AuditEvent, User, sequelize } from './db';

/**
 * Who did it: the signed-in person (their name and address are kept as they were then). Without
 * the address, recordAudit reads it from the account.
 */
export interface AuditActor {
	id: string;
	email?: string;
	name?: string | null;
}

/** One destructive action to record; `score.change` rows are written by saveSheet instead. */
export interface AuditRecord {
	/** The society whose data changed; null for a member's own collection. */
	societyId: string | null;
	showId?: string | null;
	actor: AuditActor;
	action: Exclude<AuditAction, 'score.change'>;
	/** What it touched: a kind (class, entry, panel…), its id and a short label for people. */
	target: { kind: string; id: string; label: string };
	/** Before and after, or whatever else tells what happened (kept small). */
	details?: Record<string, unknown>;
}

const clip = (text: string, max: number) =>
	text.length > max ? `${text.slice(0, max - 1)}…` : text;

/**
 * Writes one row of the audit log in the caller's transaction, so the record and the change it
 * describes are kept or lost together. Call it in the same transaction as the destructive write.
 */
export async function recordAudit(
	record: AuditRecord,
	options: { transaction: Transaction }
): Promise<void> {
	const { transaction } = options;
	let actor = record.actor;
	if (!actor.email) {
		const user = await User.findByPk(actor.id, { attributes: ['email', 'name'], transaction });
		actor = { id: actor.id, email: user?.email ?? actor.id, name: user?.name ?? null };
	}
	const email = actor.email ?? actor.id;
	await AuditEvent.create(
		{
			societyId: record.societyId,
			showId: record.showId ?? null,
			actorId: actor.id,
			actorLabel: clip(actor.name ? `${actor.name} (${email})` : email, 320),
			action: record.action,
			targetKind: record.target.kind,
			targetId: clip(record.target.id, 64),
			targetLabel: clip(record.target.label || record.target.id, 200),
			details: record.details ?? {}
		},
		{ transaction }
	);
}

/**
 * Records a destructive action on a show's data (society and show taken from the show), in the
 * caller's transaction, by the actor the caller was given.
 */
export async function recordShowAudit(
	show: { id: string; societyId: string },
	record: Omit<AuditRecord, 'societyId' | 'showId' | 'actor'>,
	options: { transaction: Transaction; actor: AuditActor }
): Promise<void> {
	await recordAudit(
		{ ...record, societyId: show.societyId, showId: show.id, actor: options.actor },
		{ transaction: options.transaction }
	);
}

/** Whose log is read: a whole society (its admin) or one show (its chair). */
export type AuditScope = { societyId: string } | { showId: string };

export const AUDIT_PAGE_SIZE = 50;

/**
 * The log of a society or show, newest first, one page at a time: the audit events and the score
 * sheets' changes (score_audit) read as one list, filtered by action, person and days.
 */
export async function listAuditLog(scope: AuditScope, filter: AuditQuery): Promise<AuditPage> {
	const bySociety = 'societyId' in scope;
	const replacements: Record<string, unknown> = {
		scopeId: bySociety ? scope.societyId : scope.showId,
		action: filter.action ?? null,
		personId: filter.person ?? null,
		from: filter.from ?? null,
		to: filter.to ?? null,
		limit: AUDIT_PAGE_SIZE,
		offset: (filter.page - 1) * AUDIT_PAGE_SIZE
	};
	const log = `
		WITH log AS (
			SELECT a.id::text AS id, a.at, a.action, a.actor_id, a.actor_label, a.show_id,
			       a.target_kind, a.target_label, a.details
			  FROM audit_events a
			 WHERE ${bySociety ? 'a.society_id = :scopeId' : 'a.show_id = :scopeId'}
			UNION ALL
			SELECT 's' || s.id, s.at, 'score.change', s.actor_id, s.actor_email, s.show_id,
			       'entry', 'Entry ' || e.number,
			       jsonb_build_object('before', s.before -> 'total', 'after', s.after -> 'total',
			                          'notJudged', s.after -> 'notJudged')
			  FROM score_audit s JOIN entries e ON e.id = s.entry_id
			 WHERE ${bySociety ? 's.show_id IN (SELECT id FROM shows WHERE society_id = :scopeId)' : 's.show_id = :scopeId'}
		)`;
	// The days of the filter are the society's days, as the log shows its times: a day starts at
	// midnight in the society's time zone, not in UTC.
	const zone = bySociety
		? '(SELECT time_zone FROM societies WHERE id = :scopeId)'
		: '(SELECT so.time_zone FROM shows sh JOIN societies so ON so.id = sh.society_id WHERE sh.id = :scopeId)';
	const where = `
		 WHERE (CAST(:action AS text) IS NULL OR log.action = :action)
		   AND (CAST(:personId AS uuid) IS NULL OR log.actor_id = CAST(:personId AS uuid))
		   AND (CAST(:from AS date) IS NULL
		        OR log.at >= (CAST(:from AS date)::timestamp AT TIME ZONE ${zone}))
		   AND (CAST(:to AS date) IS NULL
		        OR log.at < ((CAST(:to AS date) + 1)::timestamp AT TIME ZONE ${zone}))`;
	const [rows, counted, people] = await Promise.all([
		sequelize.query<{
			id: string;
			at: Date;
			action: AuditAction;
			actor_id: string;
			actor_label: string;
			show_name: string | null;
			target_kind: string;
			target_label: string;
			details: Record<string, unknown>;
		}>(
			`${log}
			 SELECT log.*, sh.name AS show_name FROM log LEFT JOIN shows sh ON sh.id = log.show_id
			 ${where}
			 ORDER BY log.at DESC, log.id DESC LIMIT :limit OFFSET :offset`,
			{ replacements, type: QueryTypes.SELECT }
		),
		sequelize.query<{ n: string }>(`${log} SELECT count(*) AS n FROM log ${where}`, {
			replacements,
			type: QueryTypes.SELECT
		}),
		sequelize.query<{ actor_id: string; actor_label: string }>(
			`${log} SELECT DISTINCT ON (actor_id) actor_id, actor_label FROM log
			  ORDER BY actor_id, at DESC`,
			{ replacements, type: QueryTypes.SELECT }
		)
	]);
	return {
		rows: rows.map((r): AuditRow => ({
			id: r.id,
			at: r.at.toISOString(),
			action: r.action,
			actorId: r.actor_id,
			actor: r.actor_label,
			showName: r.show_name,
			targetKind: r.target_kind,
			targetLabel: r.target_label,
			details: r.details
		})),
		total: Number(counted[0]?.n ?? 0),
		page: filter.page,
		pageSize: AUDIT_PAGE_SIZE,
		people: people
			.map((p) => ({ id: p.actor_id, label: p.actor_label }))
			.sort((a, b) => a.label.localeCompare(b.label))
	};
}
