/**
 * Chart data from results: the score distribution of each division and the ribbons (or places)
 * of each class. Pure, so the pages and their text alternatives show the same numbers.
 */
import type { AwardLevel } from '$lib/domain/awards';
import { LEVEL_LABELS } from './labels';
import type { ShowResults } from './types';

/** Score bands of five points from 60 up, with one band below. */
export const SCORE_BANDS: { label: string; min: number; max: number }[] = [
	{ label: 'under 60', min: -Infinity, max: 60 },
	...[60, 65, 70, 75, 80, 85, 90, 95].map((min) => ({
		label: min === 95 ? '95–100' : `${min}–${min + 4}.9`,
		min,
		max: min === 95 ? Infinity : min + 5
	}))
];

/** How many judged entries of each division fall in each score band. */
export interface ScoreDistribution {
	division: string;
	counts: number[];
}

/** Counts the scored entries of each division per band of SCORE_BANDS. */
export function scoreDistribution(results: ShowResults): ScoreDistribution[] {
	return results.divisions.map((d) => {
		const counts = SCORE_BANDS.map(() => 0);
		for (const c of d.classes) {
			for (const e of c.entries) {
				if (e.score === null) continue;
				const band = SCORE_BANDS.findIndex((b) => e.score! >= b.min && e.score! < b.max);
				if (band >= 0) counts[band] += 1;
			}
		}
		return { division: `${d.code} ${d.name}`, counts };
	});
}

/** Ribbons (or places) given in each class, per division. */
export interface RibbonsPerClass {
	levels: { level: AwardLevel; label: string }[];
	divisions: { division: string; classes: { label: string; counts: number[] }[] }[];
}

/** Counts each class's ribbons (merit judging) or places (placement judging). */
export function ribbonsPerClass(results: ShowResults): RibbonsPerClass {
	const levels: AwardLevel[] =
		results.show.system === 'merit'
			? ['blue', 'red', 'white']
			: ['first', 'second', 'third', 'honourable'];
	const divisions = results.divisions.map((d) => ({
		division: `${d.code} ${d.name}`,
		classes: d.classes
			.filter((c) => c.entries.length > 0)
			.map((c) => ({
				label: `Class ${c.code}`,
				counts: levels.map((l) => c.entries.filter((e) => e.level === l).length)
			}))
	}));
	return { levels: levels.map((level) => ({ level, label: LEVEL_LABELS[level] })), divisions };
}
