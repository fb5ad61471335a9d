/**
 * The benchmark's loads, driven by autocannon on loopback and bounded in time, and the size of a
 * page's JavaScript and CSS as shipped (gzip).
 * - saves: each connection is one of the show's judges saving their own sheets through
 *   PUT /api/judging/sheets with their session cookie; every request is a fresh change (new change
 *   id, the sheet's current version, other deductions and comment), so every save is real.
 * - results: visitors reading the public results page of the published show.
 * - paced saves (pacedSaves): the show's judges at a show's own pace, each saving one sheet every
 *   few seconds, for the times a judge meets at a realistic rate rather than at saturation.
 * - saves spread (savesSpread): saves at saturation against one or several instances of the app
 *   at once, for the throughput of two instances against one.
 * The busy Saturday's load, of many shows at once, is in saturday.ts.
 */
import { randomUUID } from 'node:crypto';
import { readFileSync } from 'node:fs';
import http from 'node:http';
import { createRequire } from 'node:module';
import { gzipSync } from 'node:zlib';
import pg from 'pg';
import { CRITERIA, type BenchJudge, type BenchShow } from './generate';

/** The parts of autocannon (CommonJS, no types shipped) the benchmark uses. */
interface Request {
	method?: string;
	path?: string;
	headers?: Record<string, string>;
	body?: string;
	setupRequest?: (req: Request, context: Context) => Request;
	onResponse?: (status: number, body: string, context: Context) => void;
}
/** autocannon's result without aggregation: the latencies come as an encoded histogram. */
interface Result {
	latencies: string;
	totalCompletedRequests: number;
	duration: number;
	non2xx: number;
	errors: number;
	timeouts: number;
}
type Autocannon = (options: object, done: (err: Error | null, result: Result) => void) => void;
interface Histogram {
	add(other: Histogram): void;
	getValueAtPercentile(p: number): number;
	maxValue: number;
	totalCount: number;
}

const requireHere = createRequire(import.meta.url);
const autocannon = requireHere('autocannon') as Autocannon;
// autocannon's own histogram helpers, so the percentiles come from the latencies it recorded.
const { decodeHist } = requireHere('autocannon/lib/histUtil.js') as {
	decodeHist(encoded: string): Histogram;
};

/** The current version of every judge's sheet, keyed judge:entry. */
async function sheetVersions(dbUrl: string): Promise<Map<string, number>> {
	const client = new pg.Client({ connectionString: dbUrl });
	await client.connect();
	try {
		const { rows } = await client.query<{ judge_id: string; entry_id: string; version: number }>(
			`SELECT judge_id, entry_id, version FROM score_sheets WHERE kind = 'judge'`
		);
		return new Map(rows.map((r) => [`${r.judge_id}:${r.entry_id}`, r.version]));
	} finally {
		await client.end();
	}
}

interface Context {
	key?: string;
}

/** Counts saves across every load of the run, so no two changes of a run are the same. */
let n = 0;

/** The requests of one load: a function that makes each request fresh. */
async function requestsFor(
	kind: 'saves' | 'results',
	show: BenchShow,
	dbUrl: string,
	counter: { saved: number }
): Promise<Request[]> {
	if (kind === 'results') return [{ method: 'GET', path: `/shows/${show.slug}/results` }];
	return saveRequests(show, await saveMaker(show, dbUrl, counter));
}

/** autocannon's requests of a save load, each a fresh save of one of the judges. */
function saveRequests(show: SavingJudges, saves: SaveMaker): Request[] {
	return [
		{
			method: 'PUT',
			path: '/api/judging/sheets',
			setupRequest: (req: Request, context: Context) => {
				const save = saves.next(n % show.judges.length);
				context.key = save.key;
				return { ...req, headers: save.headers, body: save.body };
			},
			onResponse: (status: number, body: string, context: Context) => {
				if (context.key) saves.answered(context.key, status, body);
			}
		}
	];
}

/** One save as a judge's tablet sends it: the sheet's key (judge:entry), headers and body. */
export interface Save {
	key: string;
	headers: Record<string, string>;
	body: string;
}

/** The judges whose sheets a save load changes (of one show, or of several). */
export type SavingJudges = { judges: BenchJudge[] };

export type SaveMaker = Awaited<ReturnType<typeof saveMaker>>;

/**
 * Makes fresh saves of the show's judges (each a new change id on the sheet's current version,
 * other deductions and comment, so every save is real) and learns the new versions from answers.
 */
export async function saveMaker(show: SavingJudges, dbUrl: string, counter: { saved: number }) {
	const versions = await sheetVersions(dbUrl);
	const position = show.judges.map(() => 0);
	return {
		next(j: number): Save {
			const judge = show.judges[j];
			const entryId = judge.entryIds[position[j]++ % judge.entryIds.length];
			const key = `${judge.id}:${entryId}`;
			const deductions: Record<string, number> = {};
			CRITERIA.forEach((c, i) => (deductions[c.key] = ((n + i) % 8) / 2));
			n++;
			return {
				key,
				headers: {
					'content-type': 'application/json',
					cookie: `authjs.session-token=${judge.sessionToken}`
				},
				body: JSON.stringify({
					changeId: randomUUID(),
					entryId,
					baseVersion: versions.get(key) ?? 0,
					deductions,
					comment: `Benchmark round ${n}`,
					notJudged: null,
					judgesChoiceRank: null
				})
			};
		},
		answered(key: string, status: number, body: string): void {
			if (status !== 200) return;
			const answer = JSON.parse(body) as { status: string; sheet: { version: number } };
			versions.set(key, answer.sheet.version);
			if (answer.status === 'saved') counter.saved++;
		}
	};
}

function once(options: object): Promise<Result> {
	return new Promise((resolve, reject) => {
		autocannon({ ...options, skipAggregateResult: true }, (err, result) =>
			err ? reject(err) : resolve(result)
		);
	});
}

/** Lets requests still in flight when a load stops land before the next load begins. */
export const settle = () => new Promise((r) => setTimeout(r, 1500));

/** What one server did under one load, across its turns. */
export interface LoadFigures {
	requests: number;
	requestsPerSecond: number;
	latencyMs: Latency;
	/**
	 * CPU time the server's process spent per answered request (user + system, from /proc): less
	 * sensitive to a busy machine than the times, since waiting for a core costs no CPU time.
	 */
	cpuMsPerRequest: number | null;
	non2xx: number;
	errors: number;
	timeouts: number;
	saved?: number;
}

/** CPU time (user + system) a process has used so far, in ms; null where /proc is not there. */
export function cpuMs(pid: number | undefined): number | null {
	if (!pid) return null;
	try {
		const stat = readFileSync(`/proc/${pid}/stat`, 'utf8');
		// The fields after the command name (in parentheses): utime and stime are the 12th and 13th.
		const fields = stat.slice(stat.lastIndexOf(')') + 2).split(' ');
		// In clock ticks of 1/100 s (USER_HZ on Linux).
		return ((Number(fields[11]) + Number(fields[12])) * 1000) / 100;
	} catch {
		return null;
	}
}

/**
 * The same load against several servers, taken in turns so that a noisy machine weighs on each
 * alike: 2 s of warm-up each (not counted), then `rounds` turns of `seconds / rounds` each.
 * Latency percentiles come from every measured request of a server, across its turns.
 */
export async function compareLoads(input: {
	kind: 'saves' | 'results';
	targets: { name: string; url: string; pid?: number }[];
	show: BenchShow;
	seconds: number;
	rounds: number;
	connections: number;
	dbUrl: string;
}): Promise<Record<string, LoadFigures>> {
	const { kind, targets, show, seconds, rounds, connections, dbUrl } = input;
	const options = (url: string) => ({ url, connections, pipelining: 1, timeout: 10 });
	for (const t of targets) {
		// The first visitor after publishing fills the app's results cache; the load reads after.
		if (kind === 'results')
			await fetch(`${t.url}/shows/${show.slug}/results`).then((r) => r.text());
		const requests = await requestsFor(kind, show, dbUrl, { saved: 0 });
		await once({ ...options(t.url), duration: 2, requests });
		await settle();
	}
	const totals = new Map(
		targets.map((t) => [
			t.name,
			{
				requests: 0,
				duration: 0,
				non2xx: 0,
				errors: 0,
				timeouts: 0,
				saved: 0,
				cpuMs: 0 as number | null,
				latencies: null as Histogram | null
			}
		])
	);
	for (let round = 0; round < rounds; round++) {
		for (const t of targets) {
			const total = totals.get(t.name)!;
			const counter = { saved: 0 };
			const requests = await requestsFor(kind, show, dbUrl, counter);
			const cpuBefore = cpuMs(t.pid);
			const result = await once({ ...options(t.url), duration: seconds / rounds, requests });
			const cpuAfter = cpuMs(t.pid);
			await settle();
			total.cpuMs =
				total.cpuMs !== null && cpuBefore !== null && cpuAfter !== null
					? total.cpuMs + cpuAfter - cpuBefore
					: null;
			total.requests += result.totalCompletedRequests;
			total.duration += result.duration;
			total.non2xx += result.non2xx;
			total.errors += result.errors;
			total.timeouts += result.timeouts;
			total.saved += counter.saved;
			const latencies = decodeHist(result.latencies);
			if (total.latencies) total.latencies.add(latencies);
			else total.latencies = latencies;
		}
	}
	const figures: Record<string, LoadFigures> = {};
	for (const [name, t] of totals) {
		const h = t.latencies!;
		figures[name] = {
			requests: t.requests,
			requestsPerSecond: Math.round((t.requests / t.duration) * 10) / 10,
			latencyMs: {
				p50: h.getValueAtPercentile(50),
				p95: h.getValueAtPercentile(95),
				p99: h.getValueAtPercentile(99),
				max: h.maxValue
			},
			cpuMsPerRequest:
				t.cpuMs !== null && t.requests > 0 ? Math.round((t.cpuMs / t.requests) * 100) / 100 : null,
			non2xx: t.non2xx,
			errors: t.errors,
			timeouts: t.timeouts,
			...(kind === 'saves' ? { saved: t.saved } : {})
		};
	}
	return figures;
}

/** GETs a URL and returns the raw bytes as sent (not decompressed) and the headers. */
function getRaw(url: string, headers: Record<string, string>) {
	return new Promise<{ status: number; body: Buffer; encoding: string | undefined }>(
		(resolve, reject) => {
			http
				.get(url, { headers }, (res) => {
					const chunks: Buffer[] = [];
					res.on('data', (c: Buffer) => chunks.push(c));
					res.on('end', () =>
						resolve({
							status: res.statusCode ?? 0,
							body: Buffer.concat(chunks),
							encoding: res.headers['content-encoding']
						})
					);
				})
				.on('error', reject);
		}
	);
}

/**
 * The JavaScript and CSS a page ships: the page's modulepreload, script and stylesheet links and
 * every module they import statically, each fetched as a browser would (accept-encoding gzip) and
 * counted as sent; an asset the server sends uncompressed is counted gzip-compressed by us.
 */
export async function pageAssetBytes(pageUrl: string, cookie: string) {
	const page = await getRaw(pageUrl, { cookie });
	if (page.status !== 200) throw new Error(`${pageUrl} answered ${page.status}`);
	const html = page.body.toString('utf8');
	const origin = new URL(pageUrl).origin;
	const queue: string[] = [];
	for (const m of html.matchAll(/<link[^>]+>/g)) {
		const href = /href="([^"]+)"/.exec(m[0])?.[1];
		if (href && /rel="(modulepreload|stylesheet)"/.test(m[0]))
			queue.push(new URL(href, pageUrl).href);
	}
	for (const m of html.matchAll(/import\(\s*"([^"]+)"\s*\)/g))
		queue.push(new URL(m[1], pageUrl).href);
	const seen = new Set<string>();
	const files: { path: string; gzipBytes: number; rawBytes: number }[] = [];
	let jsGzipBytes = 0;
	let cssGzipBytes = 0;
	while (queue.length > 0) {
		const url = queue.shift()!;
		if (seen.has(url) || !url.startsWith(origin)) continue;
		seen.add(url);
		const sent = await getRaw(url, { 'accept-encoding': 'gzip' });
		if (sent.status !== 200) throw new Error(`${url} answered ${sent.status}`);
		const gz = sent.encoding === 'gzip' ? sent.body : gzipSync(sent.body);
		const plain = (await getRaw(url, {})).body;
		files.push({ path: new URL(url).pathname, gzipBytes: gz.length, rawBytes: plain.length });
		if (url.endsWith('.css')) cssGzipBytes += gz.length;
		else {
			jsGzipBytes += gz.length;
			const code = plain.toString('utf8');
			for (const m of code.matchAll(/(?:import|from)\s*["']([^"']+\.js)["']/g)) {
				queue.push(new URL(m[1], url).href);
			}
		}
	}
	return {
		url: new URL(pageUrl).pathname.replace(/[0-9a-f-]{36}/, '<classId>'),
		jsGzipBytes,
		cssGzipBytes,
		htmlGzipBytes: gzipSync(page.body).length,
		files: files.length
	};
}

/** One save sent on a keep-alive connection: its status, body and time from send to last byte. */
function sendSave(
	agent: http.Agent,
	url: string,
	save: Save
): Promise<{ status: number; body: string; ms: number }> {
	return timedRequest(agent, `${url}/api/judging/sheets`, 'PUT', save.headers, save.body);
}

/** One request on a keep-alive connection: its status, body and time from send to last byte. */
export function timedRequest(
	agent: http.Agent,
	url: string,
	method: 'GET' | 'PUT',
	headers: Record<string, string>,
	body = ''
): Promise<{ status: number; body: string; ms: number }> {
	return new Promise((resolve, reject) => {
		const startedAt = performance.now();
		const req = http.request(
			url,
			{
				method,
				agent,
				headers: body ? { ...headers, 'content-length': String(Buffer.byteLength(body)) } : headers
			},
			(res) => {
				const chunks: Buffer[] = [];
				res.on('data', (c: Buffer) => chunks.push(c));
				res.on('end', () =>
					resolve({
						status: res.statusCode ?? 0,
						body: Buffer.concat(chunks).toString('utf8'),
						ms: performance.now() - startedAt
					})
				);
			}
		);
		req.setTimeout(10_000, () => req.destroy(new Error('timeout')));
		req.on('error', reject);
		req.end(body || undefined);
	});
}

/** The value at percentile p of values sorted from the smallest. */
export function percentile(sorted: number[], p: number): number {
	if (sorted.length === 0) return 0;
	return sorted[Math.min(sorted.length - 1, Math.ceil((p / 100) * sorted.length) - 1)];
}

/** Times of a load, in milliseconds. */
export interface Latency {
	p50: number;
	p95: number;
	p99: number;
	max: number;
}

/** p50, p95, p99 and max of times sorted ascending, to a tenth of a millisecond. */
export function latencyOf(sorted: number[]): {
	p50: number;
	p95: number;
	p99: number;
	max: number;
} {
	const ms = (v: number) => Math.round(v * 10) / 10;
	return {
		p50: ms(percentile(sorted, 50)),
		p95: ms(percentile(sorted, 95)),
		p99: ms(percentile(sorted, 99)),
		max: ms(sorted.at(-1) ?? 0)
	};
}

/** What one server did under the paced load. */
export interface PacedFigures {
	judges: number;
	intervalMs: number;
	requests: number;
	requestsPerSecond: number;
	latencyMs: Latency;
	non2xx: number;
	errors: number;
	saved: number;
}

/**
 * Saves at a show's own pace against one server: every judge (`judges` of the show's, one
 * keep-alive connection each) saves one of their sheets every `intervalMs` (each judge starting at
 * a random moment of the first interval, as tablets do), for `seconds`. Each save's time runs from
 * sending it to the answer's last byte; a judge whose save is slow simply saves later.
 */
export async function pacedSaves(input: {
	url: string;
	show: BenchShow;
	dbUrl: string;
	judges: number;
	intervalMs: number;
	seconds: number;
}): Promise<PacedFigures> {
	const { url, show, dbUrl, intervalMs, seconds } = input;
	const judges = Math.min(input.judges, show.judges.length);
	const counter = { saved: 0 };
	const saves = await saveMaker(show, dbUrl, counter);
	const agent = new http.Agent({ keepAlive: true, maxSockets: judges });
	const times: number[] = [];
	let non2xx = 0;
	let errors = 0;
	const startedAt = performance.now();
	const until = startedAt + seconds * 1000;
	const pause = (ms: number) => new Promise((r) => setTimeout(r, Math.max(0, ms)));
	const judge = async (j: number) => {
		let due = startedAt + Math.random() * intervalMs;
		for (;;) {
			await pause(due - performance.now());
			if (performance.now() >= until) return;
			const save = saves.next(j);
			try {
				const answer = await sendSave(agent, url, save);
				times.push(answer.ms);
				if (answer.status === 200) saves.answered(save.key, answer.status, answer.body);
				else non2xx++;
			} catch {
				errors++;
			}
			due += intervalMs;
		}
	};
	await Promise.all(Array.from({ length: judges }, (_, j) => judge(j)));
	agent.destroy();
	const sorted = [...times].sort((a, b) => a - b);
	return {
		judges,
		intervalMs,
		requests: times.length,
		requestsPerSecond: Math.round((times.length / seconds) * 10) / 10,
		latencyMs: latencyOf(sorted),
		non2xx,
		errors,
		saved: counter.saved
	};
}

/** What one or more instances of a server did together under one saturation save load. */
export interface SpreadFigures {
	instances: number;
	connections: number;
	requests: number;
	requestsPerSecond: number;
	latencyMs: Latency;
	cpuMsPerRequest: number | null;
	/** PostgreSQL's CPU time per request, when the caller can read it (postgresCpuMs). */
	postgresCpuMsPerRequest: number | null;
	non2xx: number;
	errors: number;
	timeouts: number;
	saved: number;
}

/**
 * Saves at saturation spread over several instances of one server at once (the connections dealt
 * out evenly, each instance its own autocannon run at the same time): 2 s of warm-up, then
 * `seconds` measured. The judges' saves come from one maker, so the instances share what they
 * learn of each sheet's version. CPU per request adds the instances' CPU times.
 */
export async function savesSpread(input: {
	targets: { url: string; pid?: number }[];
	judges: SavingJudges;
	dbUrl: string;
	connections: number;
	seconds: number;
	/** The CPU time PostgreSQL has used so far, in ms (or null). */
	postgresCpuMs?: () => number | null;
}): Promise<SpreadFigures> {
	const { targets, judges, dbUrl, seconds } = input;
	const each = Math.max(1, Math.floor(input.connections / targets.length));
	const run = async (duration: number, counter: { saved: number }) => {
		const saves = await saveMaker(judges, dbUrl, counter);
		return Promise.all(
			targets.map((t) =>
				once({
					url: t.url,
					connections: each,
					pipelining: 1,
					timeout: 10,
					duration,
					requests: saveRequests(judges, saves)
				})
			)
		);
	};
	await run(2, { saved: 0 });
	await settle();
	const counter = { saved: 0 };
	const pgCpu = input.postgresCpuMs ?? (() => null);
	const before = targets.map((t) => cpuMs(t.pid));
	const pgBefore = pgCpu();
	const results = await run(seconds, counter);
	const after = targets.map((t) => cpuMs(t.pid));
	const pgAfter = pgCpu();
	await settle();
	let cpu: number | null = 0;
	for (let i = 0; i < targets.length; i++) {
		const b = before[i];
		const a = after[i];
		cpu = cpu !== null && a !== null && b !== null ? cpu + a - b : null;
	}
	const latencies = results.map((r) => decodeHist(r.latencies));
	for (const h of latencies.slice(1)) latencies[0].add(h);
	const h = latencies[0];
	const requests = results.reduce((n, r) => n + r.totalCompletedRequests, 0);
	const duration = Math.max(...results.map((r) => r.duration));
	return {
		instances: targets.length,
		connections: each * targets.length,
		requests,
		requestsPerSecond: Math.round((requests / duration) * 10) / 10,
		latencyMs: {
			p50: h.getValueAtPercentile(50),
			p95: h.getValueAtPercentile(95),
			p99: h.getValueAtPercentile(99),
			max: h.maxValue
		},
		cpuMsPerRequest: cpu !== null && requests > 0 ? Math.round((cpu / requests) * 100) / 100 : null,
		postgresCpuMsPerRequest:
			pgBefore !== null && pgAfter !== null && requests > 0
				? Math.round(((pgAfter - pgBefore) / requests) * 100) / 100
				: null,
		non2xx: results.reduce((n, r) => n + r.non2xx, 0),
		errors: results.reduce((n, r) => n + r.errors, 0),
		timeouts: results.reduce((n, r) => n + r.timeouts, 0),
		saved: counter.saved
	};
}
