import { spawn, type ChildProcess } from 'node:child_process';
import { randomUUID } from 'node:crypto';
import { readFileSync } from 'node:fs';
import { createServer } from 'node:net';
import path from 'node:path';
import { pathToFileURL } from 'node:url';
import { expect, request, test, type APIResponse } from '@playwright/test';
import { VISITORS } from './access/people';
import { loadParams } from './access/params';
import { createJudgingShow, withDb } from './support/judging-fixture';
import { firstLink, lastMailId, waitForMail } from './support/mail';
import { cookieFor, requestAs } from './support/visitors';

// Sessions and forms: SvelteKit's origin check on form posts, the security headers and content
// security policy on every kind of answer, and the session cookie's flags on http and https.

test('form posts from another origin are refused with 403 and change nothing', async ({
	browser,
	baseURL
}) => {
	// SvelteKit's check stays on: svelte.config.js neither turns it off nor trusts every origin.
	const file = path.resolve('svelte.config.js');
	expect(readFileSync(file, 'utf8')).not.toMatch(/checkOrigin\s*:\s*false/);
	const config = (await import(pathToFileURL(file).href)).default as {
		kit: { csrf?: { checkOrigin?: boolean; trustedOrigins?: string[] } };
	};
	expect(config.kit.csrf?.checkOrigin).not.toBe(false);
	expect(config.kit.csrf?.trustedOrigins ?? []).not.toContain('*');

	const params = await loadParams();
	const show = await createJudgingShow(1);
	await withDb((db) =>
		db.query(`UPDATE shows SET schedule_published_at = NULL WHERE id = $1`, [show.showId])
	);
	const memberCookie = await cookieFor(browser, VISITORS.member);
	const chairCookie = await cookieFor(browser, VISITORS.chair);
	const variety = await withDb(
		async (db) =>
			(
				await db.query(`SELECT id FROM varieties WHERE society_id = $1 ORDER BY name LIMIT 1`, [
					params.societyId
				])
			).rows[0].id as string
	);
	const label = `Origin test ${randomUUID().slice(0, 8)}`;
	const plantForm = { varietyId: variety, label, obtainedHow: 'bought', obtainedOn: '2025-01-10' };
	const email = `origin-${randomUUID().slice(0, 8)}@crownbench.test`;
	const state = () =>
		withDb(async (db) => {
			const r = await db.query(
				`SELECT (SELECT count(*)::int FROM plants WHERE label = $1) AS plants,
				        (SELECT schedule_published_at IS NOT NULL FROM shows WHERE id = $2) AS published,
				        (SELECT count(*)::int FROM verification_tokens WHERE identifier = $3) AS links`,
				[label, show.showId, email]
			);
			return r.rows[0];
		});
	const before = await state();
	expect(before).toEqual({ plants: 0, published: false, links: 0 });

	const posts: { cookie?: string; url: string; form: Record<string, string> }[] = [
		{ cookie: memberCookie, url: '/my/plants/new', form: plantForm },
		{ cookie: chairCookie, url: `/chair/shows/${show.slug}?/publish`, form: { published: 'yes' } },
		{ cookie: undefined, url: '/signin', form: { providerId: 'nodemailer', email } }
	];
	const foreign = ['https://evil.example', 'null', `${baseURL}.evil.example`];
	for (const post of posts) {
		for (const origin of [...foreign, undefined]) {
			const api = await request.newContext({ baseURL });
			const headers: Record<string, string> = { accept: 'text/html' };
			if (post.cookie) headers.cookie = post.cookie;
			if (origin) headers.origin = origin;
			// Form bodies of each kind a page can send cross-site without asking first.
			for (const body of [
				{ form: post.form },
				{ multipart: post.form },
				{ data: new URLSearchParams(post.form).toString(), contentType: 'text/plain' }
			]) {
				const { contentType, ...rest } = body as { contentType?: string };
				const response = await api.post(post.url, {
					...rest,
					headers: contentType ? { ...headers, 'content-type': contentType } : headers,
					maxRedirects: 0
				});
				expect(response.status(), `${post.url} from ${origin ?? 'no origin'}`).toBe(403);
				expect(await response.text()).toContain('Cross-site');
			}
			await api.dispose();
		}
	}
	expect(await state()).toEqual(before);

	// From the app's own origin the same posts go through (so the 403s above are the check).
	for (const post of posts) {
		const api = await requestAs(baseURL!, post.cookie);
		const response = await api.post(post.url, {
			form: post.form,
			headers: { accept: 'text/html' },
			maxRedirects: 0
		});
		expect([200, 302, 303], post.url).toContain(response.status());
		await api.dispose();
	}
	expect(await state()).toEqual({ plants: 1, published: true, links: 1 });
});

const SECURITY_HEADERS = {
	'x-content-type-options': 'nosniff',
	'referrer-policy': 'same-origin',
	'x-frame-options': 'DENY'
};

/** What is wrong with an answer's security headers and content security policy. */
function headerProblems(response: APIResponse, options: { csp: boolean }): string[] {
	const h = response.headers();
	const problems = Object.entries(SECURITY_HEADERS)
		.filter(([name, value]) => h[name] !== value)
		.map(([name, value]) => `${name} is ${h[name]}, not ${value}`);
	if (!/camera=\(self\)/.test(h['permissions-policy'] ?? ''))
		problems.push('no permissions-policy');
	const csp = h['content-security-policy'];
	if (options.csp) {
		if (!csp) problems.push('no content-security-policy');
		else {
			if (!/default-src '(self|none)'/.test(csp)) problems.push(`default-src: ${csp}`);
			if (!csp.includes("frame-ancestors 'none'")) problems.push(`frame-ancestors: ${csp}`);
			if (/unsafe-eval/.test(csp)) problems.push(`unsafe-eval: ${csp}`);
			const script = /script-src ([^;]*)/.exec(csp)?.[1] ?? '';
			if (script.includes('unsafe-inline')) problems.push(`inline scripts allowed: ${csp}`);
		}
	}
	return problems;
}

test('every kind of answer carries the security headers and a content security policy', async ({
	browser,
	baseURL
}) => {
	const params = await loadParams();
	const member = await cookieFor(browser, VISITORS.member);
	const clerk = await cookieFor(browser, VISITORS.clerk);
	const cases: { what: string; url: string; cookie?: string; accept?: string; status: number }[] = [
		{ what: 'start page', url: '/', status: 200 },
		{ what: 'public schedule', url: `/shows/${params.slug}`, status: 200 },
		{ what: 'member page', url: '/my', cookie: member, status: 200 },
		{ what: 'page data', url: '/my/__data.json', cookie: member, status: 200 },
		{
			what: 'API answer',
			url: `/api/varieties?society=${params.societyId}&q=a`,
			cookie: member,
			status: 200
		},
		{ what: 'API refusal (signed out)', url: '/api/judging/sheets', status: 401 },
		{ what: 'API not found', url: `/api/photos/${randomUUID()}`, cookie: member, status: 404 },
		{ what: 'API refusal (role)', url: '/api/chair/shows/x/board', cookie: member, status: 403 },
		{ what: 'redirect to sign-in (guard)', url: '/home', status: 303 },
		{ what: 'redirect to sign-in (data)', url: '/home/__data.json', status: 200 },
		{ what: 'redirect (sign-out)', url: '/signout', status: 303 },
		{ what: 'redirect (tag link)', url: `/e/${params.slug}/1`, cookie: clerk, status: 303 },
		{ what: 'error page (not found)', url: '/no-such-page', accept: 'text/html', status: 404 },
		{
			what: 'error page (no such show)',
			url: '/shows/no-such-show',
			accept: 'text/html',
			status: 404
		},
		{
			what: 'error page (role, from the guard)',
			url: '/judging',
			cookie: member,
			accept: 'text/html',
			status: 403
		},
		{ what: 'error answer (role, JSON)', url: '/judging', cookie: member, status: 403 }
	];
	const problems: string[] = [];
	for (const c of cases) {
		const api = await requestAs(baseURL!, c.cookie);
		const response = await api.get(c.url, {
			maxRedirects: 0,
			headers: c.accept ? { accept: c.accept } : {}
		});
		if (response.status() !== c.status) problems.push(`${c.what}: status ${response.status()}`);
		for (const p of headerProblems(response, { csp: true })) problems.push(`${c.what}: ${p}`);
		if (c.what === 'error page (role, from the guard)') {
			expect(await response.text()).toContain(
				'Your account does not have the role this page needs.'
			);
		}
		await api.dispose();
	}
	// PDFs get the headers; no policy, so that the browser's own viewer shows them.
	const anon = await requestAs(baseURL!);
	const pdf = await anon.get(`/shows/${params.slug}/schedule.pdf`);
	expect(pdf.headers()['content-type']).toBe('application/pdf');
	for (const p of headerProblems(pdf, { csp: false })) problems.push(`schedule PDF: ${p}`);
	await anon.dispose();
	expect(problems).toEqual([]);
});

/** Signs in by e-mail link with plain requests and returns the Set-Cookie lines of the link. */
async function signInSetCookies(appUrl: string, origin: string, email: string): Promise<string[]> {
	const api = await request.newContext({ baseURL: appUrl });
	const before = await lastMailId(email);
	const asked = await api.post('/signin', {
		form: { providerId: 'nodemailer', redirectTo: '/home', email },
		headers: { origin, accept: 'text/html' },
		maxRedirects: 0
	});
	expect([302, 303], 'sign-in form').toContain(asked.status());
	const link = new URL(firstLink(await waitForMail(email, before)));
	expect(link.origin, 'links use the public address').toBe(origin);
	const opened = await api.get(link.pathname + link.search, { maxRedirects: 0 });
	expect(opened.status()).toBe(302);
	const lines = opened
		.headersArray()
		.filter((h) => h.name.toLowerCase() === 'set-cookie')
		.map((h) => h.value);
	await api.dispose();
	return lines;
}

function cookieLine(lines: string[], name: string): string {
	const line = lines.find((l) => l.startsWith(`${name}=`));
	expect(line, `${name} in ${lines.map((l) => l.split('=')[0]).join(', ')}`).toBeTruthy();
	return line!;
}

const flag = (line: string, name: string) =>
	line
		.split(';')
		.map((p) => p.trim().toLowerCase())
		.find((p) => p === name.toLowerCase() || p.startsWith(`${name.toLowerCase()}=`));

test('the session cookie is HttpOnly and SameSite=Lax; Secure with the __Secure- name behind https', async ({
	baseURL
}) => {
	test.setTimeout(90_000);
	// Plain http on this machine: not Secure (a browser would drop a Secure cookie on http).
	const plain = cookieLine(
		await signInSetCookies(
			baseURL!,
			baseURL!,
			`cookie-${randomUUID().slice(0, 8)}@crownbench.test`
		),
		'authjs.session-token'
	);
	expect(flag(plain, 'httponly')).toBe('httponly');
	expect(flag(plain, 'samesite')).toBe('samesite=lax');
	expect(flag(plain, 'path')).toBe('path=/');
	expect(flag(plain, 'secure')).toBeUndefined();

	// The same build served as https (ORIGIN=https://..., as behind a TLS proxy): a second app
	// process on a free port, stopped at the end.
	const port = await new Promise<number>((resolve, reject) => {
		const server = createServer();
		server.once('error', reject);
		server.listen(0, '127.0.0.1', () => {
			const address = server.address();
			server.close(() => resolve(typeof address === 'object' && address ? address.port : 0));
		});
	});
	const origin = `https://127.0.0.1:${port}`;
	const app: ChildProcess = spawn(process.execPath, ['build'], {
		cwd: process.cwd(),
		env: {
			...process.env,
			PORT: String(port),
			HOST: '127.0.0.1',
			ORIGIN: origin,
			CB_OUTBOX_WORKER: 'off',
			CB_REMINDERS: 'off'
		},
		stdio: 'ignore'
	});
	try {
		const appUrl = `http://127.0.0.1:${port}`;
		await expect
			.poll(
				async () => {
					try {
						return (await fetch(`${appUrl}/`)).status;
					} catch {
						return 0;
					}
				},
				{ timeout: 30_000 }
			)
			.toBe(200);
		const lines = await signInSetCookies(
			appUrl,
			origin,
			`secure-${randomUUID().slice(0, 8)}@crownbench.test`
		);
		const secure = cookieLine(lines, '__Secure-authjs.session-token');
		expect(flag(secure, 'secure')).toBe('secure');
		expect(flag(secure, 'httponly')).toBe('httponly');
		expect(flag(secure, 'samesite')).toBe('samesite=lax');
		expect(lines.filter((l) => l.startsWith('authjs.session-token='))).toEqual([]);
		// Every other Auth.js cookie it sets is Secure too.
		for (const line of lines.filter((l) => /authjs\./.test(l.split('=')[0]))) {
			expect(flag(line, 'secure'), line.split('=')[0]).toBe('secure');
		}
	} finally {
		app.kill('SIGTERM');
		await new Promise((resolve) =>
			app.exitCode !== null ? resolve(null) : app.once('exit', resolve)
		);
	}
});
