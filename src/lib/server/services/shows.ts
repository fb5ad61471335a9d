import { Op, QueryTypes, fn, col } from 'sequelize';
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

/** The entries of one exhibitor, newest show first, with class and variety names. */
export async function listEntriesOfExhibitor(userId: string): Promise<
	{
		id: string;
		number: number;
		showName: string;
		classLabel: string;
		plant: string;
		status: string;
	}[]
> {
	const rows = (await Entry.sequelize!.query(
		`SELECT e.id, e.number, s.name AS show_name, c.code || ' ' || c.name AS class_label,
		        COALESCE(v.name, e.title, '') AS plant, e.status
		   FROM entries e
		   JOIN shows s ON s.id = e.show_id
		   JOIN classes c ON c.id = e.class_id
		   LEFT JOIN varieties v ON v.id = e.variety_id
		  WHERE e.exhibitor_id = :userId
		  ORDER BY s.judging_day DESC, e.number`,
		{ replacements: { userId }, type: QueryTypes.SELECT }
	)) as {
		id: string;
		number: number;
		show_name: string;
		class_label: string;
		plant: string;
		status: string;
	}[];
	return rows.map((r) => ({
		id: r.id,
		number: r.number,
		showName: r.show_name,
		classLabel: r.class_label,
		plant: r.plant,
		status: r.status
	}));
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
