/**
 * Two app instances (`node build`, CB_WORKER=off) and two job workers (`npm run worker`) on one
 * PostgreSQL, as a host runs them behind a proxy (both apps know the one public address, ORIGIN):
 * - a session made on one instance is valid on the other (sessions live in PostgreSQL);
 * - the sign-in limits are shared (counted in PostgreSQL, not per process);
 * - publishing through one instance sends every placements e-mail exactly once, the two workers
 *   taking jobs from the same queue;
 * - both instances answer the chair's board alike, and both are ready (/readyz).
 */
import { randomBytes } from 'node:crypto';
import { readFileSync } from 'node:fs';
import pg from 'pg';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import { freePort } from '../faults/support/ports';
import {
	logTail,
	startProcess,
	startSmtpFake,
	stopProcess,
	waitUntilAnswering,
	type Started
} from '../faults/support/processes';
import { waitFor } from '../faults/support/wait';
import { instancesDir } from './global-setup';

const cluster = inject('instancesCluster');

const started: Started[] = [];
let db: pg.Client;
let smtp: Started & { url: string };
let a: Started & { url: string };
let b: Started & { url: string };
/** The public address both apps are configured with (the proxy's, here app A's). */
let publicOrigin = '';
let chairCookie = '';
let show: { id: string; slug: string };

const SIGNIN_LIMIT = 3;

async function startApp(
	name: string,
	port: number,
	smtpPort: number
): Promise<Started & { url: string }> {
	const app = startProcess(
		name,
		['build'],
		{
			PATH: process.env.PATH,
			HOME: process.env.HOME,
			NODE_ENV: 'production',
			PORT: String(port),
			HOST: '127.0.0.1',
			ORIGIN: publicOrigin,
			BODY_SIZE_LIMIT: '12M',
			DATABASE_URL: cluster.databaseUrl,
			SMTP_URL: `smtp://127.0.0.1:${smtpPort}`,
			AUTH_SECRET: `instances-secret-${process.pid}-shared-by-both`,
			CB_WORKER: 'off',
			CB_SIGNIN_LIMIT_PER_ADDRESS: String(SIGNIN_LIMIT),
			LOG_LEVEL: 'info'
		},
		instancesDir
	);
	started.push(app);
	const url = `http://127.0.0.1:${port}`;
	await waitUntilAnswering(app, `${url}/healthz`);
	return { ...app, url };
}

function startWorker(name: string, smtpPort: number): Started {
	const worker = startProcess(
		name,
		['--import', 'tsx', 'scripts/worker.ts'],
		{
			PATH: process.env.PATH,
			HOME: process.env.HOME,
			NODE_ENV: 'production',
			ORIGIN: publicOrigin,
			AUTH_SECRET: `instances-secret-${process.pid}-shared-by-both`,
			DATABASE_URL: cluster.databaseUrl,
			SMTP_URL: `smtp://127.0.0.1:${smtpPort}`,
			CB_JOBS_POLL_SECONDS: '1'
		},
		instancesDir
	);
	started.push(worker);
	return worker;
}

/** A form POST as a browser without JavaScript sends it (through the proxy: Origin is public). */
function postForm(url: string, form: Record<string, string>, cookie = ''): Promise<Response> {
	return fetch(url, {
		method: 'POST',
		redirect: 'manual',
		headers: {
			origin: publicOrigin,
			cookie,
			accept: 'text/html',
			'content-type': 'application/x-www-form-urlencoded'
		},
		body: new URLSearchParams(form).toString()
	});
}

async function caught(
	to?: string
): Promise<{ id: number; to: string[]; subject: string; text: string }[]> {
	const query = to ? `?to=${encodeURIComponent(to)}` : '';
	return (await (await fetch(`${smtp.url}/messages${query}`)).json()) as never;
}

beforeAll(async () => {
	db = new pg.Client({ connectionString: cluster.databaseUrl });
	await db.connect();
	const smtpPort = await freePort();
	smtp = await startSmtpFake({ smtpPort, httpPort: await freePort() });
	started.push(smtp);
	const [portA, portB] = [await freePort(), await freePort()];
	publicOrigin = `http://127.0.0.1:${portA}`;
	[a, b] = await Promise.all([
		startApp('app-a', portA, smtpPort),
		startApp('app-b', portB, smtpPort)
	]);
	startWorker('worker-1', smtpPort);
	startWorker('worker-2', smtpPort);
	show = (
		await db.query<{ id: string; slug: string }>(
			`SELECT id, slug FROM shows WHERE slug LIKE 'larkspur-autumn-%'`
		)
	).rows[0];
	const token = randomBytes(32).toString('hex');
	await db.query(
		`INSERT INTO sessions (session_token, user_id, expires)
		 SELECT $1, id, now() + interval '30 days' FROM users WHERE email = 'chair@crownbench.test'`,
		[token]
	);
	chairCookie = `authjs.session-token=${token}`;
});

afterAll(async () => {
	for (const process of started.reverse()) await stopProcess(process);
	await db?.end();
});

describe('two app instances and two workers on one database', () => {
	it('both are ready: database, migrations, and the two workers alive', async () => {
		for (const app of [a, b]) {
			const ready = await waitFor(`${app.name} to be ready`, async () => {
				const response = await fetch(`${app.url}/readyz`);
				const body = (await response.json()) as { checks: { jobs: { detail: string } } };
				return response.status === 200 && body.checks.jobs.detail === '2 worker(s) alive' && body;
			});
			expect(ready).toMatchObject({
				status: 'ready',
				checks: { database: { ok: true }, migrations: { ok: true }, jobs: { ok: true } }
			});
		}
	});

	it('a sign-in link asked for on one instance signs in on the other, and the session holds on both', async () => {
		const email = 'member@crownbench.test';
		const before = (await caught(email))[0]?.id ?? 0;
		const asked = await postForm(`${a.url}/signin`, {
			email,
			providerId: 'nodemailer',
			redirectTo: '/home'
		});
		expect([303, 302], logTail(a)).toContain(asked.status);
		const mail = await waitFor('the sign-in mail', async () =>
			(await caught(email)).find((m) => m.id > before)
		);
		const link = new URL(/https?:\/\/\S+/.exec(mail.text)![0]);
		expect(link.origin).toBe(publicOrigin);
		// The proxy hands the click to the other instance.
		const followed = await fetch(`${b.url}${link.pathname}${link.search}`, { redirect: 'manual' });
		expect(followed.status, logTail(b)).toBe(302);
		const cookie = (followed.headers.getSetCookie() ?? [])
			.map((c) => c.split(';')[0])
			.find((c) => c.startsWith('authjs.session-token='));
		expect(cookie).toBeTruthy();
		for (const app of [a, b]) {
			const page = await fetch(`${app.url}/my`, {
				headers: { cookie: cookie! },
				redirect: 'manual'
			});
			expect(page.status, `${app.name} /my`).toBe(200);
			expect(await page.text()).toContain('Wren Halloway');
		}
	});

	it('shares the sign-in limits: asks on both instances count against one limit', async () => {
		const email = `limit-${Date.now()}@crownbench.test`;
		const statuses: number[] = [];
		for (let i = 0; i <= SIGNIN_LIMIT; i++) {
			const app = i % 2 === 0 ? a : b;
			statuses.push(
				(
					await postForm(`${app.url}/signin`, {
						email,
						providerId: 'nodemailer',
						redirectTo: '/home'
					})
				).status
			);
		}
		expect(statuses.slice(0, SIGNIN_LIMIT).every((s) => s !== 429)).toBe(true);
		// The fourth ask, on instance B after two on A and one on B, is over the limit.
		expect(statuses[SIGNIN_LIMIT]).toBe(429);
		const refused = await postForm(`${a.url}/signin`, {
			email,
			providerId: 'nodemailer',
			redirectTo: '/home'
		});
		expect(refused.status).toBe(429);
		expect(await refused.text()).toContain('Too many sign-in links were asked for');
	});

	it('publishing on one instance sends every placements e-mail once, through the two workers', async () => {
		const answer = await fetch(`${a.url}/chair/shows/${show.slug}/awards?/publish`, {
			method: 'POST',
			headers: {
				cookie: chairCookie,
				origin: publicOrigin,
				accept: 'application/json',
				'x-sveltekit-action': 'true',
				'content-type': 'application/x-www-form-urlencoded'
			},
			body: 'confirm=yes'
		});
		const body = await answer.text();
		expect(answer.status, logTail(a)).toBe(200);
		// Exhibitors of the autumn show who want results e-mails, as the demo seed invents them.
		expect(body).toContain('6 placements e-mails are on their way');
		await waitFor('every placements e-mail to be sent', async () => {
			const { rows } = await db.query<{ n: number }>(
				`SELECT count(*)::int AS n FROM outbox_messages
				  WHERE show_id = $1 AND kind = 'results' AND status = 'sent'`,
				[show.id]
			);
			return rows[0].n === 6;
		});
		// A moment more, for a second sending that should not happen.
		await new Promise((resolve) => setTimeout(resolve, 3000));
		const results = (await caught()).filter((m) => m.subject.startsWith('Your results:'));
		const recipients = results.flatMap((m) => m.to).sort();
		expect(recipients).toHaveLength(6);
		expect(new Set(recipients).size).toBe(6);
		const { rows: jobs } = await db.query<{ state: string; n: number }>(
			`SELECT j.state, count(*)::int AS n FROM pgboss.job j
			   JOIN outbox_messages o ON o.id::text = j.data->>'messageId'
			  WHERE j.name = 'mail-send' AND o.show_id = $1 AND o.kind = 'results'
			  GROUP BY j.state`,
			[show.id]
		);
		expect(jobs).toEqual([{ state: 'completed', n: 6 }]);
		// The whole-show PDFs were built by a worker and are served alike by both instances.
		await waitFor('the award sheets to be built', async () => {
			const { rows } = await db.query<{ status: string }>(
				`SELECT status FROM show_pdfs WHERE show_id = $1 AND document = 'award-sheets.pdf'`,
				[show.id]
			);
			return rows[0]?.status === 'ready';
		});
		const [pdfA, pdfB] = await Promise.all(
			[a, b].map(async (app) => {
				const response = await fetch(
					`${app.url}/chair/shows/${show.slug}/results/award-sheets.pdf`,
					{
						headers: { cookie: chairCookie }
					}
				);
				expect(response.status).toBe(200);
				return Buffer.from(await response.arrayBuffer());
			})
		);
		expect(pdfA.equals(pdfB)).toBe(true);
	});

	it('both instances answer the chair’s board alike', async () => {
		const boards = await Promise.all(
			[a, b].map(async (app) => {
				const response = await fetch(`${app.url}/api/chair/shows/${show.slug}/board`, {
					headers: { cookie: chairCookie }
				});
				expect(response.status, app.name).toBe(200);
				return response.json();
			})
		);
		// The same board, but for the moment each was read at.
		const [first, second] = boards.map(({ checkedAt, ...board }) => {
			expect(Date.parse(checkedAt)).not.toBeNaN();
			return board;
		});
		expect(first).toEqual(second);
		expect(JSON.stringify(boards[0]).length).toBeGreaterThan(100);
	});

	it('each instance logs one JSON line per request, with its id, and nothing personal', async () => {
		const id = `proxy-${Date.now()}-check`;
		const answer = await fetch(`${b.url}/healthz`, { headers: { 'x-request-id': id } });
		expect(answer.headers.get('x-request-id')).toBe(id);
		await waitFor('the request line', async () => readFileSync(b.logFile, 'utf8').includes(id));
		for (const app of [a, b]) {
			const lines = readFileSync(app.logFile, 'utf8')
				.split('\n')
				.filter((line) => line.startsWith('{'))
				.map((line) => JSON.parse(line) as Record<string, unknown>);
			const requests = lines.filter((l) => l.msg === 'request');
			expect(requests.length).toBeGreaterThan(3);
			for (const line of requests) {
				expect(line).toMatchObject({ requestId: expect.any(String), route: expect.any(String) });
			}
			expect(requests.some((l) => l.route === '/signin' && l.method === 'POST')).toBe(true);
			// Addresses were posted and mailed; none is in the log, nor a session token.
			const text = readFileSync(app.logFile, 'utf8');
			expect(text).not.toMatch(/@crownbench\.test|authjs\.session-token|limit-\d+@/);
		}
	});
});
