/**
 * The chair's side of judging: where every entry stands (the progress board), the awards the
 * engine gives from the panels' scores, and publishing them. Chair-only: names exhibitors.
 */
import { QueryTypes, type Transaction } from 'sequelize';
import {
	awardRulesFrom,
	computeAwards,
	describeAwardSettings,
	validateAwardRules,
	type AwardResult,
	type AwardRules,
	type Award,
	type AwardTie
} from '$lib/domain/awards';
import { combinePanelSheets, type PanelResult, type PanelSheet } from '$lib/domain/judging';
import {
	DEFAULT_STANDARD_SCALE,
	type NotJudgedReason,
	type PanelMethod,
	type ScaleCriterion,
	type ScaleOfPoints
} from '$lib/domain/scoring';
import type { AwardLine, Board, BoardClass } from '$lib/judging/types';

export type { AwardLine, Board, BoardClass };
import { recordAudit, type AuditActor } from '../audit';
import { sequelize } from '../db';
import { Refusal } from '../http/refusal';

interface ShowRow {
	id: string;
	name: string;
	slug: string;
	method: PanelMethod;
	award_rules: unknown;
	published: Date | null;
}

interface ClassRow {
	id: string;
	code: string;
	name: string;
	division_id: string;
	division: string;
	panel_id: string | null;
	panel_name: string | null;
	scale_id: string | null;
	scale_name: string | null;
	criteria: unknown;
}

interface EntryRow {
	id: string;
	number: number;
	class_id: string;
	exhibitor_id: string;
	exhibitor: string;
}

/** One entry with its panel result (chair view). */
export interface JudgedEntry extends PanelResult {
	id: string;
	number: number;
	classId: string;
	exhibitorId: string;
	exhibitor: string;
}

/** A show's judging as it stands: classes, entries with their panel results, the rules. */
export interface ShowJudging {
	show: { id: string; name: string; slug: string; method: PanelMethod; published: boolean };
	rules: AwardRules;
	classes: {
		id: string;
		code: string;
		name: string;
		divisionId: string;
		division: string;
		panelName: string | null;
		judges: number;
		scale: ScaleOfPoints;
	}[];
	entries: JudgedEntry[];
}

/** Reads every class, entry and sheet of a show and combines the sheets (four queries). */
export async function loadShowJudging(
	showId: string,
	transaction?: Transaction
): Promise<ShowJudging> {
	const q = <T extends object>(sql: string) =>
		sequelize.query<T>(sql, { replacements: { showId }, type: QueryTypes.SELECT, transaction });
	const [show] = await q<ShowRow>(
		`SELECT id, name, slug, panel_score_method AS method, award_rules, results_published_at AS published
		   FROM shows WHERE id = :showId`
	);
	if (!show) throw new Refusal('This show does not exist.', 404);
	// Inside a transaction the queries share one connection, so they run one after the other.
	const classes = await q<ClassRow>(
		`SELECT c.id, c.code, c.name, d.id AS division_id, d.code || ' ' || d.name AS division,
			        p.id AS panel_id, p.name AS panel_name, sc.id AS scale_id, sc.name AS scale_name, sc.criteria
			   FROM classes c JOIN divisions d ON d.id = c.division_id
			   LEFT JOIN panel_classes pc ON pc.class_id = c.id
			   LEFT JOIN panels p ON p.id = pc.panel_id
			   LEFT JOIN scales sc ON sc.id = c.scale_id
			  WHERE c.show_id = :showId ORDER BY d.position, c.position`
	);
	const judges = await q<{ panel_id: string; user_id: string }>(
		`SELECT pj.panel_id, pj.user_id FROM panel_judges pj JOIN panels p ON p.id = pj.panel_id
			  WHERE p.show_id = :showId`
	);
	const entries = await q<EntryRow>(
		`SELECT e.id, e.number, e.class_id, e.exhibitor_id, coalesce(u.name, u.email) AS exhibitor
			   FROM entries e JOIN users u ON u.id = e.exhibitor_id
			  WHERE e.show_id = :showId AND e.status NOT IN ('withdrawn', 'scratched')
			  ORDER BY e.number`
	);
	const sheets = await q<{
		entry_id: string;
		judge_id: string | null;
		deductions: Record<string, number>;
		not_judged_reason: NotJudgedReason | null;
		judges_choice_rank: number | null;
	}>(
		`SELECT entry_id, judge_id, deductions, not_judged_reason, judges_choice_rank
			   FROM score_sheets WHERE show_id = :showId`
	);
	const judgesOf = new Map<string, string[]>();
	for (const j of judges)
		judgesOf.set(j.panel_id, [...(judgesOf.get(j.panel_id) ?? []), j.user_id]);
	const sheetsOf = new Map<string, PanelSheet[]>();
	for (const s of sheets) {
		const list = sheetsOf.get(s.entry_id) ?? [];
		list.push({
			judgeId: s.judge_id,
			deductions: s.deductions,
			notJudgedReason: s.not_judged_reason,
			judgesChoiceRank: s.judges_choice_rank
		});
		sheetsOf.set(s.entry_id, list);
	}
	const classViews = classes.map((c) => ({
		id: c.id,
		code: c.code,
		name: c.name,
		divisionId: c.division_id,
		division: c.division,
		panelId: c.panel_id,
		panelName: c.panel_name,
		judges: c.panel_id ? (judgesOf.get(c.panel_id)?.length ?? 0) : 0,
		scale:
			c.scale_id && Array.isArray(c.criteria)
				? { id: c.scale_id, name: c.scale_name ?? '', criteria: c.criteria as ScaleCriterion[] }
				: DEFAULT_STANDARD_SCALE
	}));
	const classById = new Map(classViews.map((c) => [c.id, c]));
	const rules = awardRulesFrom(show.award_rules);
	const judged: JudgedEntry[] = entries.map((e) => {
		const cls = classById.get(e.class_id);
		const panelJudges = cls?.panelId ? (judgesOf.get(cls.panelId) ?? []) : [];
		const result = cls?.panelId
			? combinePanelSheets(
					cls.scale,
					show.method,
					panelJudges,
					sheetsOf.get(e.id) ?? [],
					rules.meanRounding
				)
			: combinePanelSheets(DEFAULT_STANDARD_SCALE, show.method, [], []);
		return {
			...result,
			id: e.id,
			number: e.number,
			classId: e.class_id,
			exhibitorId: e.exhibitor_id,
			exhibitor: e.exhibitor
		};
	});
	return {
		show: {
			id: show.id,
			name: show.name,
			slug: show.slug,
			method: show.method,
			published: show.published !== null
		},
		rules,
		classes: classViews.map(({ panelId: _p, ...c }) => c),
		entries: judged
	};
}

/** Summarises where judging stands, for the chair's live board. */
export async function loadBoard(showId: string): Promise<Board> {
	const judging = await loadShowJudging(showId);
	const classes: BoardClass[] = judging.classes.map((c) => {
		const entries = judging.entries.filter((e) => e.classId === c.id);
		const scored = entries.filter((e) => e.state === 'scored').length;
		const notJudged = entries.filter((e) => e.state === 'not_judged').length;
		const left = entries.length - scored - notJudged;
		const started = entries.some((e) => e.state !== 'waiting');
		return {
			id: c.id,
			code: c.code,
			name: c.name,
			division: c.division,
			panel: c.panelName,
			entries: entries.length,
			scored,
			notJudged,
			left,
			missingSheets: entries.reduce((n, e) => n + e.missing, 0),
			state:
				entries.length === 0
					? 'no_entries'
					: c.panelName === null
						? 'no_panel'
						: left === 0
							? 'judged'
							: started
								? 'in_progress'
								: 'waiting'
		};
	});
	const withEntries = classes.filter((c) => c.entries > 0);
	return {
		published: judging.show.published,
		method: judging.show.method,
		classesJudged: withEntries.filter((c) => c.state === 'judged').length,
		classesWithEntries: withEntries.length,
		entriesLeft: withEntries.reduce((n, c) => n + c.left, 0),
		sheetsMissing: withEntries.reduce((n, c) => n + c.missingSheets, 0),
		classes,
		checkedAt: new Date().toISOString()
	};
}

/** Runs the awards engine on a show's judging (pure: same inputs, same awards). */
export function awardsOf(judging: ShowJudging): AwardResult {
	const key = judging.rules.tieBreak.criterionKey;
	const scale =
		judging.classes.find((c) => c.scale.criteria.some((k) => k.key === key))?.scale ??
		DEFAULT_STANDARD_SCALE;
	return computeAwards({
		classes: judging.classes.map((c) => ({
			id: c.id,
			divisionId: c.divisionId,
			code: c.code,
			name: c.name
		})),
		entries: judging.entries.map((e) => ({
			id: e.id,
			classId: e.classId,
			number: e.number,
			exhibitorId: e.exhibitorId,
			score: e.score,
			notJudged: e.state === 'not_judged',
			criterionScores: e.criterionScores ?? undefined,
			judgesChoiceRank: e.judgesChoiceRank
		})),
		rules: judging.rules,
		scale
	});
}

const LEVEL_TITLES: Record<string, string> = {
	blue: 'Blue ribbon',
	red: 'Red ribbon',
	white: 'White ribbon',
	first: 'First place',
	second: 'Second place',
	third: 'Third place',
	honourable: 'Honorable mention'
};

/** Turns engine output into lines with class codes, entry numbers and exhibitor names. */
export function describeAwards(
	judging: ShowJudging,
	result: { awards: Award[]; ties: AwardTie[] }
): { awards: AwardLine[]; ties: { title: string; reason: string }[] } {
	const cls = new Map(judging.classes.map((c) => [c.id, c]));
	const entry = new Map(judging.entries.map((e) => [e.id, e]));
	const names = new Map(judging.entries.map((e) => [e.exhibitorId, e.exhibitor]));
	const division = new Map(judging.classes.map((c) => [c.divisionId, c.division]));
	const top = new Map(judging.rules.topAwards.map((t) => [t.id, t.name]));
	const awards = result.awards.map((a) => {
		const e = a.entryId ? entry.get(a.entryId) : undefined;
		const title =
			a.kind === 'ribbon' || a.kind === 'placement'
				? (LEVEL_TITLES[a.level ?? ''] ?? a.kind)
				: a.kind === 'best_in_class'
					? 'Best in class'
					: a.kind === 'top_award'
						? (top.get(a.topAwardId ?? '') ?? 'Top award')
						: `Sweepstakes, division ${division.get(a.divisionId ?? '') ?? ''}`;
		return {
			kind: a.kind,
			title,
			classCode: a.classId ? (cls.get(a.classId)?.code ?? null) : null,
			entryNumber: e?.number ?? null,
			exhibitor: a.exhibitorId ? (names.get(a.exhibitorId) ?? null) : null,
			score: a.score ?? null,
			reason: a.reason
		};
	});
	const ties = result.ties.map((t) => ({
		title:
			t.kind === 'top_award'
				? (top.get(t.topAwardId ?? '') ?? 'Top award')
				: t.kind === 'sweepstakes'
					? 'Sweepstakes'
					: t.kind === 'best_in_class'
						? `Best in class, class ${cls.get(t.classId ?? '')?.code ?? ''}`
						: `Places in class ${cls.get(t.classId ?? '')?.code ?? ''}`,
		reason: t.reason
	}));
	return { awards, ties };
}

/** Stored awards of a published show, in the order they were given. */
export async function loadPublishedAwards(
	showId: string
): Promise<{ awards: AwardLine[]; ties: { title: string; reason: string }[] }> {
	const rows = await sequelize.query<{
		kind: Award['kind'];
		level: string | null;
		top_award_name: string | null;
		class_code: string | null;
		division: string | null;
		number: number | null;
		exhibitor: string | null;
		score: string | null;
		reason: string;
	}>(
		`SELECT a.kind, a.level, a.top_award_name, c.code AS class_code, d.code || ' ' || d.name AS division,
		        e.number, coalesce(u.name, u.email) AS exhibitor, a.score, a.reason
		   FROM awards a
		   LEFT JOIN classes c ON c.id = a.class_id
		   LEFT JOIN divisions d ON d.id = a.division_id
		   LEFT JOIN entries e ON e.id = a.entry_id
		   LEFT JOIN users u ON u.id = a.exhibitor_id
		  WHERE a.show_id = :showId ORDER BY a.position`,
		{ replacements: { showId }, type: QueryTypes.SELECT }
	);
	const ties = await sequelize.query<{ kind: string; reason: string }>(
		'SELECT kind, reason FROM award_ties WHERE show_id = :showId ORDER BY position',
		{ replacements: { showId }, type: QueryTypes.SELECT }
	);
	return {
		awards: rows.map((r) => ({
			kind: r.kind,
			title:
				r.kind === 'ribbon' || r.kind === 'placement'
					? (LEVEL_TITLES[r.level ?? ''] ?? r.kind)
					: r.kind === 'best_in_class'
						? 'Best in class'
						: r.kind === 'top_award'
							? (r.top_award_name ?? 'Top award')
							: `Sweepstakes, division ${r.division ?? ''}`,
			classCode: r.class_code,
			entryNumber: r.number,
			exhibitor: r.exhibitor,
			score: r.score === null ? null : Number(r.score),
			reason: r.reason
		})),
		ties: ties.map((t) => ({ title: t.kind.replace('_', ' '), reason: t.reason }))
	};
}

/** What publishing did. */
export interface PublishOutcome {
	publishedAt: Date;
	awards: number;
	ties: number;
}

/**
 * Publishes a show's results, all in the caller's transaction: locks the show row, computes the
 * awards with the engine, stores awards and unresolved ties, and sets results_published_at. From
 * then on scores and awards refuse changes (services and database triggers). Refused when the
 * results are already published, or while entries still wait for scores unless
 * `allowIncomplete` is set. Writes the audit record in the same transaction. Later work (e-mails
 * to exhibitors) can join the same transaction.
 */
export async function publishResults(
	actor: AuditActor,
	showId: string,
	options: { transaction: Transaction; allowIncomplete?: boolean }
): Promise<PublishOutcome> {
	const { transaction } = options;
	const [locked] = await sequelize.query<{
		published: Date | null;
		society_id: string;
		name: string;
	}>(
		'SELECT results_published_at AS published, society_id, name FROM shows WHERE id = :showId FOR UPDATE',
		{ replacements: { showId }, type: QueryTypes.SELECT, transaction }
	);
	if (!locked) throw new Refusal('This show does not exist.', 404);
	if (locked.published) throw new Refusal('The results of this show are already published.', 423);
	const judging = await loadShowJudging(showId, transaction);
	const waiting = judging.entries.filter((e) => e.state !== 'scored' && e.state !== 'not_judged');
	if (waiting.length > 0 && !options.allowIncomplete) {
		throw new Refusal(
			`${waiting.length} ${waiting.length === 1 ? 'entry still has' : 'entries still have'} no score. Wait for the panels, or publish anyway.`,
			409,
			'allowIncomplete'
		);
	}
	const result = awardsOf(judging);
	const topName = new Map(judging.rules.topAwards.map((t) => [t.id, t.name]));
	await sequelize.query('DELETE FROM awards WHERE show_id = :showId', {
		replacements: { showId },
		transaction
	});
	await sequelize.query('DELETE FROM award_ties WHERE show_id = :showId', {
		replacements: { showId },
		transaction
	});
	// All awards in one statement (a convention show gives about as many awards as entries).
	if (result.awards.length > 0) {
		await sequelize.query(
			`INSERT INTO awards (show_id, kind, entry_id, exhibitor_id, class_id, division_id, top_award_id,
			                     top_award_name, level, score, reason, position)
			 SELECT :showId, r.kind, r.entry_id, r.exhibitor_id, r.class_id, r.division_id, r.top_award_id,
			        r.top_award_name, r.level, r.score, r.reason, r.position
			   FROM jsonb_to_recordset(CAST(:rows AS jsonb)) AS r(kind varchar, entry_id uuid,
			        exhibitor_id uuid, class_id uuid, division_id uuid, top_award_id varchar,
			        top_award_name varchar, level varchar, score numeric, reason text, position int)`,
			{
				replacements: {
					showId,
					rows: JSON.stringify(
						result.awards.map((a, position) => ({
							kind: a.kind,
							entry_id: a.entryId ?? null,
							exhibitor_id: a.exhibitorId ?? null,
							class_id: a.classId ?? null,
							division_id: a.divisionId ?? null,
							top_award_id: a.topAwardId ?? null,
							top_award_name: a.topAwardId ? (topName.get(a.topAwardId) ?? null) : null,
							level: a.level ?? null,
							score: a.score ?? null,
							reason: a.reason,
							position
						}))
					)
				},
				transaction
			}
		);
	}
	let position = 0;
	for (const t of result.ties) {
		await sequelize.query(
			`INSERT INTO award_ties (show_id, kind, class_id, division_id, top_award_id, levels, entry_ids,
			                         exhibitor_ids, reason, position)
			 VALUES (:showId, :kind, :classId, :divisionId, :topAwardId,
			         CAST(:levels AS varchar(16)[]), CAST(:entryIds AS uuid[]), CAST(:exhibitorIds AS uuid[]),
			         :reason, :position)`,
			{
				replacements: {
					showId,
					kind: t.kind,
					classId: t.classId ?? null,
					divisionId: t.divisionId ?? null,
					topAwardId: t.topAwardId ?? null,
					levels: `{${(t.levels ?? []).join(',')}}`,
					entryIds: `{${(t.entryIds ?? []).join(',')}}`,
					exhibitorIds: `{${(t.exhibitorIds ?? []).join(',')}}`,
					reason: t.reason,
					position: position++
				},
				transaction
			}
		);
	}
	const [[row]] = (await sequelize.query(
		'UPDATE shows SET results_published_at = now(), updated_at = now() WHERE id = :showId RETURNING results_published_at',
		{ replacements: { showId }, transaction }
	)) as unknown as [{ results_published_at: Date }[]];
	// Publishing cannot be taken back (scores lock): the audit log keeps who did it and how.
	await recordAudit(
		{
			societyId: locked.society_id,
			showId,
			actor,
			action: 'results.publish',
			target: { kind: 'show', id: showId, label: locked.name },
			details: {
				awards: result.awards.length,
				ties: result.ties.length,
				withoutScore: waiting.length,
				allowIncomplete: Boolean(options.allowIncomplete)
			}
		},
		{ transaction }
	);
	return {
		publishedAt: row.results_published_at,
		awards: result.awards.length,
		ties: result.ties.length
	};
}

/** The award rules page: the show's rules, its classes and the criteria a tie-break may name. */
export async function loadAwardRulesPage(showId: string) {
	const judging = await loadShowJudging(showId);
	const criteria = new Map<string, string>();
	for (const c of judging.classes) for (const k of c.scale.criteria) criteria.set(k.key, k.label);
	return {
		rules: judging.rules,
		method: judging.show.method,
		settings: describeAwardSettings(judging.rules, judging.show.method),
		published: judging.show.published,
		classes: judging.classes.map((c) => ({
			id: c.id,
			code: c.code,
			name: c.name,
			division: c.division
		})),
		criteria: [...criteria.entries()].map(([key, label]) => ({ key, label }))
	};
}

/**
 * The one writer of a show's award rules (the award rules page, and the marks on the show's own
 * page): stores them and the panel score method after checking them (validateAwardRules, classes
 * of this show only); refused once results are published.
 */
export async function saveAwardRules(
	show: { id: string; resultsPublishedAt: Date | null },
	rules: AwardRules,
	method: PanelMethod,
	options: { transaction: Transaction }
): Promise<void> {
	const { transaction } = options;
	if (show.resultsPublishedAt) {
		throw new Refusal('Results are published: the award rules can no longer change.', 423);
	}
	const problems = validateAwardRules(rules);
	if (problems.length > 0) throw new Refusal(problems[0].message, 400, problems[0].field);
	const classIds = [...new Set(rules.topAwards.flatMap((t) => t.classIds))];
	if (classIds.length > 0) {
		const found = await sequelize.query<{ n: string }>(
			'SELECT count(*) AS n FROM classes WHERE show_id = :showId AND id IN (:classIds)',
			{ replacements: { showId: show.id, classIds }, type: QueryTypes.SELECT, transaction }
		);
		if (Number(found[0].n) !== classIds.length) {
			throw new Refusal(
				'A top award names a class that is not part of this show.',
				400,
				'topAwards'
			);
		}
	}
	await sequelize.query(
		`UPDATE shows SET award_rules = CAST(:rules AS jsonb), panel_score_method = :method, updated_at = now()
		  WHERE id = :showId`,
		{ replacements: { rules: JSON.stringify(rules), method, showId: show.id }, transaction }
	);
}
