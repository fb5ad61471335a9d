/**
 * Fault: PostgreSQL stops and starts again while judges save score sheets.
 *
 * The built app runs against the private cluster; eight tablets (two judges, four each) save
 * sheets through PUT /api/judging/sheets as the scoresheet page does, retrying a change with the
 * same change id after a 5xx or a lost answer, as the tablet's queue does (src/lib/judging/sheet-outbox.ts).
 * The test stops the cluster in the middle of the load and starts it again. Expected: while it is
 * down the app answers 503 with a plain message (no hang, no crash); afterwards the same app
 * process saves again; and every sheet in the database is exactly the last version its tablet
 * was told was saved, each version written whole (sheet, audit row and applied change together).
 */
import { randomBytes, randomUUID } from 'node:crypto';
import pg from 'pg';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import { createJudgingShow, type JudgingShow } from '../e2e/support/judging-fixture';
import { startCluster, stopCluster } from './support/cluster';
import { freePort } from './support/ports';
import { logTail, startBuiltApp, stopProcess, type Started } from './support/processes';
import { pause, waitFor } from './support/wait';

const cluster = inject('faultCluster');
const DOWN_MESSAGE = 'Crownbench cannot reach its database just now; please try again in a moment.';

interface Judge {
	email: string;
	id: string;
	cookie: string;
}

interface Change {
	changeId: string;
	entryId: string;
	baseVersion: number;
	deductions: Record<string, number>;
	comment: string;
	notJudged: null;
	judgesChoiceRank: null;
}

/** What a tablet was told: the saved version of each of its sheets and what it holds. */
interface Acked {
	version: number;
	deductions: Record<string, number>;
	comment: string;
}

interface Tablet {
	name: string;
	judge: Judge;
	entries: string[];
	acked: Map<string, Acked>;
	sent: Map<string, Change>;
	saves: number;
	/** Answers that meant "try again": 5xx statuses with their messages, and lost connections. */
	retries: { status: number | 'lost'; message: string }[];
	failures: string[];
}

let app: Started & { origin: string };
let db: pg.Client;
let show: JudgingShow;
let criterion: { key: string; maxPoints: number };
let judges: Judge[] = [];
let stopLoad = false;

async function signInJudge(email: string): Promise<Judge> {
	// A database session, as the e-mail link sign-in leaves it (30 days; the bench does the same).
	const token = randomBytes(32).toString('hex');
	const { rows } = await db.query<{ id: string }>(
		`INSERT INTO sessions (session_token, user_id, expires)
		 SELECT $1, id, now() + interval '30 days' FROM users WHERE email = $2 RETURNING user_id AS id`,
		[token, email]
	);
	return { email, id: rows[0].id, cookie: `authjs.session-token=${token}` };
}

type Answer =
	| { kind: 'saved'; status: string; sheet: { version: number; comment: string } }
	| { kind: 'retry'; status: number | 'lost'; message: string }
	| { kind: 'wrong'; detail: string };

/** Sends one change as the tablet does and sorts the answer. */
async function send(judge: Judge, change: Change): Promise<Answer> {
	let response: Response;
	try {
		response = await fetch(`${app.origin}/api/judging/sheets`, {
			method: 'PUT',
			headers: {
				cookie: judge.cookie,
				'content-type': 'application/json',
				accept: 'application/json'
			},
			body: JSON.stringify(change),
			signal: AbortSignal.timeout(60_000)
		});
	} catch (error) {
		const err = error as Error & { cause?: { code?: string } };
		if (err.name === 'TimeoutError')
			return { kind: 'wrong', detail: 'the app did not answer (hang)' };
		return { kind: 'retry', status: 'lost', message: err.cause?.code ?? err.message };
	}
	const body = (await response.json().catch(() => ({}))) as {
		message?: string;
		status?: string;
		sheet?: { version: number; comment: string };
	};
	if (response.status === 200 && body.sheet) {
		return { kind: 'saved', status: body.status ?? '', sheet: body.sheet };
	}
	if (response.status >= 500) {
		return { kind: 'retry', status: response.status, message: body.message ?? '' };
	}
	return { kind: 'wrong', detail: `${response.status} ${JSON.stringify(body)}` };
}

/** One tablet: saves its sheets in turn, each change retried until the app says it is saved. */
async function runTablet(tablet: Tablet): Promise<void> {
	for (let n = 1; !stopLoad; n++) {
		const entryId = tablet.entries[n % tablet.entries.length];
		const before = tablet.acked.get(entryId);
		const change: Change = {
			changeId: randomUUID(),
			entryId,
			baseVersion: before?.version ?? 0,
			deductions: { [criterion.key]: n % (criterion.maxPoints + 1) },
			comment: `${tablet.name}, change ${n}`,
			notJudged: null,
			judgesChoiceRank: null
		};
		tablet.sent.set(change.changeId, change);
		for (;;) {
			const answer = await send(tablet.judge, change);
			if (answer.kind === 'saved') {
				if (answer.sheet.comment !== change.comment) {
					tablet.failures.push(`answer for ${change.changeId} holds "${answer.sheet.comment}"`);
					return;
				}
				tablet.acked.set(entryId, {
					version: answer.sheet.version,
					deductions: change.deductions,
					comment: change.comment
				});
				tablet.saves++;
				break;
			}
			if (answer.kind === 'wrong') {
				tablet.failures.push(`${change.changeId}: ${answer.detail}`);
				return;
			}
			tablet.retries.push({ status: answer.status, message: answer.message });
			if (!app.running()) {
				tablet.failures.push('the app process ended');
				return;
			}
			await pause(50); // the tablet's retry pace, not a wait for the database
		}
	}
}

beforeAll(async () => {
	process.env.DATABASE_URL = cluster.databaseUrl; // for the judging fixture
	db = new pg.Client({ connectionString: cluster.databaseUrl });
	await db.connect();
	show = await createJudgingShow(8, { judges: ['judge1', 'judge2'] });
	const { rows } = await db.query<{ criteria: { key: string; maxPoints: number }[] }>(
		'SELECT s.criteria FROM classes c JOIN scales s ON s.id = c.scale_id WHERE c.id = $1',
		[show.classId]
	);
	criterion = rows[0].criteria.reduce((a, b) => (b.maxPoints > a.maxPoints ? b : a));
	judges = [
		await signInJudge('judge1@crownbench.test'),
		await signInJudge('judge2@crownbench.test')
	];
	await db.end();
	app = await startBuiltApp({
		name: 'app-db-restart',
		port: await freePort(),
		databaseUrl: cluster.databaseUrl,
		smtpPort: await freePort() // no mail in this test
	});
});

afterAll(async () => {
	stopLoad = true;
	if (app) await stopProcess(app);
	// Leave the cluster running for the next file whatever happened here.
	await startCluster(cluster);
});

describe('the database restarts while judges save score sheets', () => {
	it('answers 503 while it is down, recovers without a restart and keeps every sheet whole', async () => {
		const tablets: Tablet[] = judges.flatMap((judge, j) =>
			[0, 1, 2, 3].map((t) => ({
				name: `judge ${j + 1} tablet ${t + 1}`,
				judge,
				entries: show.entries.slice(t * 2, t * 2 + 2).map((e) => e.id),
				acked: new Map(),
				sent: new Map(),
				saves: 0,
				retries: [],
				failures: []
			}))
		);
		const pid = app.pid;
		const running = tablets.map((t) => runTablet(t));
		const failed = () => tablets.flatMap((t) => t.failures);
		const allHave = (what: string, test: (t: Tablet) => boolean) =>
			waitFor(what, () => {
				if (failed().length > 0) throw new Error(failed().join('; '));
				return tablets.every(test);
			});

		// 1. Load running: every tablet has saved a few times.
		await allHave('three saves from every tablet', (t) => t.saves >= 3);

		// 2. PostgreSQL goes away (fast shutdown ends its sessions; pg_ctl waits until it stopped).
		await stopCluster(cluster);
		const savesAtStop = tablets.map((t) => t.saves);
		const retriesAtStop = tablets.map((t) => t.retries.length);
		await allHave(
			'every tablet to be told to try again',
			(t) => t.retries.length > retriesAtStop[tablets.indexOf(t)]
		);

		// While it is down: the API and a page answer 503 with the message, promptly.
		const probe = await send(judges[0], {
			changeId: randomUUID(),
			entryId: show.entries[0].id,
			baseVersion: 0,
			deductions: {},
			comment: 'probe',
			notJudged: null,
			judgesChoiceRank: null
		});
		expect(probe).toEqual({ kind: 'retry', status: 503, message: DOWN_MESSAGE });
		const page = await fetch(`${app.origin}/judging`, {
			headers: { cookie: judges[0].cookie },
			signal: AbortSignal.timeout(60_000)
		});
		expect(page.status).toBe(503);
		expect(await page.text()).toContain('Crownbench cannot reach its database just now');

		// 3. PostgreSQL is back; the same app process saves again.
		await startCluster(cluster);
		await allHave(
			'three more saves from every tablet',
			(t) => t.saves >= savesAtStop[tablets.indexOf(t)] + 3
		);
		stopLoad = true;
		await Promise.all(running);
		expect(failed()).toEqual([]);
		expect(app.running(), logTail(app)).toBe(true);
		expect(app.pid).toBe(pid);

		// Every "try again" was a 503 with the message, or a connection the app closed.
		const unexpected = tablets
			.flatMap((t) => t.retries)
			.filter((r) => !(r.status === 503 && r.message === DOWN_MESSAGE) && r.status !== 'lost');
		expect(unexpected).toEqual([]);
		const retries = tablets.flatMap((t) => t.retries);
		console.log(
			`database restart: ${tablets.reduce((n, t) => n + t.saves, 0)} saves acknowledged by app pid ${pid}; ` +
				`${retries.filter((r) => r.status === 503).length} answers 503 and ` +
				`${retries.filter((r) => r.status === 'lost').length} lost connections while it was down`
		);

		// 4. The database holds exactly what the tablets were told, each version whole.
		db = new pg.Client({ connectionString: cluster.databaseUrl });
		await db.connect();
		try {
			const { rows: sheets } = await db.query<{
				id: string;
				entry_id: string;
				judge_id: string;
				version: number;
				deductions: Record<string, number>;
				comment: string;
				audits: number;
				applied: number;
			}>(
				`SELECT s.id, s.entry_id, s.judge_id, s.version, s.deductions, s.comment,
				        (SELECT count(*)::int FROM score_audit a WHERE a.sheet_id = s.id) AS audits,
				        (SELECT count(*)::int FROM applied_changes c WHERE c.sheet_id = s.id) AS applied
				   FROM score_sheets s WHERE s.show_id = $1`,
				[show.showId]
			);
			const expected = tablets.flatMap((t) =>
				[...t.acked].map(([entryId, a]) => ({
					entry_id: entryId,
					judge_id: t.judge.id,
					version: a.version,
					deductions: a.deductions,
					comment: a.comment,
					audits: a.version,
					applied: a.version
				}))
			);
			const key = (s: { entry_id: string; judge_id: string }) => `${s.entry_id}/${s.judge_id}`;
			expect(
				sheets.map(({ id: _id, ...s }) => s).sort((a, b) => key(a).localeCompare(key(b)))
			).toEqual(expected.sort((a, b) => key(a).localeCompare(key(b))));

			// Each audit row is one whole change a tablet sent, stored with the version it made.
			const { rows: audits } = await db.query<{
				change_id: string;
				entry_id: string;
				after: { version: number; deductions: Record<string, number>; comment: string };
			}>('SELECT change_id, entry_id, after FROM score_audit WHERE show_id = $1', [show.showId]);
			const sent = new Map(tablets.flatMap((t) => [...t.sent]));
			for (const audit of audits) {
				const change = sent.get(audit.change_id);
				expect(change, `audit row of an unknown change ${audit.change_id}`).toBeDefined();
				expect([audit.entry_id, audit.after.comment, audit.after.deductions]).toEqual([
					change!.entryId,
					change!.comment,
					change!.deductions
				]);
				expect(audit.after.version).toBe(change!.baseVersion + 1);
			}
			const { rows: awards } = await db.query<{ n: number }>(
				'SELECT count(*)::int AS n FROM awards WHERE show_id = $1',
				[show.showId]
			);
			expect(awards[0].n).toBe(0);
		} finally {
			await db.end();
		}
	});
});
