/**
 * Faults while the chair publishes results (the judged autumn show of the demo seed), through the
 * built app and the real form action:
 * - the app process is killed with SIGKILL in the middle of the publishing transaction: nothing of
 *   it is kept (no awards, no ties, no publishing time, no placements e-mails), and a new process
 *   publishes again as if the first attempt never happened;
 * - the mail server is down (the SMTP fake stopped) while publishing: publishing still succeeds,
 *   every placements e-mail waits in the outbox, and once the server is back each arrives once.
 *
 * To stop publishing in the middle deterministically, another connection holds an uncommitted
 * outbox row with the dedupe key of one placements e-mail: the publishing transaction has written
 * its awards, ties and publishing time and waits on that row when it queues the e-mails (its last
 * write). The test waits for that wait in pg_stat_activity, kills the app, then lets go.
 */
import { randomBytes } from 'node:crypto';
import pg from 'pg';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import { freePort } from './support/ports';
import {
	logTail,
	startBuiltApp,
	startSmtpFake,
	stopProcess,
	type Started
} from './support/processes';
import { GiveUp, waitFor } from './support/wait';

const cluster = inject('faultCluster');

let db: pg.Client;
let show: { id: string; slug: string };
let memberId = '';
let chairCookie = '';
let smtpPorts: { smtpPort: number; httpPort: number };
let smtp: (Started & { url: string }) | undefined;
let app: (Started & { origin: string }) | undefined;
/** Every app process started here, so that a failed test leaves none running. */
const apps: Started[] = [];

/** The outbox settings of the app under test: a quick worker, and retries far apart so that the
 * test, not the clock, decides when a waiting message is tried again. */
const OUTBOX_ENV = { CB_JOBS_POLL_SECONDS: '1', CB_OUTBOX_BASE_DELAY_SECONDS: '3600' };

async function one<T extends pg.QueryResultRow>(sql: string, params: unknown[] = []): Promise<T> {
	return (await db.query<T>(sql, params)).rows[0];
}

/** What publishing has left in the database for the show. */
async function published() {
	return one<{
		published_at: Date | null;
		awards: number;
		ties: number;
		mail: number;
		audit: number;
	}>(
		`SELECT s.results_published_at AS published_at,
		        (SELECT count(*)::int FROM awards WHERE show_id = s.id) AS awards,
		        (SELECT count(*)::int FROM award_ties WHERE show_id = s.id) AS ties,
		        (SELECT count(*)::int FROM outbox_messages WHERE show_id = s.id AND kind = 'results') AS mail,
		        (SELECT count(*)::int FROM audit_events
		          WHERE show_id = s.id AND action = 'results.publish') AS audit
		   FROM shows s WHERE s.id = $1`,
		[show.id]
	);
}

/** The chair presses Publish and confirms: the form action, as the page's enhanced form sends it. */
async function publish(origin: string): Promise<{ status: number; body: string }> {
	const response = await fetch(`${origin}/chair/shows/${show.slug}/awards?/publish`, {
		method: 'POST',
		headers: {
			cookie: chairCookie,
			origin,
			accept: 'application/json',
			'x-sveltekit-action': 'true',
			'content-type': 'application/x-www-form-urlencoded'
		},
		// The chair has answered the page's question (publishing asks first).
		body: 'confirm=yes'
	});
	return { status: response.status, body: await response.text() };
}

async function startApp(name: string): Promise<Started & { origin: string }> {
	const started = await startBuiltApp({
		name,
		port: await freePort(),
		databaseUrl: cluster.databaseUrl,
		smtpPort: smtpPorts.smtpPort,
		env: OUTBOX_ENV
	});
	apps.push(started);
	return started;
}

beforeAll(async () => {
	db = new pg.Client({ connectionString: cluster.databaseUrl });
	await db.connect();
	show = await one(`SELECT id, slug FROM shows WHERE slug LIKE 'larkspur-autumn-%'`);
	memberId = (
		await one<{ id: string }>(`SELECT id FROM users WHERE email = 'member@crownbench.test'`)
	).id;
	// A database session for the chair, as the e-mail link sign-in leaves it.
	const token = randomBytes(32).toString('hex');
	await db.query(
		`INSERT INTO sessions (session_token, user_id, expires)
		 SELECT $1, id, now() + interval '30 days' FROM users WHERE email = 'chair@crownbench.test'`,
		[token]
	);
	chairCookie = `authjs.session-token=${token}`;
	expect(await published()).toEqual({
		published_at: null,
		awards: 0,
		ties: 0,
		mail: 0,
		audit: 0
	});
	smtpPorts = { smtpPort: await freePort(), httpPort: await freePort() };
	smtp = await startSmtpFake(smtpPorts);
});

afterAll(async () => {
	for (const started of apps) await stopProcess(started);
	if (smtp) await stopProcess(smtp);
	await db?.end();
});

describe('faults while publishing results', () => {
	it('a publish killed in the middle of its transaction leaves nothing behind', async () => {
		app = await startApp('app-publish-killed');
		const blocker = new pg.Client({ connectionString: cluster.databaseUrl });
		await blocker.connect();
		try {
			await blocker.query('BEGIN');
			await blocker.query(
				`INSERT INTO outbox_messages (kind, to_address, subject, text_body, dedupe_key)
				 VALUES ('fault-test', 'nobody@crownbench.test', 'held', 'held', $1)`,
				[`results:${show.id}:${memberId}`]
			);
			const blockerPid = (await blocker.query<{ pid: number }>('SELECT pg_backend_pid() AS pid'))
				.rows[0].pid;
			let settled = '';
			const attempt = publish(app.origin).then(
				(answer) => {
					settled = `publishing answered ${answer.status}: ${answer.body}`;
					return { answered: true as const, ...answer };
				},
				(error: Error) => ({ answered: false as const, error: error.message })
			);

			// Publishing now waits on the held row, inside its transaction, with its awards written.
			const publishing = await waitFor('publishing to wait on the held outbox row', async () => {
				if (settled) throw new GiveUp(settled);
				const { rows } = await db.query<{ pid: number }>(
					`SELECT pid FROM pg_stat_activity
					  WHERE $1 = ANY(pg_blocking_pids(pid)) AND query LIKE 'INSERT INTO outbox_messages%'`,
					[blockerPid]
				);
				return rows[0]?.pid;
			});
			const { rows: written } = await db.query<{ relname: string }>(
				`SELECT DISTINCT c.relname FROM pg_locks l JOIN pg_class c ON c.oid = l.relation
				  WHERE l.pid = $1 AND l.mode = 'RowExclusiveLock' AND c.relkind = 'r' ORDER BY 1`,
				[publishing]
			);
			expect(written.map((r) => r.relname)).toEqual([
				'audit_events',
				'award_ties',
				'awards',
				'outbox_messages',
				'shows'
			]);

			await stopProcess(app, 'SIGKILL');
			expect(await app.ended).toEqual({ code: null, signal: 'SIGKILL' });
			expect(await attempt).toMatchObject({ answered: false });

			await blocker.query('ROLLBACK');
			// The server ends the dead client's session and rolls its transaction back.
			await waitFor('the killed app’s session to end', async () => {
				const row = await one<{ n: number }>(
					'SELECT count(*)::int AS n FROM pg_stat_activity WHERE pid = $1',
					[publishing]
				);
				return row.n === 0;
			});
		} finally {
			await blocker.end();
		}
		expect(await published()).toEqual({
			published_at: null,
			awards: 0,
			ties: 0,
			mail: 0,
			audit: 0
		});
	});

	it('published again while the mail server is down: every placements e-mail arrives once', async () => {
		await stopProcess(smtp!);
		app = await startApp('app-publish-again');

		const answer = await publish(app.origin);
		expect(answer.status, logTail(app)).toBe(200);
		expect(answer.body).toContain('Results published');
		const awards = Number(/(\d+) awards stored/.exec(answer.body)?.[1]);
		// Exhibitors of the autumn show who want results e-mails: member and exhibitor1, 2, 3, 4
		// and 6 (exhibitor7 turned them off), as the demo seed invents them.
		expect(answer.body).toContain('6 placements e-mails are on their way');
		const after = await published();
		expect(after.published_at).not.toBeNull();
		expect([after.awards, after.mail, after.audit]).toEqual([awards, 6, 1]);
		expect(awards).toBeGreaterThan(0);
		// One publish wrote them: positions 0..n-1 of the engine's list, each once.
		const positions = await one<{ distinct: number; max: number }>(
			'SELECT count(DISTINCT position)::int AS distinct, max(position) AS max FROM awards WHERE show_id = $1',
			[show.id]
		);
		expect(positions).toEqual({ distinct: awards, max: awards - 1 });

		// The app's outbox worker tries every message while the server is down; they wait.
		const tried = await waitFor('every placements e-mail to be tried once', async () => {
			const { rows } = await db.query<{ to_address: string; status: string; last_error: string }>(
				`SELECT to_address, status, last_error FROM outbox_messages
				  WHERE show_id = $1 AND kind = 'results' AND attempts >= 1 ORDER BY to_address`,
				[show.id]
			);
			return rows.length === 6 && rows.every((r) => r.status === 'waiting') && rows;
		});
		expect(tried.every((r) => /ECONNREFUSED/.test(r.last_error))).toBe(true);

		// The mail server is back; the waiting jobs are made due now instead of in an hour.
		smtp = await startSmtpFake(smtpPorts);
		await db.query(
			`UPDATE pgboss.job SET start_after = now()
			  WHERE name = 'mail-send' AND state = 'retry'
			    AND (data->>'messageId')::uuid IN (SELECT id FROM outbox_messages WHERE show_id = $1)`,
			[show.id]
		);
		await waitFor('every placements e-mail to be sent', async () => {
			const row = await one<{ n: number }>(
				`SELECT count(*)::int AS n FROM outbox_messages
				  WHERE show_id = $1 AND kind = 'results' AND status = 'sent'`,
				[show.id]
			);
			return row.n === 6;
		});
		const caught = (await (await fetch(`${smtp.url}/messages`)).json()) as {
			to: string[];
			subject: string;
		}[];
		const results = caught.filter((m) => m.subject.startsWith('Your results:'));
		expect(results.flatMap((m) => m.to).sort()).toEqual(tried.map((r) => r.to_address).sort());

		// Publishing once more is refused: the results are there once.
		const again = await publish(app.origin);
		expect(again.body).toContain('already published');
		expect(await published()).toMatchObject({ awards, mail: 6, audit: 1 });
	});
});
