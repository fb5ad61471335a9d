import type { AwardLevel } from '$lib/domain/awards';

/** The colour of each ribbon or place on charts (white ones get a border to be seen). */
export const LEVEL_COLORS: Record<AwardLevel, { colour: string; border?: string }> = {
	blue: { colour: '#1d4f91' },
	red: { colour: '#a3232b' },
	white: { colour: '#f3f1ea', border: '#6a756e' },
	first: { colour: '#1d4f91' },
	second: { colour: '#a3232b' },
	third: { colour: '#f3f1ea', border: '#6a756e' },
	honourable: { colour: '#6a4a9c' }
};
