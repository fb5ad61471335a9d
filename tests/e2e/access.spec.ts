import { expect, test } from '@playwright/test';
import { VISITOR_KINDS } from './access/people';
import { fillRoute, loadParams } from './access/params';
import { listRouteIds } from './access/routes';
import { ACCESS_TABLE, type Answer } from './access/table';
import { sessionCookies } from './support/cookies';

/** Row params may name a looked-up value with a leading $ (e.g. '$memberEntryId'). */
function resolveParams(
	own: Record<string, string> | undefined,
	known: Record<string, string>
): Record<string, string> {
	return Object.fromEntries(
		Object.entries(own ?? {}).map(([k, v]) => [k, v.startsWith('$') ? known[v.slice(1)] : v])
	);
}

test.describe.configure({ mode: 'serial' });

test('every route of the app has a row in the access table, and every row a route', () => {
	const routes = listRouteIds();
	const covered = new Set(ACCESS_TABLE.map((r) => r.route));
	expect(
		routes.filter((r) => !covered.has(r)),
		'routes without a row in tests/e2e/access/table.ts'
	).toEqual([]);
	expect(
		[...covered].filter((r) => !routes.includes(r)),
		'rows for routes that do not exist'
	).toEqual([]);
});

test('every route answers every kind of visitor as the table says', async ({
	browser,
	playwright,
	baseURL
}) => {
	test.setTimeout(180_000);
	const params = await loadParams();
	const cookies = await sessionCookies(browser, VISITOR_KINDS);

	const mismatches: string[] = [];
	let checked = 0;
	for (const visitor of VISITOR_KINDS) {
		// One request context per visitor: its cookie jar never carries another visitor's session.
		const api = await playwright.request.newContext({
			baseURL,
			extraHTTPHeaders: {
				...(cookies[visitor] ? { cookie: cookies[visitor]! } : {}),
				origin: baseURL ?? ''
			}
		});
		for (const row of ACCESS_TABLE) {
			const url =
				fillRoute(row.route, { ...params, ...resolveParams(row.params, params) }) +
				(row.query ? `?${row.query.replace(/\$(\w+)/g, (_, k: string) => params[k])}` : '');
			const response = await api.fetch(url, { method: row.method ?? 'GET', maxRedirects: 0 });
			const status = response.status();
			const location = response.headers()['location'] ?? '';
			const got: Answer | number =
				(status === 303 || status === 302) && location.includes('/signin') ? 'signin' : status;
			const expected = row.answers[visitor];
			checked++;
			if (got !== expected)
				mismatches.push(
					`${row.method ?? 'GET'} ${url} as ${visitor}: expected ${expected}, got ${got}`
				);
		}
		await api.dispose();
	}
	console.log(
		`access table: ${ACCESS_TABLE.length} rows x ${VISITOR_KINDS.length} visitors = ${checked} answers checked`
	);
	expect(mismatches).toEqual([]);
});
