/**
 * Generated shows for tests: invented exhibitors and varieties, scores from a seeded random
 * source, awards from the real awards engine (`computeAwards`) under the seed rules. Used by the
 * unit tests of the documents, the CSV, the e-mails and the charts.
 */
import {
	computeAwards,
	DEFAULT_AWARD_RULES,
	describeAwardSettings,
	type AwardRules
} from '$lib/domain/awards';
import { assembleResults, type ResultsSource } from './assemble';
import type { ShowResults } from './types';

/** A small deterministic random source (mulberry32). */
function random(seed: number): () => number {
	let a = seed >>> 0;
	return () => {
		a = (a + 0x6d2b79f5) >>> 0;
		let t = a;
		t = Math.imul(t ^ (t >>> 15), t | 1);
		t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
		return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
	};
}

const WORDS = ['Moonlit', 'Harbour', 'Velvet', 'Orchard', 'Quiet', 'Ember', 'Tidal', 'Frost'];
const SECOND = ['Ruffles', 'Lantern', 'Sky', 'Meadow', 'Glow', 'Echo', 'Fable', 'Spire'];

/** Options for `generateShow`. */
export interface GeneratedShowOptions {
	entries: number;
	classesPerDivision?: number;
	divisions?: number;
	exhibitors?: number;
	seed?: number;
	rules?: AwardRules;
}

/** The source rows of a generated show (before assembly), and its assembled results. */
export function generateShow(options: GeneratedShowOptions): {
	source: ResultsSource;
	results: ShowResults;
} {
	const rnd = random(options.seed ?? 7);
	const divisionCount = options.divisions ?? 2;
	const perDivision = options.classesPerDivision ?? 10;
	const exhibitorCount = options.exhibitors ?? 40;
	const divisions = Array.from({ length: divisionCount }, (_, d) => ({
		id: `d${d + 1}`,
		code: String.fromCharCode(65 + d),
		name: d === 0 ? 'Horticulture' : `Division ${d + 1}`
	}));
	const classes = divisions.flatMap((d, di) =>
		Array.from({ length: perDivision }, (_, c) => ({
			id: `c${di + 1}-${String(c + 1).padStart(2, '0')}`,
			code: String(di * 100 + c + 1),
			name: `Class ${di * 100 + c + 1}, invented`,
			divisionId: d.id
		}))
	);
	const exhibitors = Array.from({ length: exhibitorCount }, (_, i) => ({
		id: `x${i + 1}`,
		name: `Exhibitor ${i + 1} Testwood`
	}));
	const entries: ResultsSource['entries'] = Array.from({ length: options.entries }, (_, i) => {
		const cls = classes[i % classes.length];
		const ex = exhibitors[Math.floor(rnd() * exhibitors.length)];
		const notJudged = rnd() < 0.02;
		const score = notJudged ? null : Math.round((60 + rnd() * 40) * 2) / 2;
		return {
			id: `e${i + 1}`,
			number: i + 1,
			classId: cls.id,
			plant: `${WORDS[i % WORDS.length]} ${SECOND[Math.floor(i / WORDS.length) % SECOND.length]}`,
			exhibitorId: ex.id,
			exhibitor: ex.name,
			score,
			state: notJudged ? 'not_judged' : 'scored',
			comments: score !== null && score >= 90 ? [`Even rosette, entry ${i + 1}.`] : []
		};
	});
	const rules: AwardRules = options.rules ?? {
		...DEFAULT_AWARD_RULES,
		topAwards: [
			{
				id: 'best-in-show',
				name: 'Best in show',
				classIds: classes.filter((c) => c.divisionId === 'd1').map((c) => c.id),
				minScore: 90
			}
		]
	};
	const computed = computeAwards({
		classes,
		entries: entries.map((e) => ({
			id: e.id,
			number: e.number,
			classId: e.classId,
			exhibitorId: e.exhibitorId,
			score: e.score,
			notJudged: e.state === 'not_judged',
			// The judges' recorded preference separates equal scores (1 is preferred).
			judgesChoiceRank: e.number
		})),
		rules
	});
	const names = new Map(rules.topAwards.map((t) => [t.id, t.name]));
	const source: ResultsSource = {
		show: {
			id: 'show-1',
			slug: 'generated-show',
			name: 'Generated Autumn Show',
			societyName: 'Invented Violet Society',
			venue: 'Community hall',
			judgingDay: '2026-10-10',
			system: rules.system,
			awardSettings: describeAwardSettings(rules, 'mean'),
			publishedAt: '2026-10-10T18:00:00.000Z'
		},
		divisions,
		classes,
		entries,
		awards: computed.awards.map((a) => ({
			...a,
			topAwardName: a.topAwardId ? (names.get(a.topAwardId) ?? null) : null
		})),
		undecided: computed.ties.map((t) => t.reason)
	};
	return { source, results: assembleResults(source) };
}
