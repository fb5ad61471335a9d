/**
 * The busy Saturday: many shows judging at once on one host, against one server or against
 * several instances of it (every client dealt to one instance, in turn), all paced as people are:
 * - saves: every judge of every show being judged (600 for 20 shows of 30) saves one of their
 *   sheets every `saveIntervalMs` (4 s: about 150 saves a second), through PUT /api/judging/sheets;
 * - boards: every show's chair has the progress board open, which asks for
 *   /api/chair/shows/<slug>/board every `boardIntervalMs` (3 s, as the board page polls);
 * - public reads: `readers` visitors (no session) each read the public results page of a show
 *   published earlier every `readerIntervalMs`.
 * Each client starts at a random moment of its first interval and waits for its answer before the
 * next (a slow answer makes it ask later, as a tablet or browser does). Times run from sending to
 * the answer's last byte; the CPU time is the servers' processes' (and PostgreSQL's) over the run.
 */
import { readFileSync, readdirSync } from 'node:fs';
import http from 'node:http';
import { loadavg } from 'node:os';
import type { BenchSaturday } from './generate';
import { cpuMs, percentile, saveMaker, timedRequest } from './loads';

/** One kind of request of the load. */
export interface KindFigures {
	clients: number;
	intervalMs: number;
	requests: number;
	requestsPerSecond: number;
	latencyMs: { p50: number; p95: number; p99: number; max: number };
	non2xx: number;
	errors: number;
}

/** What the servers did under the busy Saturday. */
export interface SaturdayFigures {
	instances: number;
	seconds: number;
	saves: KindFigures & { saved: number };
	boards: KindFigures;
	publicReads: KindFigures;
	requests: number;
	requestsPerSecond: number;
	/** The servers' CPU time per answered request of any kind (user + system, from /proc). */
	cpuMsPerRequest: number | null;
	/** PostgreSQL's CPU time (every process of our cluster) per answered request. */
	postgresCpuMsPerRequest: number | null;
	/** The machine's load average (1, 5, 15 min) at the end of the run. */
	loadAverage: number[];
}

export interface SaturdaySettings {
	saveIntervalMs: number;
	boardIntervalMs: number;
	readers: number;
	readerIntervalMs: number;
	seconds: number;
}

/** CPU time (ms) of every process of our PostgreSQL cluster: the postmaster and its children. */
export function postgresCpuMs(dataDir: string): number | null {
	try {
		const postmaster = Number(readFileSync(`${dataDir}/postmaster.pid`, 'utf8').split('\n')[0]);
		let total = cpuMs(postmaster) ?? 0;
		for (const name of readdirSync('/proc')) {
			if (!/^\d+$/.test(name)) continue;
			try {
				const stat = readFileSync(`/proc/${name}/stat`, 'utf8');
				const fields = stat.slice(stat.lastIndexOf(')') + 2).split(' ');
				// The parent's pid is the 2nd field after the command name.
				if (Number(fields[1]) === postmaster) total += cpuMs(Number(name)) ?? 0;
			} catch {
				// The process ended meanwhile.
			}
		}
		return total;
	} catch {
		return null;
	}
}

class Tally {
	times: number[] = [];
	non2xx = 0;
	errors = 0;
	constructor(
		readonly clients: number,
		readonly intervalMs: number
	) {}

	figures(seconds: number): KindFigures {
		const sorted = [...this.times].sort((a, b) => a - b);
		const ms = (v: number) => Math.round(v * 10) / 10;
		return {
			clients: this.clients,
			intervalMs: this.intervalMs,
			requests: sorted.length,
			requestsPerSecond: Math.round((sorted.length / seconds) * 10) / 10,
			latencyMs: {
				p50: ms(percentile(sorted, 50)),
				p95: ms(percentile(sorted, 95)),
				p99: ms(percentile(sorted, 99)),
				max: ms(sorted.at(-1) ?? 0)
			},
			non2xx: this.non2xx,
			errors: this.errors
		};
	}
}

/**
 * Runs the busy Saturday for `seconds` against the instances in `targets` (one, or several of the
 * same server sharing the database). Returns the times per kind, the answered and failed
 * requests, and the CPU time per request.
 */
export async function busySaturday(input: {
	targets: { url: string; pid?: number }[];
	saturday: BenchSaturday;
	dbUrl: string;
	dbDir: string;
	settings: SaturdaySettings;
}): Promise<SaturdayFigures> {
	const { targets, saturday, dbUrl, dbDir, settings } = input;
	const { seconds } = settings;
	const judges = saturday.shows.flatMap((s) => s.judges);
	const counter = { saved: 0 };
	const saves = await saveMaker({ judges }, dbUrl, counter);
	const agents = targets.map(() => new http.Agent({ keepAlive: true }));
	const tally = {
		saves: new Tally(judges.length, settings.saveIntervalMs),
		boards: new Tally(saturday.shows.length, settings.boardIntervalMs),
		publicReads: new Tally(settings.readers, settings.readerIntervalMs)
	};
	const cpuBefore = targets.map((t) => cpuMs(t.pid));
	const pgBefore = postgresCpuMs(dbDir);
	const startedAt = performance.now();
	const until = startedAt + seconds * 1000;
	const pause = (ms: number) => new Promise((r) => setTimeout(r, Math.max(0, ms)));
	/** One client: `act` every intervalMs from a random moment of the first interval on. */
	const client = async (intervalMs: number, act: () => Promise<void>) => {
		let due = startedAt + Math.random() * intervalMs;
		for (;;) {
			await pause(due - performance.now());
			if (performance.now() >= until) return;
			await act();
			due += intervalMs;
		}
	};
	/** Sends one request to the client's instance and counts it in its kind's tally. */
	const ask = async (
		kind: Tally,
		i: number,
		method: 'GET' | 'PUT',
		path: string,
		headers: Record<string, string>,
		body?: string
	) => {
		const t = i % targets.length;
		try {
			const answer = await timedRequest(
				agents[t],
				`${targets[t].url}${path}`,
				method,
				headers,
				body
			);
			kind.times.push(answer.ms);
			if (answer.status !== 200) kind.non2xx++;
			return answer;
		} catch {
			kind.errors++;
			return null;
		}
	};
	const clients: Promise<void>[] = [];
	judges.forEach((_, j) =>
		clients.push(
			client(settings.saveIntervalMs, async () => {
				const save = saves.next(j);
				const answer = await ask(
					tally.saves,
					j,
					'PUT',
					'/api/judging/sheets',
					save.headers,
					save.body
				);
				if (answer?.status === 200) saves.answered(save.key, answer.status, answer.body);
			})
		)
	);
	saturday.shows.forEach((show, c) =>
		clients.push(
			client(settings.boardIntervalMs, async () => {
				await ask(tally.boards, c, 'GET', `/api/chair/shows/${show.slug}/board`, {
					cookie: `authjs.session-token=${show.chairSessionToken}`
				});
			})
		)
	);
	for (let r = 0; r < settings.readers; r++) {
		clients.push(
			client(settings.readerIntervalMs, async () => {
				await ask(tally.publicReads, r, 'GET', `/shows/${saturday.published.slug}/results`, {
					'accept-encoding': 'gzip'
				});
			})
		);
	}
	await Promise.all(clients);
	const cpuAfter = targets.map((t) => cpuMs(t.pid));
	const pgAfter = postgresCpuMs(dbDir);
	for (const a of agents) a.destroy();

	let cpu: number | null = 0;
	targets.forEach((_, i) => {
		const b = cpuBefore[i];
		const a = cpuAfter[i];
		cpu = cpu !== null && a !== null && b !== null ? cpu + a - b : null;
	});
	const figures = {
		saves: { ...tally.saves.figures(seconds), saved: counter.saved },
		boards: tally.boards.figures(seconds),
		publicReads: tally.publicReads.figures(seconds)
	};
	const requests = figures.saves.requests + figures.boards.requests + figures.publicReads.requests;
	const perRequest = (ms: number | null) =>
		ms !== null && requests > 0 ? Math.round((ms / requests) * 100) / 100 : null;
	return {
		instances: targets.length,
		seconds,
		...figures,
		requests,
		requestsPerSecond: Math.round((requests / seconds) * 10) / 10,
		cpuMsPerRequest: perRequest(cpu),
		postgresCpuMsPerRequest: perRequest(
			pgBefore !== null && pgAfter !== null ? pgAfter - pgBefore : null
		),
		loadAverage: loadavg().map((l) => Math.round(l * 100) / 100)
	};
}
