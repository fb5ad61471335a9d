import { randomBytes } from 'node:crypto';
import http from 'node:http';
import type { AddressInfo } from 'node:net';
import { QueryTypes } from 'sequelize';
import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest';
import { sequelize } from '../../src/lib/server/db';
import { fastLane } from '../../src/lib/server/fast-lane';
import { FALLBACK_CSP, SECURITY_HEADERS } from '../../src/lib/server/security-headers';
import {
	buildFixture,
	deductions,
	removeFixtures,
	sheetChange,
	sheetVersion,
	type Fixture
} from './judging-fixture';

/**
 * The fast lane in front of a stand-in for SvelteKit's handler (which answers 299 and counts what
 * it was passed): the lane answers plain saves of allowed people itself, the same way the route
 * does, and passes everything else on unread.
 */
let server: http.Server;
let base: string;
let passedOn: { method?: string; body: string }[] = [];
let f: Fixture;
const cookies: Record<'judge' | 'due' | 'exhibitor' | 'expired', string> = {
	judge: '',
	due: '',
	exhibitor: '',
	expired: ''
};

/** A database session as the e-mail link sign-in leaves it, expiring after `days`. */
async function session(userId: string, days: number): Promise<string> {
	const token = randomBytes(32).toString('hex');
	await sequelize.query(
		`INSERT INTO sessions (session_token, user_id, expires)
		 VALUES (:token, :userId, now() + make_interval(secs => :days * 86400))`,
		{ replacements: { token, userId, days } }
	);
	return `authjs.session-token=${token}`;
}

beforeAll(async () => {
	f = await buildFixture();
	// Sessions last 30 days and are extended once a day (auth.ts): 29.5 days left is not yet due,
	// 28 days left is due for the extension, which only Auth.js (behind the lane) makes.
	cookies.judge = await session(f.judges[0].id, 29.5);
	cookies.due = await session(f.judges[0].id, 28);
	cookies.exhibitor = await session(f.exhibitors[0].id, 29.5);
	cookies.expired = await session(f.judges[0].id, -1);
	server = http.createServer((req, res) =>
		fastLane(req, res, () => {
			const chunks: Buffer[] = [];
			req.on('data', (c: Buffer) => chunks.push(c));
			req.on('end', () => {
				passedOn.push({ method: req.method, body: Buffer.concat(chunks).toString('utf8') });
				res.writeHead(299);
				res.end('passed on');
			});
		})
	);
	await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
	base = `http://127.0.0.1:${(server.address() as AddressInfo).port}`;
});

afterAll(async () => {
	server.closeAllConnections();
	await new Promise((resolve) => server.close(resolve));
	await removeFixtures();
});

function change(baseVersion: number, d: Record<string, unknown>, entryId = f.entries[0].id) {
	return sheetChange(entryId, baseVersion, d);
}

async function put(
	body: string,
	options: { cookie?: string; type?: string; path?: string; method?: string } = {}
) {
	passedOn = [];
	const res = await fetch(`${base}${options.path ?? '/api/judging/sheets'}`, {
		method: options.method ?? 'PUT',
		headers: {
			'content-type': options.type ?? 'application/json',
			...(options.cookie ? { cookie: options.cookie } : {})
		},
		body
	});
	const text = await res.text();
	return { status: res.status, headers: res.headers, text, passedOn };
}

describe('the fast lane for score sheet saves', () => {
	it('saves a judge’s change itself, with the security headers, and the sheet is stored', async () => {
		const answer = await put(JSON.stringify(change(0, deductions([1, 0.5, 0, 0, 0]))), {
			cookie: cookies.judge
		});
		expect(answer.passedOn).toEqual([]);
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
		const [row] = await sequelize.query<{ count: string }>(
			`SELECT count(*) FROM score_audit WHERE entry_id = :entryId`,
			{ replacements: { entryId: f.entries[0].id }, type: QueryTypes.SELECT }
		);
		expect(row.count).toBe('1');
	});

	it('answers refusals as the route does: a conflict with the current sheet, bad points with problems', async () => {
		const entryId = f.entries[1].id;
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
		expect([conflict, badPoints, notJson, badShape].flatMap((a) => a.passedOn)).toEqual([]);
		expect(await sheetVersion(entryId)).toEqual([1]);
	});

	it('refuses an entry outside the judge’s classes itself, and keeps nothing', async () => {
		const answer = await put(JSON.stringify(change(0, { symmetry: 1 }, f.otherEntry)), {
			cookie: cookies.judge
		});
		expect([answer.status, answer.passedOn]).toEqual([403, []]);
		expect(await sheetVersion(f.otherEntry)).toEqual([]);
	});

	it('passes on, unread, every request it should not answer', async () => {
		const body = JSON.stringify(change(0, { symmetry: 1 }, f.entries[2].id));
		const cases: [string, Parameters<typeof put>[1]][] = [
			['no session', {}],
			['an unknown session', { cookie: 'authjs.session-token=nothing-like-it' }],
			['an expired session', { cookie: cookies.expired }],
			['a session due for its extension', { cookie: cookies.due }],
			['a member who is neither judge nor clerk', { cookie: cookies.exhibitor }],
			['a form-like content type', { cookie: cookies.judge, type: 'text/plain' }],
			['another path', { cookie: cookies.judge, path: '/api/judging/sheets?x=1' }],
			['another method', { cookie: cookies.judge, method: 'POST' }]
		];
		for (const [what, options] of cases) {
			const answer = await put(body, options);
			expect({ what, status: answer.status, passedOn: answer.passedOn }).toEqual({
				what,
				status: 299,
				passedOn: [{ method: options?.method ?? 'PUT', body }]
			});
		}
		expect(await sheetVersion(f.entries[2].id)).toEqual([]);
	});

	it('passes on a body sent in chunks of unstated length, and one over its limit', async () => {
		const chunked = await new Promise<number>((resolve, reject) => {
			const req = http.request(`${base}/api/judging/sheets`, {
				method: 'PUT',
				headers: { 'content-type': 'application/json', cookie: cookies.judge }
			});
			req.on('response', (res) => {
				res.resume();
				resolve(res.statusCode ?? 0);
			});
			req.on('error', reject);
			req.write(JSON.stringify(change(0, { symmetry: 1 }, f.entries[2].id)));
			req.end();
		});
		expect(chunked).toBe(299);
		const long = await put(JSON.stringify({ ...change(0, {}), comment: 'x'.repeat(70_000) }), {
			cookie: cookies.judge
		});
		expect(long.status).toBe(299);
		expect(await sheetVersion(f.entries[2].id)).toEqual([]);
	});

	it('passes on every save when BODY_SIZE_LIMIT is set below its own limit', async () => {
		const before = process.env.BODY_SIZE_LIMIT;
		process.env.BODY_SIZE_LIMIT = '1K';
		vi.resetModules();
		try {
			const fresh = await import('../../src/lib/server/fast-lane');
			const small = JSON.stringify(change(0, { symmetry: 1 }, f.entries[2].id));
			const long = JSON.stringify({ ...change(0, {}, f.entries[2].id), comment: 'x'.repeat(1100) });
			const taken: string[] = [];
			const lane = http.createServer((req, res) =>
				fresh.fastLane(req, res, () => {
					taken.push('passed on');
					req.resume();
					res.writeHead(299).end();
				})
			);
			await new Promise<void>((resolve) => lane.listen(0, '127.0.0.1', resolve));
			const url = `http://127.0.0.1:${(lane.address() as AddressInfo).port}/api/judging/sheets`;
			const send = (body: string) =>
				fetch(url, {
					method: 'PUT',
					headers: { 'content-type': 'application/json', cookie: cookies.judge },
					body
				}).then((r) => r.status);
			expect([await send(long), await send(small)]).toEqual([299, 200]);
			expect(taken).toEqual(['passed on']);
			lane.closeAllConnections();
			await new Promise((resolve) => lane.close(resolve));
		} finally {
			if (before === undefined) delete process.env.BODY_SIZE_LIMIT;
			else process.env.BODY_SIZE_LIMIT = before;
			vi.resetModules();
		}
	});

	// i-sec: text no one can type is refused with 400, on the lane as on the route (sheet-save.ts).
	it('refuses a NUL or a lone surrogate in a comment or note with 400, and keeps nothing', async () => {
		const entryId = f.entries[2].id;
		const before = await sheetVersion(entryId);
		for (const bad of ['ok\u0000ok', 'half \ud83c of a flower', 'tail \udf38', '\u0000']) {
			const withComment = { ...change(0, deductions([1, 0, 0, 0, 0]), entryId), comment: bad };
			// JSON.stringify writes a lone surrogate as its \u escape, as a tablet's browser does.
			const answer = await put(JSON.stringify(withComment), { cookie: cookies.judge });
			expect([answer.status, answer.passedOn.length]).toEqual([400, 0]);
			expect(JSON.parse(answer.text).message).toMatch(/unusual characters/);
			const withNote = {
				...change(0, {}, entryId),
				notJudged: { reason: 'pests', note: bad }
			};
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
