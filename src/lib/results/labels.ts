import type { AwardLevel } from '$lib/domain/awards';
import type { ResultEntry } from './types';

/** What an entry's award words are made of. */
type Awarded = Pick<ResultEntry, 'topAwards' | 'bestInClass' | 'level' | 'state'>;

/** Words for each ribbon or place. */
export const LEVEL_LABELS: Record<AwardLevel, string> = {
	blue: 'Blue ribbon',
	red: 'Red ribbon',
	white: 'White ribbon',
	first: 'First place',
	second: 'Second place',
	third: 'Third place',
	honourable: 'Honorable mention'
};

/** Formats a score for people: 92.5, 93; a dash when there is none. */
export function formatScore(score: number | null): string {
	if (score === null) return '–';
	return Number.isInteger(score) ? String(score) : score.toFixed(2).replace(/0$/, '');
}

/** Every award of an entry in words, highest first: top awards, best in class, ribbon or place. */
export function entryAwards(entry: Awarded): string[] {
	const words = [...entry.topAwards];
	if (entry.bestInClass) words.push('Best in class');
	if (entry.level) words.push(LEVEL_LABELS[entry.level]);
	return words;
}

/** The entry's awards in one line, or what happened when it has none. */
export function awardLine(entry: Awarded): string {
	const words = entryAwards(entry);
	if (words.length > 0) return words.join(', ');
	if (entry.state === 'not_judged') return 'Not judged';
	if (entry.state === 'waiting') return 'No score';
	return 'No award';
}
