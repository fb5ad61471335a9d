import { expect, test } from '@playwright/test';
import fc from 'fast-check';
import { readdirSync } from 'node:fs';
import path from 'node:path';
import pg from 'pg';
import { fillRoute, loadParams } from './access/params';
import { listInputTargets, targetKey, type InputTarget } from './bad-input/discover';
import { badForm, badJson, badParam, badQuery, type FormSample } from './bad-input/inputs';
import { BAD_INPUT_TARGETS, type BadInputTarget } from './bad-input/targets';
import { sessionCookies } from './support/cookies';
import { withDb } from './support/judging-fixture';
import { signIn } from './support/session';
import { diffSnapshots, snapshotDb } from './support/db-snapshot';

/**
 * Property-based bad input: every form action and endpoint method gets at least 200 generated bad
 * requests, sent by someone allowed to use it, against the built server. Each must be refused with
 * a 4xx and a message (never a 5xx, never accepted), and the database must be the same afterwards
 * (row count and md5 of every table). The rate_limits table is left out of the comparison: counting
 * attempts is its job (it is tested on its own).
 */
const RUNS = 200;
const PARALLEL = 8;
// The job worker's heartbeat is rewritten every few seconds whatever the requests do.
const IGNORED_TABLES = ['rate_limits', 'worker_heartbeats'];

test.describe.configure({ mode: 'serial' });

test('every form action and endpoint method has an entry in the bad-input list, and every entry a target', () => {
	const found = listInputTargets().map(targetKey);
	const listed = Object.keys(BAD_INPUT_TARGETS);
	expect(
		found.filter((k) => !listed.includes(k)),
		'add these to tests/e2e/bad-input/targets.ts'
	).toEqual([]);
	expect(
		listed.filter((k) => !found.includes(k)),
		'entries for targets that do not exist'
	).toEqual([]);
});

interface Sent {
	describe: string;
	response: Response;
}

function parseKey(key: string): InputTarget {
	const [route, rest] = key.split(' ');
	const [kind, name] = rest.split(':') as ['action' | 'api', string];
	return { route, kind, name };
}

function fileCount(dir: string): number {
	let n = 0;
	try {
		for (const entry of readdirSync(dir, { withFileTypes: true, recursive: true }))
			if (entry.isFile()) n++;
	} catch {
		// no upload folder yet
	}
	return n;
}

function formBody(sample: FormSample): { body: BodyInit; headers: Record<string, string> } {
	if (sample.files.length === 0) {
		return {
			body: new URLSearchParams(sample.fields).toString(),
			headers: { 'content-type': 'application/x-www-form-urlencoded' }
		};
	}
	const form = new FormData();
	for (const [k, v] of sample.fields) form.append(k, v);
	for (const [k, f] of sample.files)
		form.append(k, new Blob([new Uint8Array(f.bytes)], { type: f.type }), f.name);
	return { body: form, headers: {} };
}

/** Is this answer a refusal with a message? Returns the problem, or null when it is. */
async function problemWith(target: InputTarget, response: Response): Promise<string | null> {
	const status = response.status;
	const text = await response.text();
	if (status >= 500) return `${status} ${text.slice(0, 200)}`;
	if (target.kind === 'action' && status === 200) {
		let body: { type?: string; status?: number; data?: string; location?: string };
		try {
			body = JSON.parse(text);
		} catch {
			return `200 without the action's JSON: ${text.slice(0, 100)}`;
		}
		if (body.type !== 'failure') return `accepted (${body.type} ${body.location ?? ''})`;
		if (!(body.status! >= 400 && body.status! < 500)) return `failure with status ${body.status}`;
		if (!/message|errors|error/i.test(body.data ?? ''))
			return `failure without a message: ${body.data}`;
		return null;
	}
	if (status < 400) return `${status}: not refused`;
	// Node's HTTP server itself refuses request heads over its limit with an empty 431.
	if (status === 431) return null;
	if (text.trim() === '') return `${status} without a message`;
	return null;
}

test('at least 200 generated bad inputs to every form action and endpoint: 4xx with a message, nothing changes', async ({
	browser,
	baseURL
}) => {
	test.setTimeout(300_000);
	const base = baseURL!;
	const known = await loadParams();
	const entries = Object.entries(BAD_INPUT_TARGETS).filter(([, t]) => !t.noInput);
	const cookies = await sessionCookies(
		browser,
		entries.map(([, t]) => t.as)
	);
	const db = new pg.Client({ connectionString: process.env.DATABASE_URL });
	await db.connect();
	const uploads = path.resolve(process.env.UPLOAD_DIR ?? '.data/uploads');

	const problems: string[] = [];
	let sent = 0;
	try {
		for (const [key, spec] of entries) {
			const target = parseKey(key);
			const params = {
				...known,
				...Object.fromEntries(
					Object.entries(spec.params ?? {}).map(([k, v]) => [
						k,
						v.startsWith('$') ? known[v.slice(1)] : v
					])
				)
			};
			const before = await snapshotDb(db, { except: IGNORED_TABLES });
			const filesBefore = fileCount(uploads);
			const started = Date.now();
			const requests = makeRequests(target, spec, params, base, cookies[spec.as]);
			const found: string[] = [];
			for (let i = 0; i < requests.length; i += PARALLEL) {
				const batch = await Promise.all(requests.slice(i, i + PARALLEL).map((r) => r()));
				for (const { describe, response } of batch) {
					const problem = await problemWith(target, response);
					if (problem && found.length < 3)
						found.push(`${problem}\n      sent: ${describe.slice(0, 300)}`);
				}
			}
			sent += requests.length;
			const changes = diffSnapshots(before, await snapshotDb(db, { except: IGNORED_TABLES }));
			if (fileCount(uploads) !== filesBefore)
				changes.push(`upload folder: ${filesBefore} -> ${fileCount(uploads)} files`);
			for (const p of found) problems.push(`${key}: ${p}`);
			for (const c of changes) problems.push(`${key}: database changed: ${c}`);
			if (process.env.CB_BAD_INPUT_VERBOSE)
				console.log(
					`${key}: ${requests.length} sent, ${Date.now() - started} ms, ${found.length + changes.length} problems`,
					[...found, ...changes]
				);
		}
	} finally {
		await db.end();
	}
	console.log(
		`bad input: ${sent} generated bad requests to ${entries.length} targets, ${problems.length} problems`
	);
	expect(problems).toEqual([]);
	expect(sent).toBeGreaterThanOrEqual(entries.length * RUNS);
});

function makeRequests(
	target: InputTarget,
	spec: BadInputTarget,
	params: Record<string, string>,
	base: string,
	cookie: string | undefined
): (() => Promise<Sent>)[] {
	const headers: Record<string, string> = { origin: base, ...(cookie ? { cookie } : {}) };
	const send = (url: string, init: RequestInit, describe: string) => async (): Promise<Sent> => {
		try {
			const response = await fetch(new URL(url, base), {
				...init,
				redirect: 'manual',
				headers: { ...headers, ...(init.headers as Record<string, string>) }
			});
			return { describe, response };
		} catch (e) {
			// The server stops reading a body over BODY_SIZE_LIMIT (413) and closes the connection
			// while the client is still writing: that is a refusal too.
			const code = (e as { cause?: { code?: string } }).cause?.code;
			if (code === 'EPIPE' || code === 'ECONNRESET')
				return {
					describe,
					response: new Response('body too large: connection closed', { status: 413 })
				};
			throw e;
		}
	};
	const routeParams = [...target.route.matchAll(/\[(?:\.\.\.)?([^\]=]+)\]/g)].map((m) => m[1]);
	const page = fillRoute(target.route, params);

	if (spec.corrupt === 'path' || spec.corrupt === 'query+path') {
		if (routeParams.length === 0 && spec.corrupt === 'path')
			throw new Error(`${target.route}: no params to corrupt`);
		const arb = fc.record({
			bad: routeParams.length
				? fc.subarray(routeParams, { minLength: 1 })
				: fc.constant([] as string[]),
			values: fc.array(badParam, { minLength: routeParams.length, maxLength: routeParams.length }),
			query: spec.corrupt === 'query+path' ? badQuery(spec.fields) : fc.constant('')
		});
		return fc.sample(arb, { numRuns: RUNS, seed: 9 }).map(({ bad, values, query }) => {
			const own = { ...params };
			// A small whole number can be a real entry number, so it is no bad input for a path.
			bad.forEach((name, i) => (own[name] = /^[1-9]\d{0,3}$/.test(values[i]) ? '0' : values[i]));
			// A bad param may hold characters a URL cannot: send them encoded, as a browser would.
			const url = fillRoute(target.route, own) + (query ? `?${query}` : '');
			return send(url, { method: target.name }, `${target.name} ${url}`);
		});
	}

	if (spec.corrupt === 'json') {
		return fc
			.sample(badJson(spec.fields), { numRuns: RUNS, seed: 9 })
			.map((body) =>
				send(
					page,
					{ method: target.name, body, headers: { 'content-type': 'application/json' } },
					body
				)
			);
	}

	// Form actions: sent as the enhanced form does, so a fail() comes back as JSON with its status.
	const url = target.name === 'default' ? page : `${page}?/${target.name}`;
	const actionHeaders = { 'x-sveltekit-action': 'true', accept: 'application/json' };
	const arb = spec.needsField
		? badForm(spec.fields).filter((s) => s.fields.some(([k]) => spec.fields.includes(k)))
		: badForm(spec.fields);
	const forms = fc.sample(arb, { numRuns: RUNS, seed: 9 }).map((sample) => {
		const { body, headers: h } = formBody(sample);
		return send(
			url,
			{ method: 'POST', body, headers: { ...actionHeaders, ...h } },
			JSON.stringify(sample.fields)
		);
	});
	// And a few bodies that are no form at all.
	const odd = ['{"a":1}', 'garbage', '%zz=%%', ''].map((body) =>
		send(
			url,
			{ method: 'POST', body, headers: { ...actionHeaders, 'content-type': 'application/json' } },
			`non-form ${body}`
		)
	);
	return [...forms, ...odd];
}

// i-sec: the 500s an outside test found, and the guard on encoded paths.
test('odd dates, broken bodies, script callback addresses and encoded paths answer 4xx with a message', async ({
	page,
	request,
	baseURL
}) => {
	await signIn(page, 'member@crownbench.test');
	const params = await loadParams();
	const varietyId = await withDb(
		async (db) =>
			(
				await db.query<{ id: string }>(
					'SELECT id FROM varieties WHERE society_id = $1 ORDER BY name LIMIT 1',
					[params.societyId]
				)
			).rows[0].id
	);
	const farOff = await page.request.post('/api/my/entries/check', {
		data: { showSlug: params.slug, classId: params.classId, varietyId, acquiredOn: '9999-12-31' }
	});
	expect(farOff.status()).toBe(400);
	expect((await farOff.json()).errors.acquiredOn).toMatch(/real date/);

	// Signed out, as a visitor asking for a link.
	const broken = await request.post('/signin', {
		headers: {
			origin: baseURL ?? '',
			'content-type': 'multipart/form-data; boundary=----cut',
			// A browser's plain form post: the page answers with the failure's status.
			accept: 'text/html'
		},
		data: '------cut\r\nContent-Disposition: form-data; name="email"\r\n\r\nhalf',
		maxRedirects: 0
	});
	expect(broken.status()).toBe(400);
	expect(await broken.text()).toMatch(/could not be read/);

	for (const callbackUrl of ['javascript:alert(1)', 'data:text/html,hi']) {
		const callback = await page.request.get(
			`/auth/callback/nodemailer?${new URLSearchParams({ callbackUrl, token: 'x', email: 'a@b.test' })}`,
			{ maxRedirects: 0 }
		);
		expect(callback.status()).toBe(400);
		expect(await callback.text()).toMatch(/not a web address/);
	}

	// The guard reads the path as routing does: an encoded letter is no way past it.
	const encoded = await page.request.get('/api/%6Audging/sheets');
	expect(encoded.status()).toBe(403);
	expect((await encoded.json()).message).toBe(
		'Your account does not have the role this page needs.'
	);
});
