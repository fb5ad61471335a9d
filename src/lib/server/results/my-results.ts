/**
 * An exhibitor's own results: their entries with score, ribbon or place, best in class, top
 * awards and the judges' comments, only for shows whose results are published; their record
 * across shows; a plant's show history; what the judges marked down last time; and a society's
 * record of varieties for its members. Every figure comes from `loadShowResults` (the one reader
 * of published results), kept per show in this process and keyed by the publishing time, which
 * is read fresh on every request. Nothing here reads a score of an unpublished show.
 */
import { QueryTypes, type Transaction } from 'sequelize';
import type { AwardLevel } from '$lib/domain/awards';
import {
	describeCounts,
	figuresOf,
	markedDown,
	pointsLost,
	type PointsLost,
	type RecordEntry
} from '$lib/domain/record';
import type { ScaleCriterion } from '$lib/domain/scoring';
import type { ResultEntry, ShowResults } from '$lib/results/types';
import { sequelize } from '../db';
import { loadShowResults } from './show-results';

/** Full results (with comments) of published shows, kept per show and keyed by publishing time. */
const fullCache = new Map<string, { publishedAt: string; byEntry: Map<string, Placed> }>();
const FULL_CACHE_SIZE = 32;

/** An entry's result with the labels a record needs. */
interface Placed extends ResultEntry {
	classLabel: string;
}

function indexResults(results: ShowResults): Map<string, Placed> {
	const byEntry = new Map<string, Placed>();
	for (const d of results.divisions) {
		for (const c of d.classes) {
			for (const e of c.entries) byEntry.set(e.id, { ...e, classLabel: `${c.code} ${c.name}` });
		}
	}
	return byEntry;
}

/** The published results of a show by entry id; the caller has read `publishedAt` just now. */
async function publishedEntries(showId: string, publishedAt: Date): Promise<Map<string, Placed>> {
	const key = publishedAt.toISOString();
	const cached = fullCache.get(showId);
	if (cached && cached.publishedAt === key) return cached.byEntry;
	const results = await loadShowResults(showId);
	const byEntry = results ? indexResults(results) : new Map<string, Placed>();
	fullCache.delete(showId);
	fullCache.set(showId, { publishedAt: key, byEntry });
	while (fullCache.size > FULL_CACHE_SIZE) {
		fullCache.delete(fullCache.keys().next().value as string);
	}
	return byEntry;
}

/** One entry of a person, with its show, as stored. */
interface EntryRow {
	id: string;
	number: number;
	status: string;
	plant: string;
	plant_id: string | null;
	class_label: string;
	show_id: string;
	show_slug: string;
	show_name: string;
	society_id: string;
	judging_day: string;
	published: Date | null;
	share_points_lost: boolean;
}

const ENTRY_COLUMNS = `e.id, e.number, e.status, coalesce(v.name, e.title, '') AS plant, e.plant_id,
        c.code || ' ' || c.name AS class_label, s.id AS show_id, s.slug AS show_slug,
        s.name AS show_name, s.society_id, s.judging_day, s.results_published_at AS published,
        s.share_points_lost
   FROM entries e
   JOIN shows s ON s.id = e.show_id
   JOIN classes c ON c.id = e.class_id
   LEFT JOIN varieties v ON v.id = e.variety_id`;

async function entriesWhere(
	where: string,
	replacements: Record<string, unknown>
): Promise<EntryRow[]> {
	return sequelize.query<EntryRow>(
		`SELECT ${ENTRY_COLUMNS} WHERE ${where} ORDER BY s.judging_day DESC, s.name, e.number`,
		{ replacements, type: QueryTypes.SELECT }
	);
}

/** An entry's published result, as the exhibitor reads it. */
export interface MyResult {
	score: number | null;
	state: ResultEntry['state'];
	level: AwardLevel | null;
	bestInClass: boolean;
	topAwards: string[];
	comments: string[];
}

/** One of my entries, with its result once the show's results are published (else null). */
export interface MyEntry {
	id: string;
	number: number;
	status: string;
	plant: string;
	plantId: string | null;
	classLabel: string;
	show: { id: string; slug: string; name: string; judgingDay: string; published: boolean };
	result: MyResult | null;
}

function resultOf(placed: Placed | undefined): MyResult | null {
	if (!placed) return null;
	return {
		score: placed.score,
		state: placed.state,
		level: placed.level,
		bestInClass: placed.bestInClass,
		topAwards: placed.topAwards,
		comments: placed.comments
	};
}

/** Attaches results to entries: one (cached) results read per published show. */
async function withResults(rows: EntryRow[]): Promise<MyEntry[]> {
	const shows = new Map<string, Date>();
	for (const r of rows) if (r.published) shows.set(r.show_id, r.published);
	const results = new Map<string, Map<string, Placed>>();
	for (const [showId, publishedAt] of shows) {
		results.set(showId, await publishedEntries(showId, publishedAt));
	}
	return rows.map((r) => ({
		id: r.id,
		number: r.number,
		status: r.status,
		plant: r.plant,
		plantId: r.plant_id,
		classLabel: r.class_label,
		show: {
			id: r.show_id,
			slug: r.show_slug,
			name: r.show_name,
			judgingDay: r.judging_day,
			published: r.published !== null
		},
		result: r.published ? resultOf(results.get(r.show_id)?.get(r.id)) : null
	}));
}

/** Every entry of the exhibitor, newest show first, with results where they are published. */
export async function listMyEntries(exhibitorId: string): Promise<MyEntry[]> {
	return withResults(await entriesWhere('e.exhibitor_id = :exhibitorId', { exhibitorId }));
}

/** The exhibitor's entries as a record reads them: published, not withdrawn or scratched. */
export function toRecordEntries(entries: readonly MyEntry[]): RecordEntry[] {
	return entries.flatMap((e) =>
		e.result
			? [
					{
						showId: e.show.id,
						showName: e.show.name,
						judgingDay: e.show.judgingDay,
						entryId: e.id,
						number: e.number,
						plant: e.plant,
						classLabel: e.classLabel,
						score: e.result.score,
						level: e.result.level,
						bestInClass: e.result.bestInClass,
						topAwards: e.result.topAwards
					}
				]
			: []
	);
}

/** The exhibitor's record: every entry of a published show. */
export async function loadMyRecord(exhibitorId: string): Promise<RecordEntry[]> {
	return toRecordEntries(
		await withResults(
			await entriesWhere('e.exhibitor_id = :exhibitorId AND s.results_published_at IS NOT NULL', {
				exhibitorId
			})
		)
	);
}

/** One entry's result for its exhibitor, with the points lost when the show shares them. */
export interface MyEntryResult extends MyResult {
	/** Points lost per criterion; null when the show does not share them. */
	pointsLost: PointsLost[] | null;
}

/**
 * The points lost per criterion of entries of shows that share them: the mean of the panel's
 * judged sheets (or its consensus sheet), by entry id.
 */
async function loadPointsLost(entryIds: string[]): Promise<Map<string, PointsLost[]>> {
	if (entryIds.length === 0) return new Map();
	const rows = await sequelize.query<{
		entry_id: string;
		criteria: ScaleCriterion[] | null;
		deductions: Record<string, number>[];
	}>(
		`SELECT e.id AS entry_id, sc.criteria,
		        coalesce(array_agg(ss.deductions ORDER BY ss.created_at, ss.id)
		                 FILTER (WHERE ss.id IS NOT NULL), '{}') AS deductions
		   FROM entries e
		   JOIN shows s ON s.id = e.show_id
		   JOIN classes c ON c.id = e.class_id
		   LEFT JOIN scales sc ON sc.id = c.scale_id
		   LEFT JOIN score_sheets ss ON ss.entry_id = e.id AND ss.not_judged_reason IS NULL
		        AND ss.kind = (CASE WHEN s.panel_score_method = 'consensus' THEN 'consensus' ELSE 'judge' END)
		  WHERE e.id IN (:entryIds) AND s.share_points_lost AND s.results_published_at IS NOT NULL
		  GROUP BY e.id, sc.criteria`,
		{ replacements: { entryIds }, type: QueryTypes.SELECT }
	);
	return new Map(rows.map((r) => [r.entry_id, pointsLost(r.criteria ?? [], r.deductions)]));
}

/** The result of one of the exhibitor's entries, or null while its show's results are not out. */
export async function loadMyEntryResult(
	exhibitorId: string,
	entryId: string
): Promise<MyEntryResult | null> {
	const [entry] = await withResults(
		await entriesWhere('e.id = :entryId AND e.exhibitor_id = :exhibitorId', {
			entryId,
			exhibitorId
		})
	);
	if (!entry?.result) return null;
	const lost = await loadPointsLost([entry.id]);
	return { ...entry.result, pointsLost: lost.get(entry.id) ?? null };
}

/** A plant's entries in shows, newest first, each with its result once published. */
export async function loadPlantHistory(ownerId: string, plantId: string): Promise<MyEntry[]> {
	return withResults(
		await entriesWhere(
			`e.plant_id = :plantId AND e.exhibitor_id = :ownerId AND e.status NOT IN ('withdrawn', 'scratched')`,
			{ plantId, ownerId }
		)
	);
}

/** What the judges marked down the last time a plant was shown (a published show). */
export interface LastTime {
	entryId: string;
	showName: string;
	judgingDay: string;
	score: number | null;
	comments: string[];
	/** Criteria that lost points, most first; null when the show does not share them. */
	markedDown: PointsLost[] | null;
}

/** For each of the owner's plants, its latest entry in a published show, with what lost points. */
export async function loadLastTimes(
	ownerId: string,
	plantIds: string[]
): Promise<Map<string, LastTime>> {
	if (plantIds.length === 0) return new Map();
	const rows = await entriesWhere(
		`e.exhibitor_id = :ownerId AND e.plant_id IN (:plantIds) AND s.results_published_at IS NOT NULL
		 AND e.status NOT IN ('withdrawn', 'scratched')`,
		{ ownerId, plantIds }
	);
	const latest = new Map<string, EntryRow>();
	for (const r of rows) if (r.plant_id && !latest.has(r.plant_id)) latest.set(r.plant_id, r);
	const entries = await withResults([...latest.values()]);
	const lost = await loadPointsLost(entries.map((e) => e.id));
	const out = new Map<string, LastTime>();
	for (const e of entries) {
		if (!e.plantId || !e.result) continue;
		const shared = lost.get(e.id);
		out.set(e.plantId, {
			entryId: e.id,
			showName: e.show.name,
			judgingDay: e.show.judgingDay,
			score: e.result.score,
			comments: e.result.comments,
			markedDown: shared ? markedDown(shared) : null
		});
	}
	return out;
}

/**
 * A society's record: every entry of its published shows, without exhibitors or comments (the
 * society's members read which varieties were entered and placed, and their scores).
 */
export async function loadSocietyRecord(societyId: string): Promise<RecordEntry[]> {
	const rows = await entriesWhere(
		`s.society_id = :societyId AND s.results_published_at IS NOT NULL
		 AND e.status NOT IN ('withdrawn', 'scratched')`,
		{ societyId }
	);
	return toRecordEntries(await withResults(rows));
}

/** My entries of one show, with the show's ribbons and places in words once published. */
export interface MyShow {
	show: MyEntry['show'];
	/** "2 blue ribbons, 1 red ribbon"; '' for none or while unpublished. */
	ribbons: string;
	entries: MyEntry[];
}

/** Groups entries by show, keeping their order (newest show first). */
export function groupByShow(entries: readonly MyEntry[]): MyShow[] {
	const shows = new Map<string, MyEntry[]>();
	for (const e of entries) shows.set(e.show.id, [...(shows.get(e.show.id) ?? []), e]);
	return [...shows.values()].map((list) => ({
		show: list[0].show,
		ribbons: describeCounts(figuresOf(toRecordEntries(list)).counts),
		entries: list
	}));
}

/**
 * Turns on or off whether exhibitors see the points their entries lost per criterion (a show
 * setting the chair may change at any stage: it shows nothing before results are published).
 */
export async function setSharePointsLost(
	showId: string,
	share: boolean,
	options: { transaction: Transaction }
): Promise<void> {
	await sequelize.query(
		'UPDATE shows SET share_points_lost = :share, updated_at = now() WHERE id = :showId',
		{ replacements: { showId, share }, transaction: options.transaction }
	);
}
