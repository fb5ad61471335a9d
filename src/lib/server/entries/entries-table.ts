import Papa from 'papaparse';
import { QueryTypes } from 'sequelize';
import type { EntriesQuery, EntryTableRow } from '$lib/schemas/desk';

export type { EntryTableRow };
import { sequelize } from '../db';

/** A page of the entries table and how many rows match in all. */
export interface EntryTablePage {
	rows: EntryTableRow[];
	total: number;
}

/** Sort keys mapped to SQL; only these reach the query. */
const SORT_SQL: Record<EntriesQuery['sort'], string> = {
	number: 'e.number',
	class: 'c.position',
	variety: "lower(COALESCE(v.name, e.title, ''))",
	exhibitor: 'lower(COALESCE(u.name, u.email))',
	status: 'e.status',
	checkedIn: 'e.checked_in_at'
};

function filters(showId: string, query: EntriesQuery) {
	const where = ['e.show_id = :showId'];
	const replacements: Record<string, unknown> = { showId };
	if (query.classId) {
		where.push('e.class_id = :classId');
		replacements.classId = query.classId;
	}
	if (query.status) {
		where.push('e.status = :status');
		replacements.status = query.status;
	}
	if (query.q) {
		replacements.like = `%${query.q.replace(/[\\%_]/g, (c) => `\\${c}`)}%`;
		const byNumber = /^\d{1,9}$/.test(query.q) ? 'e.number = :number OR ' : '';
		if (byNumber) replacements.number = Number(query.q);
		where.push(
			`(${byNumber}v.name ILIKE :like OR e.title ILIKE :like OR u.name ILIKE :like OR u.email ILIKE :like)`
		);
	}
	return { where: where.join(' AND '), replacements };
}

const FROM = `FROM entries e
  JOIN classes c ON c.id = e.class_id
  JOIN users u ON u.id = e.exhibitor_id
  LEFT JOIN varieties v ON v.id = e.variety_id`;

type Raw = {
	id: string;
	number: number;
	class_code: string;
	class_name: string;
	variety: string;
	exhibitor: string;
	status: string;
	diameter: string | null;
	crowns: number | null;
	checked_in_at: Date | null;
	total?: string;
};

function toRow(r: Raw): EntryTableRow {
	return {
		id: r.id,
		number: r.number,
		classCode: r.class_code,
		className: r.class_name,
		variety: r.variety,
		exhibitor: r.exhibitor,
		status: r.status,
		diameterIn: r.diameter === null ? null : Number(r.diameter),
		crowns: r.crowns,
		checkedInAt: r.checked_in_at ? new Date(r.checked_in_at).toISOString() : null
	};
}

async function select(showId: string, query: EntriesQuery, paged: boolean): Promise<Raw[]> {
	const { where, replacements } = filters(showId, query);
	const dir = query.dir === 'desc' ? 'DESC' : 'ASC';
	const nulls = query.sort === 'checkedIn' ? ' NULLS LAST' : '';
	return sequelize.query<Raw>(
		`SELECT e.id, e.number, c.code AS class_code, c.name AS class_name,
		        COALESCE(v.name, e.title, '') AS variety, COALESCE(u.name, u.email) AS exhibitor,
		        e.status, e.measured_diameter_in AS diameter, e.measured_crowns AS crowns,
		        e.checked_in_at, count(*) OVER () AS total
		   ${FROM}
		  WHERE ${where}
		  ORDER BY ${SORT_SQL[query.sort]} ${dir}${nulls}, e.number ${dir}
		  ${paged ? 'LIMIT :limit OFFSET :offset' : ''}`,
		{
			replacements: { ...replacements, limit: query.size, offset: query.page * query.size },
			type: QueryTypes.SELECT
		}
	);
}

/** One page of a show's entries, sorted, filtered and paged in PostgreSQL. */
export async function queryEntriesTable(
	showId: string,
	query: EntriesQuery
): Promise<EntryTablePage> {
	const rows = await select(showId, query, true);
	let total = rows.length ? Number(rows[0].total) : 0;
	if (!rows.length && query.page > 0) {
		const { where, replacements } = filters(showId, query);
		const [row] = await sequelize.query<{ n: string }>(
			`SELECT count(*) AS n ${FROM} WHERE ${where}`,
			{
				replacements,
				type: QueryTypes.SELECT
			}
		);
		total = Number(row.n);
	}
	return { rows: rows.map(toRow), total };
}

/** Every entry matching the filters as CSV (sorted the same way), for a spreadsheet. */
export async function entriesCsv(showId: string, query: EntriesQuery): Promise<string> {
	const rows = (await select(showId, query, false)).map(toRow);
	const safe = (v: string) => (/^[=+\-@\t\r]/.test(v) ? `'${v}` : v);
	return Papa.unparse({
		fields: [
			'number',
			'class',
			'class_name',
			'plant',
			'exhibitor',
			'status',
			'diameter_in',
			'crowns',
			'checked_in_at'
		],
		data: rows.map((r) => [
			r.number,
			safe(r.classCode),
			safe(r.className),
			safe(r.variety),
			safe(r.exhibitor),
			r.status,
			r.diameterIn ?? '',
			r.crowns ?? '',
			r.checkedInAt ?? ''
		])
	});
}
