/**
 * The benchmark's bare baseline: node:http and pg, nothing else. It answers the same requests the
 * benchmark sends to the app with the same PostgreSQL queries the app runs, and returns the same
 * JSON, so the app's figures can be read as a ratio of this bare limit.
 *   PUT /api/judging/sheets          session cookie, the judge's memberships, then the app's save
 *                                    transaction of three statements (lock the entry and read the
 *                                    access; the stored answer and the sheet; one statement writing
 *                                    the sheet, its audit row and the applied change)
 *   GET /shows/<slug>/results        the public results of a published show (the app's queries)
 *   GET /api/chair/shows/<slug>/board  the chair's progress board: session, the show by address
 *                                    and the chair's role in its society, then the app's board
 *                                    queries (show, classes, judges, entries, sheets) one by one
 * DATABASE_URL, PORT (4891) and DB_POOL_MAX (10, as the app) set it up; it listens on 127.0.0.1.
 */
import http from 'node:http';
import pg from 'pg';

const pool = new pg.Pool({
	connectionString: process.env.DATABASE_URL,
	max: Number(process.env.DB_POOL_MAX ?? 10)
});
const port = Number(process.env.PORT ?? 4891);
const ACTIVE = `e.status NOT IN ('withdrawn', 'scratched')`;
const DEFAULT_CRITERIA = [
	{ key: 'symmetry', maxPoints: 25 },
	{ key: 'condition', maxPoints: 25 },
	{ key: 'quantity_of_bloom', maxPoints: 25 },
	{ key: 'size_and_type_of_blossom', maxPoints: 15 },
	{ key: 'color_of_blossom', maxPoints: 10 }
];
const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;

class Refusal extends Error {
	/** @param {string} message @param {number} status @param {unknown} [details] */
	constructor(message, status, details) {
		super(message);
		this.status = status;
		this.details = details;
	}
}

/** @param {http.ServerResponse} res @param {number} status @param {unknown} body */
function send(res, status, body) {
	const text = JSON.stringify(body);
	res.writeHead(status, {
		'content-type': 'application/json',
		'content-length': Buffer.byteLength(text)
	});
	res.end(text);
}

/** @param {http.IncomingMessage} req */
function readBody(req) {
	return new Promise((resolve, reject) => {
		/** @type {Buffer[]} */
		const chunks = [];
		req.on('data', (c) => chunks.push(c));
		req.on('end', () => resolve(Buffer.concat(chunks).toString('utf8')));
		req.on('error', reject);
	});
}

/** The signed-in person from the session cookie: one query, as the app's hook runs it. */
async function signedInUser(/** @type {http.IncomingMessage} */ req) {
	const cookie = req.headers.cookie ?? '';
	const token = /(?:^|;\s*)authjs\.session-token=([^;]+)/.exec(cookie)?.[1];
	if (!token) return null;
	const { rows } = await pool.query({
		name: 'people_session_user',
		text: `SELECT s.expires, u.id, u.email, u.name, m.roles,
		        so.id AS society_id, so.slug AS society_slug, so.name AS society_name
		   FROM sessions s
		   JOIN users u ON u.id = s.user_id
		   LEFT JOIN memberships m ON m.user_id = u.id
		   LEFT JOIN societies so ON so.id = m.society_id
		  WHERE s.session_token = $1 AND s.expires > now()`,
		values: [token]
	});
	if (rows.length === 0) return null;
	return {
		id: rows[0].id,
		email: rows[0].email,
		roles: rows.flatMap((r) => r.roles ?? []),
		/** @type {{ societyId: string, roles: string[] }[]} */
		memberships: rows
			.filter((r) => r.society_id !== null)
			.map((r) => ({ societyId: r.society_id, roles: r.roles ?? [] }))
	};
}

function scaleOf(/** @type {unknown} */ criteria) {
	return Array.isArray(criteria) ? criteria : DEFAULT_CRITERIA;
}

/** The sheet as the app answers it (SheetView), from a sheet named as SHEET_COLUMNS names it. */
function view(/** @type {any[]} */ criteria, /** @type {any} */ s, /** @type {string} */ viewer) {
	const deductions = s.deductions ?? {};
	let total = 0;
	for (const c of criteria) total += c.maxPoints - (deductions[c.key] ?? 0);
	return {
		entryId: s.entryId,
		kind: s.kind,
		version: s.version,
		deductions,
		comment: s.comment,
		notJudged: s.notJudgedReason
			? { reason: s.notJudgedReason, note: s.notJudgedNote ?? '' }
			: null,
		judgesChoiceRank: s.judgesChoiceRank,
		total,
		complete:
			s.notJudgedReason !== null || criteria.every((c) => typeof deductions[c.key] === 'number'),
		changedByOther: s.updatedBy !== null && s.updatedBy !== viewer
	};
}

/** The same checks as the app's schema and scale validation, in short. */
function validChange(/** @type {any} */ c) {
	return (
		c &&
		UUID.test(c.changeId ?? '') &&
		UUID.test(c.entryId ?? '') &&
		Number.isInteger(c.baseVersion) &&
		c.baseVersion >= 0 &&
		c.deductions &&
		typeof c.deductions === 'object'
	);
}

/** The sheet's columns, named as the app names them. */
const SHEET_COLUMNS = `id, entry_id AS "entryId", kind, deductions, comment,
	not_judged_reason AS "notJudgedReason", not_judged_note AS "notJudgedNote",
	judges_choice_rank AS "judgesChoiceRank", version, updated_by AS "updatedBy"`;

/**
 * The app's save transaction, statement for statement (lock and access; answer and sheet; writes),
 * sent as named statements (the bare limit: the app sends the same texts through Sequelize).
 */
async function saveSheet(/** @type {{id: string, email: string}} */ actor, /** @type {any} */ c) {
	const db = await pool.connect();
	try {
		await db.query('START TRANSACTION');
		const { rows: entries } = await db.query({
			name: 'judging_save_lock',
			text: `SELECT e.id AS entry_id, e.show_id AS entry_show_id, e.class_id,
			        sh.results_published_at AS locked, a.*
			   FROM entries e
			   JOIN shows sh ON sh.id = e.show_id
			   LEFT JOIN LATERAL (
			     SELECT s.id AS show_id, s.name AS show_name, s.society_id, s.panel_score_method AS method,
			            s.results_published_at AS published, p.id AS panel_id, p.name AS panel_name,
			            EXISTS (SELECT 1 FROM panel_judges pj WHERE pj.panel_id = p.id AND pj.user_id = $2) AS is_judge,
			            p.clerk_id IS NOT DISTINCT FROM CAST($2 AS uuid) AS is_clerk,
			            c.code, c.name, d.code || ' ' || d.name AS division,
			            sc.id AS scale_id, sc.name AS scale_name, sc.criteria,
			            (EXISTS (SELECT 1 FROM entries e WHERE e.class_id = c.id AND ${ACTIVE} AND e.exhibitor_id = $2)
			             OR EXISTS (
			              SELECT 1 FROM memberships mj
			                JOIN memberships me ON me.society_id = mj.society_id
			                 AND lower(trim(me.household)) = lower(trim(mj.household))
			                JOIN entries e ON e.exhibitor_id = me.user_id AND e.class_id = c.id AND ${ACTIVE}
			               WHERE mj.user_id = $2 AND mj.society_id = s.society_id
			                 AND coalesce(trim(mj.household), '') <> '')) AS conflict
			       FROM panel_classes pc
			       JOIN panels p ON p.id = pc.panel_id
			       JOIN classes c ON c.id = pc.class_id
			       JOIN divisions d ON d.id = c.division_id
			       JOIN shows s ON s.id = p.show_id
			       LEFT JOIN scales sc ON sc.id = c.scale_id
			      WHERE pc.class_id = e.class_id) a ON true
			  WHERE e.id = $1 AND ${ACTIVE}
			    FOR NO KEY UPDATE OF e FOR SHARE OF sh`,
			values: [c.entryId, actor.id]
		});
		const a = entries[0];
		if (!a) throw new Refusal('This entry is not in your classes.', 403);
		if (a.locked) throw new Refusal('Results are published.', 423);
		if (!a.show_id || (!a.is_judge && !a.is_clerk) || a.conflict) {
			throw new Refusal('This entry is not in your classes.', 403);
		}
		// The benchmark's show scores each judge's own sheet (mean of the panel).
		if (a.method !== 'mean' || !a.is_judge) throw new Refusal('Judges of mean panels only.', 403);
		const criteria = scaleOf(a.criteria);
		const { rows: states } = await db.query({
			name: 'judging_save_state_judge',
			text: `SELECT ac.user_id AS "appliedUserId", ac.response AS "appliedResponse",
			        (SELECT row_to_json(ss) FROM (SELECT ${SHEET_COLUMNS} FROM score_sheets
			          WHERE entry_id = $2 AND kind = 'judge' AND judge_id = $3) ss) AS sheet
			   FROM (VALUES (1)) AS one (x)
			   LEFT JOIN applied_changes ac ON ac.change_id = $1`,
			values: [c.changeId, a.entry_id, actor.id]
		});
		const state = states[0];
		if (state.appliedUserId) {
			await db.query('COMMIT');
			return { status: 'replayed', sheet: state.appliedResponse };
		}
		for (const [key, value] of Object.entries(c.deductions)) {
			const criterion = criteria.find((k) => k.key === key);
			if (!criterion || typeof value !== 'number' || value < 0 || value > criterion.maxPoints) {
				throw new Refusal(`Deduction ${key} is not allowed.`, 400);
			}
		}
		const sheet = state.sheet;
		const before = sheet ? view(criteria, sheet, actor.id) : null;
		const version = before?.version ?? 0;
		if (c.baseVersion !== version) {
			throw new Refusal('This sheet was changed meanwhile.', 409, before);
		}
		if (!sheet) throw new Refusal('The baseline only updates existing sheets.', 400);
		const stored = {
			...sheet,
			deductions: c.deductions,
			comment: c.comment ?? '',
			notJudgedReason: c.notJudged?.reason ?? null,
			notJudgedNote: c.notJudged?.note || null,
			judgesChoiceRank: c.judgesChoiceRank ?? null,
			version: version + 1,
			updatedBy: actor.id
		};
		const after = view(criteria, stored, actor.id);
		const audit = (/** @type {any} */ v) => ({
			version: v.version,
			deductions: v.deductions,
			total: v.total,
			comment: v.comment,
			notJudged: v.notJudged,
			judgesChoiceRank: v.judgesChoiceRank
		});
		const { rows: written } = await db.query({
			name: 'judging_save_write_update',
			text: `WITH sheet AS (
			   UPDATE score_sheets
			      SET deductions = CAST($1 AS jsonb), comment = $2, not_judged_reason = $3, not_judged_note = $4,
			          judges_choice_rank = $5, updated_by = $6, version = $7, updated_at = now()
			    WHERE id = $8 AND version = $9
			RETURNING id), audit AS (
			   INSERT INTO score_audit (show_id, sheet_id, entry_id, actor_id, actor_email, change_id, before, after)
			   SELECT CAST($10 AS uuid), sheet.id, CAST($11 AS uuid), CAST($6 AS uuid), CAST($12 AS text),
			          CAST($13 AS uuid), CAST($14 AS jsonb), CAST($15 AS jsonb)
			     FROM sheet)
			 INSERT INTO applied_changes (change_id, user_id, sheet_id, response)
			 SELECT CAST($13 AS uuid), CAST($6 AS uuid), sheet.id, CAST($16 AS jsonb) FROM sheet
			 RETURNING sheet_id`,
			values: [
				JSON.stringify(c.deductions),
				stored.comment,
				stored.notJudgedReason,
				stored.notJudgedNote,
				stored.judgesChoiceRank,
				actor.id,
				after.version,
				sheet.id,
				version,
				a.entry_show_id,
				a.entry_id,
				actor.email,
				c.changeId,
				JSON.stringify(audit(before)),
				JSON.stringify(audit(after)),
				JSON.stringify(after)
			]
		});
		if (written.length !== 1) throw new Error('The sheet moved while its entry was locked.');
		await db.query('COMMIT');
		return { status: 'saved', sheet: after };
	} catch (err) {
		await db.query('ROLLBACK').catch(() => {});
		throw err;
	} finally {
		db.release();
	}
}

/** @type {Map<string, (req: http.IncomingMessage, res: http.ServerResponse, match: RegExpExecArray) => Promise<void>>} */
const routes = new Map();

routes.set('PUT /api/judging/sheets', async (req, res) => {
	const user = await signedInUser(req);
	if (!user) return send(res, 401, { message: 'Sign in first.' });
	if (!user.roles.includes('judge') && !user.roles.includes('clerk')) {
		return send(res, 403, { message: 'Judges and clerks only.' });
	}
	let change;
	try {
		change = JSON.parse(await readBody(req));
	} catch {
		return send(res, 400, { message: 'Send the change as JSON.' });
	}
	if (!validChange(change)) return send(res, 400, { message: 'Bad change.' });
	try {
		send(res, 200, await saveSheet(user, change));
	} catch (err) {
		if (!(err instanceof Refusal)) throw err;
		send(res, err.status, { message: err.message, current: err.details });
	}
});

/**
 * The public results of a published show: the queries the app's results loader runs when its
 * cache is cold (show by address; classes, judges, entries and sheets; divisions, plants and
 * comments, awards, ties), on every request, grouped into division, class and entry as JSON.
 */
routes.set('GET /shows/:slug/results', async (_req, res, match) => {
	const { rows: shows } = await pool.query(
		`SELECT s.id, s.society_id, s.slug, s.name, so.name AS society_name, s.venue, s.judging_day,
		        s.schedule_published_at, s.results_published_at
		   FROM shows s JOIN societies so ON so.id = s.society_id WHERE s.slug = $1`,
		[match[1]]
	);
	const show = shows[0];
	if (!show || !show.results_published_at) return send(res, 404, { message: 'Not found' });
	const q = (/** @type {string} */ sql) => pool.query(sql, [show.id]).then((r) => r.rows);
	const [rules, classes, judges, entries, sheets, divisions, extras, awards, ties] =
		await Promise.all([
			q(`SELECT id, name, slug, panel_score_method AS method, award_rules, results_published_at AS published
			     FROM shows WHERE id = $1`),
			q(`SELECT c.id, c.code, c.name, d.id AS division_id, d.code || ' ' || d.name AS division,
			          p.id AS panel_id, p.name AS panel_name, sc.id AS scale_id, sc.name AS scale_name, sc.criteria
			     FROM classes c JOIN divisions d ON d.id = c.division_id
			     LEFT JOIN panel_classes pc ON pc.class_id = c.id
			     LEFT JOIN panels p ON p.id = pc.panel_id
			     LEFT JOIN scales sc ON sc.id = c.scale_id
			    WHERE c.show_id = $1 ORDER BY d.position, c.position`),
			q(`SELECT pj.panel_id, pj.user_id FROM panel_judges pj JOIN panels p ON p.id = pj.panel_id
			    WHERE p.show_id = $1`),
			q(`SELECT e.id, e.number, e.class_id, e.exhibitor_id, coalesce(u.name, u.email) AS exhibitor
			     FROM entries e JOIN users u ON u.id = e.exhibitor_id
			    WHERE e.show_id = $1 AND ${ACTIVE} ORDER BY e.number`),
			q(`SELECT entry_id, judge_id, deductions, not_judged_reason, judges_choice_rank
			     FROM score_sheets WHERE show_id = $1`),
			q('SELECT id, code, name FROM divisions WHERE show_id = $1 ORDER BY position, code'),
			q(`SELECT e.id, coalesce(v.name, e.title, '') AS plant, u.name AS exhibitor,
			          coalesce(array_agg(ss.comment ORDER BY ss.created_at, ss.id)
			                   FILTER (WHERE ss.comment <> '' AND ss.kind = (CASE WHEN sh.panel_score_method = 'consensus' THEN 'consensus' ELSE 'judge' END)),
			                   '{}') AS comments
			     FROM entries e
			     JOIN shows sh ON sh.id = e.show_id
			     JOIN users u ON u.id = e.exhibitor_id
			     LEFT JOIN varieties v ON v.id = e.variety_id
			     LEFT JOIN score_sheets ss ON ss.entry_id = e.id
			    WHERE e.show_id = $1 AND ${ACTIVE}
			    GROUP BY e.id, v.name, u.name`),
			q(`SELECT kind, entry_id, exhibitor_id, class_id, division_id, top_award_id, top_award_name,
			          level, score
			     FROM awards WHERE show_id = $1 ORDER BY position`),
			q('SELECT reason FROM award_ties WHERE show_id = $1 ORDER BY position')
		]);
	// The panel score: the mean of the judges' totals, as the app combines them.
	const criteriaOf = new Map(classes.map((c) => [c.id, scaleOf(c.criteria)]));
	/** @type {Map<string, any[]>} */
	const sheetsOf = new Map();
	for (const s of sheets) sheetsOf.set(s.entry_id, [...(sheetsOf.get(s.entry_id) ?? []), s]);
	const extra = new Map(extras.map((x) => [x.id, x]));
	/** @type {Map<string, any[]>} */
	const awardsOf = new Map();
	for (const a of awards) {
		if (a.entry_id) awardsOf.set(a.entry_id, [...(awardsOf.get(a.entry_id) ?? []), a]);
	}
	/** @type {Map<string, any[]>} */
	const entriesOf = new Map();
	for (const e of entries) {
		const criteria = criteriaOf.get(e.class_id) ?? DEFAULT_CRITERIA;
		const mine = sheetsOf.get(e.id) ?? [];
		const sum = mine.reduce(
			(n, s) => n + criteria.reduce((t, c) => t + c.maxPoints - (s.deductions[c.key] ?? 0), 0),
			0
		);
		const x = extra.get(e.id);
		const list = entriesOf.get(e.class_id) ?? [];
		list.push({
			number: e.number,
			plant: x?.plant ?? '',
			exhibitor: x?.exhibitor ?? e.exhibitor,
			score: mine.length ? Math.round((sum / mine.length) * 10) / 10 : null,
			awards: (awardsOf.get(e.id) ?? []).map((a) => a.level ?? a.kind),
			comments: x?.comments ?? []
		});
		entriesOf.set(e.class_id, list);
	}
	send(res, 200, {
		show: {
			slug: show.slug,
			name: show.name,
			societyName: show.society_name,
			rules: rules[0].award_rules
		},
		judges: judges.length,
		divisions: divisions.map((d) => ({
			code: d.code,
			name: d.name,
			classes: classes
				.filter((c) => c.division_id === d.id)
				.map((c) => ({ code: c.code, name: c.name, entries: entriesOf.get(c.id) ?? [] }))
		})),
		topAwards: awards.filter((a) => !a.entry_id || a.kind === 'top_award'),
		undecided: ties.map((t) => t.reason)
	});
});

/**
 * The chair's progress board: the queries the app's board runs (the show by address, then its
 * show, classes, judges, entries and sheets one after the other), each entry's panel result as
 * the app combines a mean panel's sheets, summed per class.
 */
routes.set('GET /api/chair/shows/:slug/board', async (req, res, match) => {
	const user = await signedInUser(req);
	if (!user) return send(res, 401, { message: 'Sign in first.' });
	if (!user.roles.includes('chair')) return send(res, 403, { message: 'Chairs only.' });
	const { rows: found } = await pool.query('SELECT * FROM shows WHERE slug = $1 LIMIT 1', [
		match[1]
	]);
	const found0 = found[0];
	if (!found0) return send(res, 404, { message: 'There is no show at this address.' });
	const chairs = user.memberships.some(
		(m) => m.societyId === found0.society_id && m.roles.includes('chair')
	);
	if (!chairs) return send(res, 403, { message: 'Chairs of the society only.' });
	const q = (/** @type {string} */ sql) => pool.query(sql, [found0.id]).then((r) => r.rows);
	const [show] = await q(
		`SELECT id, name, slug, panel_score_method AS method, award_rules, results_published_at AS published
		   FROM shows WHERE id = $1`
	);
	const classes = await q(
		`SELECT c.id, c.code, c.name, d.id AS division_id, d.code || ' ' || d.name AS division,
		        p.id AS panel_id, p.name AS panel_name, sc.id AS scale_id, sc.name AS scale_name, sc.criteria
		   FROM classes c JOIN divisions d ON d.id = c.division_id
		   LEFT JOIN panel_classes pc ON pc.class_id = c.id
		   LEFT JOIN panels p ON p.id = pc.panel_id
		   LEFT JOIN scales sc ON sc.id = c.scale_id
		  WHERE c.show_id = $1 ORDER BY d.position, c.position`
	);
	const judges = await q(
		`SELECT pj.panel_id, pj.user_id FROM panel_judges pj JOIN panels p ON p.id = pj.panel_id
		  WHERE p.show_id = $1`
	);
	const entries = await q(
		`SELECT e.id, e.number, e.class_id, e.exhibitor_id, coalesce(u.name, u.email) AS exhibitor
		   FROM entries e JOIN users u ON u.id = e.exhibitor_id
		  WHERE e.show_id = $1 AND ${ACTIVE} ORDER BY e.number`
	);
	const sheets = await q(
		`SELECT entry_id, judge_id, deductions, not_judged_reason, judges_choice_rank
		   FROM score_sheets WHERE show_id = $1`
	);
	/** @type {Map<string, string[]>} */
	const judgesOf = new Map();
	for (const j of judges)
		judgesOf.set(j.panel_id, [...(judgesOf.get(j.panel_id) ?? []), j.user_id]);
	/** @type {Map<string, any[]>} */
	const sheetsOf = new Map();
	for (const s of sheets) sheetsOf.set(s.entry_id, [...(sheetsOf.get(s.entry_id) ?? []), s]);
	/** A mean panel's result for one entry: its state and the sheets still missing. */
	const resultOf = (/** @type {any} */ c, /** @type {any} */ e) => {
		const panel = c.panel_id ? (judgesOf.get(c.panel_id) ?? []) : [];
		const criteria = c.scale_id && Array.isArray(c.criteria) ? c.criteria : DEFAULT_CRITERIA;
		const mine = sheetsOf.get(e.id) ?? [];
		const counted = [...panel]
			.sort()
			.map((id) => mine.find((s) => s.judge_id === id))
			.filter(Boolean);
		if (counted.some((s) => s.not_judged_reason !== null))
			return { state: 'not_judged', missing: 0 };
		const complete = counted.filter((s) =>
			criteria.every((/** @type {any} */ k) => typeof s.deductions?.[k.key] === 'number')
		);
		const missing = panel.length - complete.length;
		if (panel.length === 0 || missing > 0) {
			return { state: counted.length > 0 ? 'in_progress' : 'waiting', missing };
		}
		return { state: 'scored', missing: 0 };
	};
	/** @type {Map<string, any[]>} */
	const entriesOf = new Map();
	for (const e of entries) entriesOf.set(e.class_id, [...(entriesOf.get(e.class_id) ?? []), e]);
	const board = classes.map((c) => {
		const results = (entriesOf.get(c.id) ?? []).map((e) => resultOf(c, e));
		const scored = results.filter((r) => r.state === 'scored').length;
		const notJudged = results.filter((r) => r.state === 'not_judged').length;
		const left = results.length - scored - notJudged;
		const started = results.some((r) => r.state !== 'waiting');
		return {
			id: c.id,
			code: c.code,
			name: c.name,
			division: c.division,
			panel: c.panel_name,
			entries: results.length,
			scored,
			notJudged,
			left,
			missingSheets: results.reduce((n, r) => n + r.missing, 0),
			state:
				results.length === 0
					? 'no_entries'
					: c.panel_name === null
						? 'no_panel'
						: left === 0
							? 'judged'
							: started
								? 'in_progress'
								: 'waiting'
		};
	});
	const withEntries = board.filter((c) => c.entries > 0);
	send(res, 200, {
		published: show.published !== null,
		method: show.method,
		classesJudged: withEntries.filter((c) => c.state === 'judged').length,
		classesWithEntries: withEntries.length,
		entriesLeft: withEntries.reduce((n, c) => n + c.left, 0),
		sheetsMissing: withEntries.reduce((n, c) => n + c.missingSheets, 0),
		classes: board,
		checkedAt: new Date().toISOString()
	});
});

const server = http.createServer((req, res) => {
	const url = new URL(req.url ?? '/', 'http://127.0.0.1');
	const results = /^\/shows\/([a-z0-9-]+)\/results$/.exec(url.pathname);
	const board = /^\/api\/chair\/shows\/([a-z0-9-]+)\/board$/.exec(url.pathname);
	const key = results
		? `${req.method} /shows/:slug/results`
		: board
			? `${req.method} /api/chair/shows/:slug/board`
			: `${req.method} ${url.pathname}`;
	const route = routes.get(key);
	/** @type {Promise<void>} */
	let done;
	if (route) {
		done = route(req, res, results ?? board ?? /** @type {RegExpExecArray} */ (/./.exec('.')));
	} else if (req.method === 'GET' && url.pathname === '/health') {
		done = Promise.resolve(send(res, 200, { ok: true }));
	} else done = Promise.resolve(send(res, 404, { message: 'Not found' }));
	done.catch((err) => {
		console.error(err);
		if (!res.headersSent) send(res, 500, { message: 'Something went wrong.' });
	});
});

server.listen(port, '127.0.0.1', () => console.log(`baseline on http://127.0.0.1:${port}`));
const stop = () => server.close(() => void pool.end().then(() => process.exit(0)));
process.on('SIGTERM', stop);
process.on('SIGINT', stop);
