import { Op, fn, col } from 'sequelize';
import { todayIn } from '$lib/domain/dates';
import type { ShowSummary } from '$lib/types';
import { Entry, Show, Society } from '../db';

export type { ShowSummary };

function toSummary(show: Show, entryCount = 0): ShowSummary {
	const society = show.get('society') as Society | undefined;
	return {
		id: show.id,
		slug: show.slug,
		name: show.name,
		societyName: society?.name ?? '',
		venue: show.venue,
		entriesOpen: show.entriesOpen,
		entriesClose: show.entriesClose,
		judgingDay: show.judgingDay,
		schedulePublished: show.schedulePublishedAt !== null,
		resultsPublished: show.resultsPublishedAt !== null,
		entryCount
	};
}

/** Shows whose schedule is public, newest judging day first. */
export async function listPublicShows(): Promise<ShowSummary[]> {
	const shows = await Show.findAll({
		where: { schedulePublishedAt: { [Op.ne]: null } },
		include: [{ model: Society, as: 'society', attributes: ['name'] }],
		order: [['judgingDay', 'DESC']],
		limit: 50
	});
	return shows.map((s) => toSummary(s));
}

/** The shows of the given societies with their entry counts (one query for the counts). */
export async function listShowsOfSocieties(societyIds: string[]): Promise<ShowSummary[]> {
	if (societyIds.length === 0) return [];
	const shows = await Show.findAll({
		where: { societyId: societyIds },
		include: [{ model: Society, as: 'society', attributes: ['name'] }],
		order: [['judgingDay', 'DESC']]
	});
	const counts = (await Entry.findAll({
		attributes: ['showId', [fn('count', col('id')), 'n']],
		where: { showId: shows.map((s) => s.id), status: { [Op.ne]: 'withdrawn' } },
		group: ['showId'],
		raw: true
	})) as unknown as { showId: string; n: string }[];
	const byShow = new Map(counts.map((c) => [c.showId, Number(c.n)]));
	return shows.map((s) => toSummary(s, byShow.get(s.id) ?? 0));
}

/** Published shows of the given societies that still take entries (on each society's own day), soonest first. */
export async function listShowsTakingEntries(
	societyIds: string[],
	now: Date = new Date()
): Promise<ShowSummary[]> {
	if (societyIds.length === 0) return [];
	const shows = await Show.findAll({
		where: {
			societyId: societyIds,
			schedulePublishedAt: { [Op.ne]: null },
			// The earliest date anywhere (UTC-12); each society's own day is checked below.
			entriesClose: { [Op.gte]: todayIn('Etc/GMT+12', now) }
		},
		include: [{ model: Society, as: 'society', attributes: ['name', 'timeZone'] }],
		order: [['judgingDay', 'ASC']]
	});
	return shows
		.filter((s) => s.entriesClose >= todayIn((s.get('society') as Society).timeZone, now))
		.map((s) => toSummary(s));
}

/** The society a show belongs to, by the show's id; null when there is no such show. */
export async function societyOfShow(showId: string): Promise<string | null> {
	const show = await Show.findByPk(showId, { attributes: ['societyId'] });
	return show?.societyId ?? null;
}
