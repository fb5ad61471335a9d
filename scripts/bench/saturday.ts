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
 * A run is taken in turns (busySaturdayTurn), so that the servers compared meet a busy machine
 * alike; saturdayFigures adds the turns of one server up.
 */
import { readFileSync, readdirSync } from 'node:fs';
import http from 'node:http';
import { loadavg } from 'node:os';
import type { BenchSaturday } from './generate';
import { cpuMs, latencyOf, saveMaker, timedRequest, type Latency } from './loads';

/** One kind of request of the load. */
export interface KindFigures {
	clients: number;
	intervalMs: number;
	requests: number;
	requestsPerSecond: number;
	latencyMs: Latency;
	non2xx: number;
	errors: number;
}

/** What the servers did under the busy Saturday, across its turns. */
export interface SaturdayFigures {
	instances: number;
	seconds: number;
	/** Each turn's save p95 and the machine's load average (1 min) at its end. */
	turns: { savesP95Ms: number; loadAverage1m: number }[];
	saves: KindFigures & { saved: number };
	boards: KindFigures;
	publicReads: KindFigures;
	requests: number;
	requestsPerSecond: number;
	/** The servers' CPU time per answered request of any kind (user + system, from /proc). */
	cpuMsPerRequest: number | null;
	/** PostgreSQL's CPU time (every process of our cluster) per answered request. */
	postgresCpuMsPerRequest: number | null;
}

export interface SaturdaySettings {
	saveIntervalMs: number;
	boardIntervalMs: number;
	readers: number;
	readerIntervalMs: number;
	seconds: number;
}

/** The fields of /proc/<pid>/stat after the command name (state is the first, the parent second). */
function statFields(pid: number | string): string[] {
	const stat = readFileSync(`/proc/${pid}/stat`, 'utf8');
	return stat.slice(stat.lastIndexOf(')') + 2).split(' ');
}

/**
 * CPU time (ms) of our PostgreSQL cluster so far: the postmaster's own, that of its backends that
 * have ended (its children's time, once reaped), and that of its live backends. Null without /proc.
 */
export function postgresCpuMs(dataDir: string): number | null {
	try {
		const postmaster = Number(readFileSync(`${dataDir}/postmaster.pid`, 'utf8').split('\n')[0]);
		// utime, stime, cutime and cstime, in clock ticks of 1/100 s.
		const own = statFields(postmaster).slice(11, 15);
		let ticks = own.reduce((n, v) => n + Number(v), 0);
		for (const name of readdirSync('/proc')) {
			if (!/^\d+$/.test(name)) continue;
			try {
				const fields = statFields(name);
				if (Number(fields[1]) === postmaster) ticks += Number(fields[11]) + Number(fields[12]);
			} catch {
				// The process ended meanwhile.
			}
		}
		return ticks * 10;
	} catch {
		return null;
	}
}

/** The answers of one kind of request in one turn. */
interface Tally {
	clients: number;
	intervalMs: number;
	times: number[];
	non2xx: number;
	errors: number;
}

const tallyOf = (clients: number, intervalMs: number): Tally => ({
	clients,
	intervalMs,
	times: [],
	non2xx: 0,
	errors: 0
});

/** One turn of the busy Saturday against one server (one or several instances). */
export interface SaturdayTurn {
	instances: number;
	seconds: number;
	saves: Tally;
	boards: Tally;
	publicReads: Tally;
	saved: number;
	cpuMs: number | null;
	postgresCpuMs: number | null;
	loadAverage1m: number;
}

function figuresOf(tallies: Tally[], seconds: number): KindFigures {
	const sorted = tallies.flatMap((t) => t.times).sort((a, b) => a - b);
	return {
		clients: tallies[0].clients,
		intervalMs: tallies[0].intervalMs,
		requests: sorted.length,
		requestsPerSecond: Math.round((sorted.length / seconds) * 10) / 10,
		latencyMs: latencyOf(sorted),
		non2xx: tallies.reduce((n, t) => n + t.non2xx, 0),
		errors: tallies.reduce((n, t) => n + t.errors, 0)
	};
}

const addUp = (values: (number | null)[]): number | null =>
	values.reduce<number | null>((n, v) => (n !== null && v !== null ? n + v : null), 0);

/** The figures of one server from its turns: times across every turn, CPU time per request. */
export function saturdayFigures(turns: SaturdayTurn[]): SaturdayFigures {
	const seconds = turns.reduce((n, t) => n + t.seconds, 0);
	const figures = {
		saves: {
			...figuresOf(
				turns.map((t) => t.saves),
				seconds
			),
			saved: turns.reduce((n, t) => n + t.saved, 0)
		},
		boards: figuresOf(
			turns.map((t) => t.boards),
			seconds
		),
		publicReads: figuresOf(
			turns.map((t) => t.publicReads),
			seconds
		)
	};
	const requests = figures.saves.requests + figures.boards.requests + figures.publicReads.requests;
	const perRequest = (ms: number | null) =>
		ms !== null && requests > 0 ? Math.round((ms / requests) * 100) / 100 : null;
	return {
		instances: turns[0].instances,
		seconds,
		turns: turns.map((t) => ({
			savesP95Ms: figuresOf([t.saves], t.seconds).latencyMs.p95,
			loadAverage1m: t.loadAverage1m
		})),
		...figures,
		requests,
		requestsPerSecond: Math.round((requests / seconds) * 10) / 10,
		cpuMsPerRequest: perRequest(addUp(turns.map((t) => t.cpuMs))),
		postgresCpuMsPerRequest: perRequest(addUp(turns.map((t) => t.postgresCpuMs)))
	};
}

/**
 * One turn of the busy Saturday for `settings.seconds` against the instances in `targets` (one,
 * or several of the same server sharing the database; each client keeps to one of them).
 */
export async function busySaturdayTurn(input: {
	targets: { url: string; pid?: number }[];
	saturday: BenchSaturday;
	dbUrl: string;
	dbDir: string;
	settings: SaturdaySettings;
}): Promise<SaturdayTurn> {
	const { targets, saturday, dbUrl, dbDir, settings } = input;
	const { seconds } = settings;
	const judges = saturday.shows.flatMap((s) => s.judges);
	const counter = { saved: 0 };
	const saves = await saveMaker({ judges }, dbUrl, counter);
	const agents = targets.map(() => new http.Agent({ keepAlive: true }));
	const tally = {
		saves: tallyOf(judges.length, settings.saveIntervalMs),
		boards: tallyOf(saturday.shows.length, settings.boardIntervalMs),
		publicReads: tallyOf(settings.readers, settings.readerIntervalMs)
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
	return {
		instances: targets.length,
		seconds,
		...tally,
		saved: counter.saved,
		cpuMs: addUp(
			targets.map((_, i) => {
				const b = cpuBefore[i];
				const a = cpuAfter[i];
				return a !== null && b !== null ? a - b : null;
			})
		),
		postgresCpuMs: pgBefore !== null && pgAfter !== null ? pgAfter - pgBefore : null,
		loadAverage1m: Math.round(loadavg()[0] * 100) / 100
	};
}
