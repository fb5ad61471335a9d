/**
 * Builds `ShowResults` from flat rows (show, divisions, classes, entries with scores, stored
 * awards). Pure: the loader fetches the rows, this puts them together, so the documents can be
 * tested on generated shows without a database.
 */
import type { Award, AwardLevel } from '$lib/domain/awards';
import type {
	ResultClass,
	ResultDivision,
	ResultEntry,
	ResultState,
	ShowResults,
	SweepstakesRow,
	TopAwardResult
} from './types';

/** The rows `assembleResults` needs. */
export interface ResultsSource {
	show: ShowResults['show'];
	divisions: { id: string; code: string; name: string }[];
	/** In schedule order. */
	classes: { id: string; code: string; name: string; divisionId: string }[];
	entries: {
		id: string;
		number: number;
		classId: string;
		plant: string;
		exhibitorId: string;
		exhibitor: string;
		score: number | null;
		state: ResultState;
		comments: string[];
	}[];
	/** Stored awards (the engine's output), with the name of each top award. */
	awards: (Award & { topAwardName?: string | null })[];
	undecided?: string[];
}

const LEVEL_ORDER: AwardLevel[] = [
	'blue',
	'red',
	'white',
	'first',
	'second',
	'third',
	'honourable'
];

/** Orders entries best first: top awards, best in class, ribbon or place, score, entry number. */
function compareEntries(a: ResultEntry, b: ResultEntry): number {
	const levelRank = (e: ResultEntry) => (e.level ? LEVEL_ORDER.indexOf(e.level) : 99);
	return (
		b.topAwards.length - a.topAwards.length ||
		Number(b.bestInClass) - Number(a.bestInClass) ||
		levelRank(a) - levelRank(b) ||
		(b.score ?? -1) - (a.score ?? -1) ||
		a.number - b.number
	);
}

/** Counts ribbons (or places) per exhibitor in a division; winners first, then by counts. */
function sweepstakesOf(
	classes: ResultClass[],
	winners: Set<string>,
	system: 'merit' | 'placement'
): SweepstakesRow[] {
	const rows = new Map<string, SweepstakesRow>();
	for (const cls of classes) {
		for (const e of cls.entries) {
			if (!e.level) continue;
			let row = rows.get(e.exhibitorId);
			if (!row) {
				row = {
					exhibitorId: e.exhibitorId,
					exhibitor: e.exhibitor,
					blue: 0,
					red: 0,
					white: 0,
					first: 0,
					second: 0,
					third: 0,
					honourable: 0,
					winner: winners.has(e.exhibitorId)
				};
				rows.set(e.exhibitorId, row);
			}
			row[e.level] += 1;
		}
	}
	const order: AwardLevel[] =
		system === 'merit' ? ['blue', 'red', 'white'] : ['first', 'second', 'third', 'honourable'];
	return [...rows.values()].sort(
		(a, b) =>
			Number(b.winner) - Number(a.winner) ||
			order.reduce((d, l) => d || b[l] - a[l], 0) ||
			a.exhibitor.localeCompare(b.exhibitor)
	);
}

/** Puts a show's rows together into its results (see the module comment). */
export function assembleResults(source: ResultsSource): ShowResults {
	const entries = new Map<string, ResultEntry>();
	const byClass = new Map<string, ResultEntry[]>();
	for (const e of source.entries) {
		const entry: ResultEntry = {
			id: e.id,
			number: e.number,
			plant: e.plant,
			exhibitorId: e.exhibitorId,
			exhibitor: e.exhibitor,
			score: e.score,
			state: e.state,
			level: null,
			bestInClass: false,
			topAwards: [],
			comments: e.comments
		};
		entries.set(e.id, entry);
		const list = byClass.get(e.classId);
		if (list) list.push(entry);
		else byClass.set(e.classId, [entry]);
	}

	const classById = new Map(source.classes.map((c) => [c.id, c]));
	const sweepstakesWinners = new Map<string, Set<string>>();
	const topAwards: TopAwardResult[] = [];
	for (const a of source.awards) {
		const entry = a.entryId ? entries.get(a.entryId) : undefined;
		if (a.kind === 'ribbon' || a.kind === 'placement') {
			if (entry && a.level) entry.level = a.level;
		} else if (a.kind === 'best_in_class') {
			if (entry) entry.bestInClass = true;
		} else if (a.kind === 'top_award') {
			if (!entry) continue;
			const name = a.topAwardName ?? 'Top award';
			entry.topAwards.push(name);
			const cls = a.classId ? classById.get(a.classId) : undefined;
			topAwards.push({
				name,
				entryId: entry.id,
				number: entry.number,
				classCode: cls?.code ?? '',
				className: cls?.name ?? '',
				plant: entry.plant,
				exhibitorId: entry.exhibitorId,
				exhibitor: entry.exhibitor,
				score: a.score ?? entry.score
			});
		} else if (a.kind === 'sweepstakes' && a.divisionId && a.exhibitorId) {
			const set = sweepstakesWinners.get(a.divisionId) ?? new Set<string>();
			set.add(a.exhibitorId);
			sweepstakesWinners.set(a.divisionId, set);
		}
	}

	const divisions: ResultDivision[] = source.divisions.map((d) => {
		const classes: ResultClass[] = source.classes
			.filter((c) => c.divisionId === d.id)
			.map((c) => ({
				id: c.id,
				code: c.code,
				name: c.name,
				entries: (byClass.get(c.id) ?? []).sort(compareEntries)
			}));
		return {
			id: d.id,
			code: d.code,
			name: d.name,
			classes,
			sweepstakes: sweepstakesOf(
				classes,
				sweepstakesWinners.get(d.id) ?? new Set(),
				source.show.system
			)
		};
	});

	return {
		show: source.show,
		divisions,
		topAwards,
		undecided: source.undecided ?? []
	};
}

/** The results as the public sees them: the judges' comments stay with the exhibitor. */
export function publicResults(results: ShowResults): ShowResults {
	return {
		...results,
		divisions: results.divisions.map((d) => ({
			...d,
			classes: d.classes.map((c) => ({
				...c,
				entries: c.entries.map((e) => ({ ...e, comments: [] }))
			}))
		}))
	};
}

/** Every entry of the results, in schedule order, with its division and class. */
export function* eachEntry(
	results: ShowResults
): Generator<{ division: ResultDivision; cls: ResultClass; entry: ResultEntry }> {
	for (const division of results.divisions) {
		for (const cls of division.classes) {
			for (const entry of cls.entries) yield { division, cls, entry };
		}
	}
}
