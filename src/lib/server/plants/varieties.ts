import Papa from 'papaparse';
import {
	Op,
	UniqueConstraintError,
	col,
	fn,
	literal,
	where as sqlWhere,
	type Transaction
} from 'sequelize';
import { habitOfGrowthForm, plantGroupOf } from '$lib/domain/plant-groups';
import {
	VARIETY_CSV_COLUMNS,
	VARIETY_CSV_COLUMN_OF,
	varietySchema,
	type VarietyInput
} from '$lib/schemas/variety';
import type { VarietyRow } from '$lib/types';
import { Variety, sequelize } from '../db';
import { Refusal } from '../http/refusal';

export type { VarietyRow };

/** Plain fields of a variety. */
export function toVarietyRow(v: Variety): VarietyRow {
	return {
		id: v.id,
		name: v.name,
		hybridizer: v.hybridizer,
		habit: v.habit,
		sizeClass: v.sizeClass,
		blossomType: v.blossomType,
		blossomColours: v.blossomColours,
		foliage: v.foliage,
		isSpecies: v.isSpecies,
		description: v.description,
		plantGroup: v.plantGroup,
		growthForm: v.growthForm,
		botanicalName: v.botanicalName
	};
}

function escapeLike(text: string): string {
	return text.replace(/[\\%_]/g, (c) => `\\${c}`);
}

/**
 * Searches a society's registry by name or hybridizer, names starting with the text first,
 * for search-as-you-type. An empty text lists the registry from the start of the alphabet.
 */
export async function searchVarieties(
	societyId: string,
	text: string,
	limit = 20
): Promise<VarietyRow[]> {
	const q = text.trim().slice(0, 80);
	const like = `%${escapeLike(q)}%`;
	const rows = await Variety.findAll({
		where: q
			? {
					societyId,
					[Op.or]: [{ name: { [Op.iLike]: like } }, { hybridizer: { [Op.iLike]: like } }]
				}
			: { societyId },
		order: [
			[
				literal(`(lower(name) LIKE ${sequelize.escape(`${escapeLike(q.toLowerCase())}%`)})`),
				'DESC'
			],
			[fn('lower', col('name')), 'ASC']
		],
		limit: Math.min(Math.max(limit, 1), 50)
	});
	return rows.map(toVarietyRow);
}

/** One variety of a society, or null. */
export async function findVariety(societyId: string, id: string): Promise<Variety | null> {
	return Variety.findOne({ where: { id, societyId } });
}

/** A variety that cannot be saved, with the field at fault. */
export class VarietyProblem extends Refusal {
	declare readonly field: string;
	constructor(message: string, field = 'name') {
		super(message, 400, field);
	}
}

function values(input: VarietyInput) {
	return {
		name: input.name,
		hybridizer: input.hybridizer || null,
		plantGroup: input.plantGroup,
		growthForm: input.growthForm,
		habit: habitOfGrowthForm(input.growthForm),
		botanicalName: input.botanicalName || null,
		sizeClass: input.sizeClass,
		blossomType: input.blossomType,
		blossomColours: input.blossomColours,
		foliage: input.foliage,
		isSpecies: input.isSpecies,
		description: input.description || null
	};
}

/** Adds a variety to a society's registry, or changes one; names are unique per society. */
export async function saveVariety(
	societyId: string,
	varietyId: string | null,
	input: VarietyInput,
	options: { transaction: Transaction }
): Promise<VarietyRow> {
	const { transaction } = options;
	const clash = await Variety.findOne({
		where: {
			societyId,
			...(varietyId ? { id: { [Op.ne]: varietyId } } : {}),
			[Op.and]: [sqlWhere(fn('lower', col('name')), input.name.toLowerCase())]
		},
		transaction
	});
	if (clash) throw new VarietyProblem(`“${clash.name}” is already in the registry.`);
	try {
		if (varietyId) {
			const variety = await Variety.findOne({ where: { id: varietyId, societyId }, transaction });
			if (!variety) throw new VarietyProblem('That variety is not in this registry.', 'form');
			return toVarietyRow(await variety.update(values(input), { transaction }));
		}
		return toVarietyRow(await Variety.create({ ...values(input), societyId }, { transaction }));
	} catch (e) {
		if (e instanceof UniqueConstraintError) {
			throw new VarietyProblem(`“${input.name}” is already in the registry.`);
		}
		throw e;
	}
}

/** A row of an import file that was refused: its line in the file and why. */
export interface ImportProblem {
	line: number;
	reason: string;
}

/** What an import did (or would do). */
export interface ImportReport {
	rows: number;
	imported: number;
	problems: ImportProblem[];
}

/** A header as the import reads it: lower case, spaces as underscores, older spellings mapped. */
function csvHeader(typed: string): string {
	const plain = typed.trim().toLowerCase().replace(/\s+/g, '_');
	return plain === 'blossom_colours' ? 'blossom_colors' : plain;
}

const TRUE_WORDS = new Set(['yes', 'y', 'true', '1', 'species']);
const FALSE_WORDS = new Set(['', 'no', 'n', 'false', '0']);

/** Largest import file we read, in characters. */
export const MAX_IMPORT_CHARS = 2_000_000;

/**
 * Imports a registry CSV file (header row with VARIETY_CSV_COLUMNS). Every bad row is reported
 * with its line and reason; when any row is bad nothing is imported unless `goodRowsOnly` is
 * set, in which case the good rows are imported and the bad ones reported.
 */
export async function importVarietiesCsv(
	societyId: string,
	text: string,
	options: { goodRowsOnly: boolean; transaction: Transaction }
): Promise<ImportReport> {
	const { transaction } = options;
	if (text.length > MAX_IMPORT_CHARS) {
		return { rows: 0, imported: 0, problems: [{ line: 0, reason: 'The file is over 2 MB.' }] };
	}
	const parsed = Papa.parse<Record<string, string>>(text.replace(/^\uFEFF/, ''), {
		header: true,
		skipEmptyLines: 'greedy',
		transformHeader: csvHeader,
		// The export writes a quote before a cell a spreadsheet would read as a formula.
		transform: (value) => value.replace(/^'(?=[=+\-@\t\r])/, '')
	});
	const headers = parsed.meta.fields ?? [];
	const missing = ['name', 'size_class', 'blossom_type'].filter((c) => !headers.includes(c));
	if (!headers.includes('growth_form') && !headers.includes('habit')) missing.push('growth_form');
	if (missing.length) {
		return {
			rows: 0,
			imported: 0,
			problems: [
				{
					line: 1,
					reason: `The first line must name the columns; missing: ${missing.join(', ')}. Expected: ${VARIETY_CSV_COLUMNS.join(', ')}.`
				}
			]
		};
	}
	// A data row's line is its index + 2 (the header is line 1); papaparse reports rows by index.
	const problems: ImportProblem[] = [];
	const badRows = new Set<number>();
	// An unclosed quote runs to the end of the file, where papaparse may count one row further.
	for (const err of parsed.errors) {
		if (err.row === undefined || err.row === null) continue;
		const row = Math.min(err.row, Math.max(parsed.data.length - 1, 0));
		if (badRows.has(row)) continue;
		badRows.add(row);
		problems.push({ line: row + 2, reason: `The line cannot be read: ${err.message}.` });
	}
	const existing = new Set(
		(await Variety.findAll({ where: { societyId }, attributes: ['name'], transaction })).map((v) =>
			v.name.toLowerCase()
		)
	);
	const seen = new Map<string, number>();
	const good: VarietyInput[] = [];
	parsed.data.forEach((row, index) => {
		if (badRows.has(index)) return;
		const line = index + 2;
		const species = (row.species ?? '').trim().toLowerCase();
		if (!TRUE_WORDS.has(species) && !FALSE_WORDS.has(species)) {
			problems.push({ line, reason: 'species: write yes or no.' });
			return;
		}
		// An older file gives the habit; its reasons then name that column.
		const formColumn = (row.growth_form ?? '').trim() ? 'growth_form' : 'habit';
		const result = varietySchema.safeParse({
			name: row.name ?? '',
			plantGroup: row.group ?? '',
			hybridizer: row.hybridizer ?? '',
			growthForm: (row.growth_form ?? '').trim() || (row.habit ?? ''),
			sizeClass: row.size_class ?? '',
			blossomType: row.blossom_type ?? '',
			blossomColours: (row.blossom_colors ?? '').replace(/;/g, ','),
			foliage: row.foliage ?? '',
			isSpecies: TRUE_WORDS.has(species),
			botanicalName: row.botanical_name ?? '',
			description: row.description ?? ''
		});
		if (!result.success) {
			const issue = result.error.issues[0];
			const key = String(issue.path[0]) as keyof VarietyInput;
			const field =
				key === 'growthForm'
					? formColumn
					: Object.hasOwn(VARIETY_CSV_COLUMN_OF, key)
						? VARIETY_CSV_COLUMN_OF[key]
						: key;
			problems.push({ line, reason: `${field}: ${issue.message}` });
			return;
		}
		const key = result.data.name.toLowerCase();
		if (existing.has(key)) {
			problems.push({ line, reason: `“${result.data.name}” is already in the registry.` });
			return;
		}
		if (seen.has(key)) {
			problems.push({
				line,
				reason: `“${result.data.name}” is also on line ${seen.get(key)} of this file.`
			});
			return;
		}
		seen.set(key, line);
		good.push(result.data);
	});
	problems.sort((a, b) => a.line - b.line);
	const rows = parsed.data.length;
	if (rows === 0 && problems.length === 0) {
		problems.push({ line: 2, reason: 'The file has no rows under its header.' });
	}
	if (problems.length && !options.goodRowsOnly) return { rows, imported: 0, problems };
	if (good.length) {
		await Variety.bulkCreate(
			good.map((g) => ({ ...values(g), societyId })),
			{ transaction }
		);
	}
	return { rows, imported: good.length, problems };
}

/** One CSV cell that a spreadsheet will not read as a formula. */
function safeCell(value: string): string {
	return /^[=+\-@\t\r]/.test(value) ? `'${value}` : value;
}

/**
 * A society's whole registry as a CSV file in the columns `importVarietiesCsv` reads, sorted by
 * group and name, so that a file exported and imported into an empty registry gives it back.
 */
export async function exportVarietiesCsv(societyId: string): Promise<string> {
	const rows = await Variety.findAll({
		where: { societyId },
		order: [
			['plantGroup', 'ASC'],
			[fn('lower', col('name')), 'ASC']
		]
	});
	const data = rows.map((v) => {
		const cells: Record<(typeof VARIETY_CSV_COLUMNS)[number], string> = {
			name: v.name,
			group: plantGroupOf(v.plantGroup).name,
			hybridizer: v.hybridizer ?? '',
			species: v.isSpecies ? 'yes' : 'no',
			botanical_name: v.botanicalName ?? '',
			growth_form: v.growthForm,
			size_class: v.sizeClass,
			blossom_type: v.blossomType,
			blossom_colors: v.blossomColours.join('; '),
			foliage: v.foliage,
			description: v.description ?? ''
		};
		return VARIETY_CSV_COLUMNS.map((c) => safeCell(cells[c]));
	});
	return Papa.unparse({ fields: [...VARIETY_CSV_COLUMNS], data }, { newline: '\r\n' });
}
