import { error, type RequestEvent } from '@sveltejs/kit';
import { levelsIn, recordByVariety, type VarietyRecord } from '$lib/domain/record';
import type { AwardLevel } from '$lib/domain/awards';
import { requireRole } from '../policies';
import { loadSocietyRecord } from './my-results';

/** A society's record as its members read it (page and CSV). */
export interface SocietyRecordView {
	society: { slug: string; name: string };
	societies: { slug: string; name: string }[];
	levels: AwardLevel[];
	entered: VarietyRecord[];
	placed: VarietyRecord[];
	shows: number;
	entries: number;
}

/**
 * The record of one of the signed-in person's societies (?society=slug, or the first where they
 * are a member): only members of that society read it; any other slug is "not found".
 */
export async function societyRecordFor(
	event: Pick<RequestEvent, 'url' | 'locals'>
): Promise<SocietyRecordView> {
	const user = requireRole(event, ['member']);
	const mine = user.memberships.filter((m) => m.roles.includes('member'));
	const params = event.url.searchParams;
	// A society asked for by address must be one of the person's (an empty or unknown one is not).
	const chosen = params.has('society')
		? mine.find((m) => m.societySlug === params.get('society'))
		: mine[0];
	if (!chosen) error(404, 'You are not a member of that society.');
	requireRole(event, ['member'], chosen.societyId);
	const entries = await loadSocietyRecord(chosen.societyId);
	return {
		society: { slug: chosen.societySlug, name: chosen.societyName },
		societies: mine.map((m) => ({ slug: m.societySlug, name: m.societyName })),
		levels: levelsIn(entries),
		entered: recordByVariety(entries, 'entered'),
		placed: recordByVariety(entries, 'placed'),
		shows: new Set(entries.map((e) => e.showId)).size,
		entries: entries.length
	};
}
