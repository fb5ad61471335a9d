/**
 * Score sheet saves through the built app (`node build`: adapter-node's own server, SvelteKit's
 * hooks, the route `PUT /api/judging/sheets`). The save has one way in: the hooks read the session
 * (one statement; Auth.js only for a session due for its daily extension), the guard lets judges
 * and clerks through, and the route answers with `answerSheetChange` (src/lib/server/judging/sheet-save.ts).
 * These are the answers a judge's tablet relies on, with the security headers of every API answer,
 * and what the app answers to saves it must not take. Runs against the demo seed of the fault
 * tests' private cluster, in a show of its own.
 */
import { randomBytes, randomUUID } from 'node:crypto';
import http from 'node:http';
import pg from 'pg';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import { createJudgingShow, type JudgingShow } from '../e2e/support/judging-fixture';
import { freePort } from './support/ports';
import { startBuiltApp, stopProcess, type Started } from './support/processes';

const cluster = inject('faultCluster');

/** The security headers and the fallback policy of API answers (src/lib/server/http/security-headers.ts). */
const SECURITY_HEADERS: Record<string, string> = {
	'x-content-type-options': 'nosniff',
	'referrer-policy': 'same-origin',
	'x-frame-options': 'DENY',
	'permissions-policy': 'camera=(self), geolocation=(), microphone=()'
};
const FALLBACK_CSP =
	"default-src 'none'; style-src 'unsafe-inline'; img-src 'self'; frame-ancestors 'none'; base-uri 'none'; form-action 'self'";

/** The published scale: 25/25/25/15/10 = 100 ("A Beginner's Guide to Judging", AVM 1993, rev. 2020 (DOMAIN.md)). */
const CRITERIA = [
	'symmetry',
	'condition',
	'quantity_of_bloom',
	'size_and_type_of_blossom',
	'color_of_blossom'
];

let app: Started & { origin: string };
let db: pg.Client;
let show: JudgingShow;
const cookies: Record<'judge' | 'due' | 'exhibitor' | 'expired', string> = {
	judge: '',
	due: '',
	exhibitor: '',
	expired: ''
};

function deductions(d: number[]): Record<string, number> {
	return Object.fromEntries(CRITERIA.map((key, i) => [key, d[i]]));
}

function change(baseVersion: number, d: Record<string, unknown>, entryId: string) {
	return {
		changeId: randomUUID(),
		entryId,
		baseVersion,
		deductions: d,
		comment: '',
		notJudged: null,
		judgesChoiceRank: null
	};
}

/** A database session as the e-mail link sign-in leaves it, expiring after `days`. */
async function session(email: string, days: number): Promise<string> {
	const token = randomBytes(32).toString('hex');
	await db.query(
		`INSERT INTO sessions (session_token, user_id, expires)
		 SELECT $1, id, now() + make_interval(secs => $2::float8 * 86400) FROM users WHERE email = $3`,
		[token, days, email]
	);
	return `authjs.session-token=${token}`;
}

async function sheetVersion(entryId: string): Promise<number[]> {
	const { rows } = await db.query<{ version: number }>(
		'SELECT version FROM score_sheets WHERE entry_id = $1 ORDER BY version',
		[entryId]
	);
	return rows.map((r) => r.version);
}

async function put(
	body: string,
	options: { cookie?: string; type?: string; path?: string; method?: string; origin?: string } = {}
) {
	const res = await fetch(
		`${options.origin ?? app.origin}${options.path ?? '/api/judging/sheets'}`,
		{
			method: options.method ?? 'PUT',
			headers: {
				'content-type': options.type ?? 'application/json',
				accept: 'application/json',
				...(options.cookie ? { cookie: options.cookie } : {})
			},
			body
		}
	);
	const text = await res.text();
	return { status: res.status, headers: res.headers, text };
}

beforeAll(async () => {
	process.env.DATABASE_URL = cluster.databaseUrl; // for the judging fixture
	db = new pg.Client({ connectionString: cluster.databaseUrl });
	await db.connect();
	show = await createJudgingShow(8);
	// Sessions last 30 days and are extended once a day (auth.ts): 29.5 days left is not yet due,
	// 28 days left is due for the extension, which Auth.js makes.
	cookies.judge = await session('judge1@crownbench.test', 29.5);
	cookies.due = await session('judge1@crownbench.test', 28);
	cookies.exhibitor = await session('exhibitor1@crownbench.test', 29.5);
	cookies.expired = await session('judge1@crownbench.test', -1);
	app = await startBuiltApp({
		name: 'app-sheet-save',
		port: await freePort(),
		databaseUrl: cluster.databaseUrl,
		smtpPort: await freePort() // no mail in this test
	});
});

afterAll(async () => {
	if (app) await stopProcess(app);
	await db?.end();
});

describe('score sheet saves through SvelteKit', () => {
	it('saves a judge’s change, with the security headers, and the sheet is stored', async () => {
		const entryId = show.entries[0].id;
		const answer = await put(JSON.stringify(change(0, deductions([1, 0.5, 0, 0, 0]), entryId)), {
			cookie: cookies.judge
		});
		expect(answer.status).toBe(200);
		// 25/25/25/15/10 = 100 points less 1.5 ("A Beginner's Guide to Judging", AVM 1993, rev. 2020 (DOMAIN.md)).
		expect(JSON.parse(answer.text)).toMatchObject({
			status: 'saved',
			sheet: { version: 1, total: 98.5, complete: true }
		});
		expect(answer.headers.get('content-type')).toBe('application/json');
		expect(answer.headers.get('content-security-policy')).toBe(FALLBACK_CSP);
		for (const [name, value] of Object.entries(SECURITY_HEADERS)) {
			expect(answer.headers.get(name)).toBe(value);
		}
		const { rows } = await db.query<{ count: string }>(
			'SELECT count(*) FROM score_audit WHERE entry_id = $1',
			[entryId]
		);
		expect(rows[0].count).toBe('1');
	});

	it('answers refusals: a conflict with the current sheet, bad points with problems, not JSON', async () => {
		const entryId = show.entries[1].id;
		expect(
			(await put(JSON.stringify(change(0, { symmetry: 1 }, entryId)), { cookie: cookies.judge }))
				.status
		).toBe(200);
		const conflict = await put(JSON.stringify(change(0, { symmetry: 2 }, entryId)), {
			cookie: cookies.judge
		});
		expect(conflict.status).toBe(409);
		expect(JSON.parse(conflict.text)).toMatchObject({ current: { version: 1 } });
		const badPoints = await put(JSON.stringify(change(1, { symmetry: 0.3 }, entryId)), {
			cookie: cookies.judge
		});
		expect(badPoints.status).toBe(400);
		expect(JSON.parse(badPoints.text).problems).toEqual([
			expect.objectContaining({ message: expect.stringMatching(/whole or half points/) })
		]);
		const notJson = await put('{"changeId":', { cookie: cookies.judge });
		expect([notJson.status, JSON.parse(notJson.text)]).toEqual([
			400,
			{ message: 'Send the change as JSON.' }
		]);
		const badShape = await put(JSON.stringify({ entryId: 'x' }), { cookie: cookies.judge });
		expect(badShape.status).toBe(400);
		expect(JSON.parse(badShape.text).problems.length).toBeGreaterThan(0);
		for (const refused of [conflict, badPoints, notJson, badShape]) {
			expect(refused.headers.get('content-security-policy')).toBe(FALLBACK_CSP);
		}
		expect(await sheetVersion(entryId)).toEqual([1]);
	});

	it('refuses an entry outside the judge’s classes, and keeps nothing', async () => {
		const answer = await put(JSON.stringify(change(0, { symmetry: 1 }, show.otherEntryId)), {
			cookie: cookies.judge
		});
		expect(answer.status).toBe(403);
		expect(await sheetVersion(show.otherEntryId)).toEqual([]);
	});

	it('refuses saves without a live session of a judge or clerk, and keeps nothing', async () => {
		const entryId = show.entries[2].id;
		const body = JSON.stringify(change(0, { symmetry: 1 }, entryId));
		const cases: [string, Parameters<typeof put>[1], number][] = [
			['no session', {}, 401],
			['an unknown session', { cookie: 'authjs.session-token=nothing-like-it' }, 401],
			['an expired session', { cookie: cookies.expired }, 401],
			['a member who is neither judge nor clerk', { cookie: cookies.exhibitor }, 403],
			// SvelteKit's own check: a form-like body from no page of ours.
			['a form-like content type', { cookie: cookies.judge, type: 'text/plain' }, 403],
			['another method', { cookie: cookies.judge, method: 'POST' }, 405]
		];
		for (const [what, options, status] of cases) {
			const answer = await put(body, options);
			expect({ what, status: answer.status }).toEqual({ what, status });
			// SvelteKit answers its own cross-site check before any hook runs, without our headers.
			if (options?.type !== 'text/plain') {
				expect(answer.headers.get('x-content-type-options')).toBe('nosniff');
			}
		}
		expect(await sheetVersion(entryId)).toEqual([]);
	});

	it('saves with a session due for its extension (Auth.js extends it) and on the same path with a query', async () => {
		const due = await put(JSON.stringify(change(0, { symmetry: 1 }, show.entries[3].id)), {
			cookie: cookies.due
		});
		expect([due.status, JSON.parse(due.text).status]).toEqual([200, 'saved']);
		expect(due.headers.get('set-cookie') ?? '').toMatch(/authjs\.session-token=/);
		const query = await put(JSON.stringify(change(0, { symmetry: 1 }, show.entries[4].id)), {
			cookie: cookies.judge,
			path: '/api/judging/sheets?x=1'
		});
		expect(query.status).toBe(200);
		expect(await sheetVersion(show.entries[3].id)).toEqual([1]);
		expect(await sheetVersion(show.entries[4].id)).toEqual([1]);
	});

	it('reads a body sent in chunks of unstated length, and refuses an over-long comment', async () => {
		const entryId = show.entries[5].id;
		const chunked = await new Promise<number>((resolve, reject) => {
			const req = http.request(`${app.origin}/api/judging/sheets`, {
				method: 'PUT',
				headers: { 'content-type': 'application/json', cookie: cookies.judge }
			});
			req.on('response', (res) => {
				res.resume();
				resolve(res.statusCode ?? 0);
			});
			req.on('error', reject);
			req.write(JSON.stringify(change(0, { symmetry: 1 }, entryId)));
			req.end();
		});
		expect(chunked).toBe(200);
		const long = await put(
			JSON.stringify({ ...change(1, {}, entryId), comment: 'x'.repeat(70_000) }),
			{ cookie: cookies.judge }
		);
		expect(long.status).toBe(400);
		expect(await sheetVersion(entryId)).toEqual([1]);
	});

	it('refuses a body over BODY_SIZE_LIMIT (adapter-node stops reading it), and saves a small one', async () => {
		const small = await startBuiltApp({
			name: 'app-sheet-save-1k',
			port: await freePort(),
			databaseUrl: cluster.databaseUrl,
			smtpPort: await freePort(),
			env: { BODY_SIZE_LIMIT: '1K' }
		});
		try {
			const entryId = show.entries[6].id;
			const long = JSON.stringify({ ...change(0, {}, entryId), comment: 'x'.repeat(1100) });
			const fits = JSON.stringify(change(0, { symmetry: 1 }, entryId));
			const send = (body: string) =>
				put(body, { cookie: cookies.judge, origin: small.origin }).then((a) => a.status);
			// The route cannot read the body adapter-node refused: it answers "Send the change as JSON."
			expect([await send(long), await send(fits)]).toEqual([400, 200]);
			expect(await sheetVersion(entryId)).toEqual([1]);
		} finally {
			await stopProcess(small);
		}
	});

	// i-sec: text no one can type is refused with 400 (sheet-save.ts).
	it('refuses a NUL or a lone surrogate in a comment or note with 400, and keeps nothing', async () => {
		const entryId = show.entries[7].id;
		const before = await sheetVersion(entryId);
		for (const bad of ['ok\u0000ok', 'half \ud83c of a flower', 'tail \udf38', '\u0000']) {
			const withComment = { ...change(0, deductions([1, 0, 0, 0, 0]), entryId), comment: bad };
			// JSON.stringify writes a lone surrogate as its \u escape, as a tablet's browser does.
			const answer = await put(JSON.stringify(withComment), { cookie: cookies.judge });
			expect(answer.status).toBe(400);
			expect(JSON.parse(answer.text).message).toMatch(/unusual characters/);
			const withNote = { ...change(0, {}, entryId), notJudged: { reason: 'pests', note: bad } };
			expect((await put(JSON.stringify(withNote), { cookie: cookies.judge })).status).toBe(400);
		}
		expect(await sheetVersion(entryId)).toEqual(before);
		// A whole flower (a surrogate pair) is fine.
		const fine = {
			...change(before.at(-1) ?? 0, deductions([1, 0, 0, 0, 0]), entryId),
			comment: 'a \ud83c\udf38'
		};
		expect((await put(JSON.stringify(fine), { cookie: cookies.judge })).status).toBe(200);
	});
});
