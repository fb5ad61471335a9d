/**
 * Published results: one loader (`loadShowResults`) turns a show's stored awards and scores into
 * `ShowResults`, which every document, the CSV, the e-mails, the charts and the pages use. Also:
 * the public page's read (kept in cache/results.ts), the placements e-mails written to the outbox in the publishing
 * transaction, and the chair's view of their delivery.
 */
import { QueryTypes, type Transaction } from 'sequelize';
import { describeAwardSettings, type Award } from '$lib/domain/awards';
import { assembleResults, publicResults, type ResultsSource } from '$lib/results/assemble';
import type { ShowResults } from '$lib/results/types';
import type { AuditActor } from '../audit';
import { cachedResults, resultsKey } from './cache';
import { sequelize } from '../db';
import { mailProgress, queueMail, resendMail, type MailProgress } from '../mail/outbox';
import { buildResultsMessage } from './results-message';
import { loadShowJudging, publishResults, type PublishOutcome } from './results';
import { requestShowPdfs } from './documents/show-pdf';
import { config } from '$lib/server/config';

/** The outbox kind of placements e-mails. */
export const RESULTS_MAIL_KIND = 'results';

/** What a show's results pages need to know about the show itself. */
export interface ResultsShow {
	id: string;
	societyId: string;
	slug: string;
	name: string;
	societyName: string;
	venue: string | null;
	judgingDay: string;
	schedulePublished: boolean;
	publishedAt: string | null;
}

interface ShowRow {
	id: string;
	society_id: string;
	slug: string;
	name: string;
	society_name: string;
	venue: string | null;
	judging_day: string;
	schedule_published_at: Date | null;
	results_published_at: Date | null;
	updated_at: Date;
}

function toResultsShow(r: ShowRow): ResultsShow {
	return {
		id: r.id,
		societyId: r.society_id,
		slug: r.slug,
		name: r.name,
		societyName: r.society_name,
		venue: r.venue,
		judgingDay: r.judging_day,
		schedulePublished: r.schedule_published_at !== null,
		publishedAt: r.results_published_at ? r.results_published_at.toISOString() : null
	};
}

async function readResultsShow(
	where: { slug: string } | { id: string },
	transaction?: Transaction
): Promise<ShowRow | null> {
	const [row] = await sequelize.query<ShowRow>(
		`SELECT s.id, s.society_id, s.slug, s.name, so.name AS society_name, s.venue, s.judging_day,
		        s.schedule_published_at, s.results_published_at, s.updated_at
		   FROM shows s JOIN societies so ON so.id = s.society_id
		  WHERE ${'slug' in where ? 's.slug = :key' : 's.id = :key'}`,
		{
			replacements: { key: 'slug' in where ? where.slug : where.id },
			type: QueryTypes.SELECT,
			transaction
		}
	);
	return row ?? null;
}

/** Finds a show by its address (one query), or null. */
export async function findResultsShow(
	where: { slug: string } | { id: string },
	transaction?: Transaction
): Promise<ResultsShow | null> {
	const row = await readResultsShow(where, transaction);
	return row ? toResultsShow(row) : null;
}

/**
 * Loads a show's results from its stored awards, the panels' scores and the judges' comments, in
 * a fixed number of queries whatever the size of the show. Null when the show does not exist.
 * Works inside the publishing transaction (it sees the awards just written).
 */
export async function loadShowResults(
	showId: string,
	options: { transaction?: Transaction } = {}
): Promise<ShowResults | null> {
	const { transaction } = options;
	const show = await findResultsShow({ id: showId }, transaction);
	if (!show) return null;
	const q = <T extends object>(sql: string) =>
		sequelize.query<T>(sql, { replacements: { showId }, type: QueryTypes.SELECT, transaction });
	// Inside a transaction the queries share one connection, so they run one after the other.
	const [judging, divisions, extras, awards, ties] = await inTurnOrTogether(transaction, [
		() => loadShowJudging(showId, transaction),
		() =>
			q<{ id: string; code: string; name: string }>(
				'SELECT id, code, name FROM divisions WHERE show_id = :showId ORDER BY position, code'
			),
		() =>
			q<{ id: string; plant: string; exhibitor: string | null; comments: string[] }>(
				`SELECT e.id, coalesce(v.name, e.title, '') AS plant, u.name AS exhibitor,
			        coalesce(array_agg(ss.comment ORDER BY ss.created_at, ss.id)
			                 FILTER (WHERE ss.comment <> '' AND ss.kind = (CASE WHEN sh.panel_score_method = 'consensus' THEN 'consensus' ELSE 'judge' END)),
			                 '{}') AS comments
			   FROM entries e
			   JOIN shows sh ON sh.id = e.show_id
			   JOIN users u ON u.id = e.exhibitor_id
			   LEFT JOIN varieties v ON v.id = e.variety_id
			   LEFT JOIN score_sheets ss ON ss.entry_id = e.id
			  WHERE e.show_id = :showId AND e.status NOT IN ('withdrawn', 'scratched')
			  GROUP BY e.id, v.name, u.name`
			),
		() =>
			q<{
				kind: Award['kind'];
				entry_id: string | null;
				exhibitor_id: string | null;
				class_id: string | null;
				division_id: string | null;
				top_award_id: string | null;
				top_award_name: string | null;
				level: Award['level'] | null;
				score: string | null;
			}>(
				`SELECT kind, entry_id, exhibitor_id, class_id, division_id, top_award_id, top_award_name,
			        level, score
			   FROM awards WHERE show_id = :showId ORDER BY position`
			),
		() =>
			q<{ reason: string }>(
				'SELECT reason FROM award_ties WHERE show_id = :showId ORDER BY position'
			)
	] as const);
	const extra = new Map(extras.map((e) => [e.id, e]));
	const source: ResultsSource = {
		show: {
			id: show.id,
			slug: show.slug,
			name: show.name,
			societyName: show.societyName,
			venue: show.venue,
			judgingDay: show.judgingDay,
			system: judging.rules.system,
			awardSettings: describeAwardSettings(judging.rules, judging.show.method),
			publishedAt: show.publishedAt
		},
		divisions,
		classes: judging.classes.map((c) => ({
			id: c.id,
			code: c.code,
			name: c.name,
			divisionId: c.divisionId
		})),
		entries: judging.entries.map((e) => {
			const x = extra.get(e.id);
			return {
				id: e.id,
				number: e.number,
				classId: e.classId,
				plant: x?.plant ?? '',
				exhibitorId: e.exhibitorId,
				exhibitor: x?.exhibitor || 'Unnamed exhibitor',
				score: e.score,
				state: e.state === 'scored' || e.state === 'not_judged' ? e.state : 'waiting',
				comments: x?.comments ?? []
			};
		}),
		awards: awards.map((a) => ({
			kind: a.kind,
			entryId: a.entry_id ?? undefined,
			exhibitorId: a.exhibitor_id ?? undefined,
			classId: a.class_id ?? undefined,
			divisionId: a.division_id ?? undefined,
			topAwardId: a.top_award_id ?? undefined,
			topAwardName: a.top_award_name,
			level: a.level ?? undefined,
			score: a.score === null ? undefined : Number(a.score),
			reason: ''
		})),
		undecided: ties.map((t) => t.reason)
	};
	return assembleResults(source);
}

/** Runs the reads together on the pool, or one after the other on a transaction's connection. */
async function inTurnOrTogether<T extends readonly (() => Promise<unknown>)[]>(
	transaction: Transaction | undefined,
	reads: T
): Promise<{ -readonly [K in keyof T]: Awaited<ReturnType<T[K]>> }> {
	if (!transaction) {
		return Promise.all(reads.map((read) => read())) as Promise<{
			-readonly [K in keyof T]: Awaited<ReturnType<T[K]>>;
		}>;
	}
	const out: unknown[] = [];
	for (const read of reads) out.push(await read());
	return out as { -readonly [K in keyof T]: Awaited<ReturnType<T[K]>> };
}

/**
 * The public results of a show by its address: null results while unpublished (nothing about
 * scores is read). Kept in the one results cache (cache/results.ts) under the show's publishing
 * time and last change, which are read fresh on every request (one query), so a publish seen by
 * any instance shows at once everywhere.
 */
export async function loadPublicResults(
	slug: string
): Promise<{ show: ResultsShow; results: ShowResults | null } | null> {
	const row = await readResultsShow({ slug });
	if (!row) return null;
	const show = toResultsShow(row);
	if (!row.results_published_at) return { show, results: null };
	const results = await cachedResults(
		row.slug,
		resultsKey(row.results_published_at, row.updated_at),
		async () => {
			const loaded = await loadShowResults(show.id);
			return loaded ? publicResults(loaded) : null;
		}
	);
	return results ? { show, results } : null;
}

/** Where the links in placements e-mails lead. */
function resultsLinks(origin: string, slug: string): { results: string; preferences: string } {
	const base = (config().origin || origin).replace(/\/$/, '');
	return { results: `${base}/shows/${slug}/results`, preferences: `${base}/my/mail` };
}

/**
 * Writes one placements e-mail per exhibitor to the outbox, in the caller's transaction (the
 * publishing one): every entry's award, score and the judges' comments. Exhibitors who turned
 * results e-mails off get none. A dedupe key per show and exhibitor means never twice.
 */
export async function queueResultsMail(
	showId: string,
	options: { transaction: Transaction; origin: string }
): Promise<number> {
	const { transaction } = options;
	const results = await loadShowResults(showId, { transaction });
	if (!results) return 0;
	const recipients = await sequelize.query<{
		id: string;
		name: string | null;
		email: string;
		society_id: string;
	}>(
		`SELECT DISTINCT u.id, u.name, u.email, s.society_id
		   FROM entries e
		   JOIN shows s ON s.id = e.show_id
		   JOIN users u ON u.id = e.exhibitor_id
		   LEFT JOIN mail_preferences mp ON mp.user_id = u.id
		  WHERE e.show_id = :showId AND e.status NOT IN ('withdrawn', 'scratched')
		    AND coalesce(mp.results, true)`,
		{ replacements: { showId }, type: QueryTypes.SELECT, transaction }
	);
	const links = resultsLinks(options.origin, results.show.slug);
	const messages = recipients.flatMap((r) => {
		const message = buildResultsMessage(results, { id: r.id, name: r.name }, links);
		if (!message) return [];
		return [
			{
				kind: RESULTS_MAIL_KIND,
				to: r.email,
				...message,
				societyId: r.society_id,
				showId,
				recipientId: r.id,
				dedupeKey: `results:${showId}:${r.id}`
			}
		];
	});
	return queueMail(messages, { transaction });
}

/**
 * Publishes a show's results and queues the placements e-mails, all in the caller's transaction:
 * if either fails, neither happens.
 */
export async function publishResultsAndTell(
	actor: AuditActor,
	showId: string,
	options: { transaction: Transaction; origin: string; allowIncomplete?: boolean }
): Promise<PublishOutcome & { queued: number }> {
	const outcome = await publishResults(actor, showId, options);
	const queued = await queueResultsMail(showId, options);
	// The whole-show PDFs are built off the request path and kept for this publication.
	await requestShowPdfs(showId, { transaction: options.transaction });
	return { ...outcome, queued };
}

/** One placements e-mail as the chair sees it. */
export interface ResultsMailRow {
	id: string;
	to: string;
	name: string | null;
	status: keyof MailProgress;
	attempts: number;
	lastError: string | null;
}

/** Delivery of a show's placements e-mails: counts and every message, failed ones first. */
export async function loadResultsMail(
	showId: string
): Promise<{ progress: MailProgress; messages: ResultsMailRow[] }> {
	const [progress, rows] = await Promise.all([
		mailProgress(showId, RESULTS_MAIL_KIND),
		sequelize.query<{
			id: string;
			to_address: string;
			name: string | null;
			status: keyof MailProgress;
			attempts: number;
			last_error: string | null;
		}>(
			`SELECT o.id, o.to_address, u.name, o.status, o.attempts, o.last_error
			   FROM outbox_messages o LEFT JOIN users u ON u.id = o.recipient_id
			  WHERE o.show_id = :showId AND o.kind = :kind
			  ORDER BY (o.status = 'failed') DESC, coalesce(u.name, o.to_address)`,
			{ replacements: { showId, kind: RESULTS_MAIL_KIND }, type: QueryTypes.SELECT }
		)
	]);
	return {
		progress,
		messages: rows.map((r) => ({
			id: r.id,
			to: r.to_address,
			name: r.name,
			status: r.status,
			attempts: r.attempts,
			lastError: r.last_error
		}))
	};
}

/** Puts one of the show's placements e-mails back in line; false when it is not one of them. */
export async function resendResultsMail(
	showId: string,
	messageId: string,
	options: { transaction: Transaction }
): Promise<boolean> {
	const [owned] = await sequelize.query(
		`SELECT id FROM outbox_messages WHERE id = :messageId AND show_id = :showId AND kind = :kind
		    FOR UPDATE`,
		{
			replacements: { messageId, showId, kind: RESULTS_MAIL_KIND },
			type: QueryTypes.SELECT,
			transaction: options.transaction
		}
	);
	if (!owned) return false;
	return resendMail(messageId, options);
}
