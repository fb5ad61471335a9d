import { randomUUID } from 'node:crypto';
import { QueryTypes } from 'sequelize';
import { sheetChangeSchema } from '$lib/schemas/judging';
import { saveSheet, type JudgeClass } from './judging';
import { isRefusal } from '../http/refusal';
import type { ScaleCriterionDraft } from '$lib/domain/scales';
import { sequelize } from '../db';

/** A class as its paper judging sheet prints it: no exhibitor, only entry numbers. */
export interface PaperClass {
	id: string;
	code: string;
	name: string;
	division: string;
	panel: string | null;
	scaleName: string | null;
	criteria: ScaleCriterionDraft[];
	/** Entries to judge (not withdrawn or scratched), by number. */
	entries: { id: string; number: number; plant: string }[];
}

/** A panel with the classes it judges, for the class list. */
export interface PaperPanel {
	id: string;
	name: string;
	judges: string[];
	clerk: string | null;
	clerkId: string | null;
	classes: { id: string; code: string; name: string; entries: number[] }[];
}

/** The classes of a show with their panel, scale and entries, in schedule order (or one class). */
export async function loadPaperClasses(showId: string, classId?: string): Promise<PaperClass[]> {
	const classes = await sequelize.query<{
		id: string;
		code: string;
		name: string;
		division: string;
		panel: string | null;
		scale_name: string | null;
		criteria: ScaleCriterionDraft[] | null;
	}>(
		`SELECT c.id, c.code, c.name, d.code || ' ' || d.name AS division, p.name AS panel,
		        sc.name AS scale_name, sc.criteria
		   FROM classes c
		   JOIN divisions d ON d.id = c.division_id
		   LEFT JOIN panel_classes pc ON pc.class_id = c.id
		   LEFT JOIN panels p ON p.id = pc.panel_id
		   LEFT JOIN scales sc ON sc.id = c.scale_id
		  WHERE c.show_id = :showId ${classId ? 'AND c.id = :classId' : ''}
		  ORDER BY d.position, c.position`,
		{ replacements: { showId, classId: classId ?? null }, type: QueryTypes.SELECT }
	);
	const entries = await sequelize.query<{
		id: string;
		class_id: string;
		number: number;
		plant: string;
	}>(
		`SELECT e.id, e.class_id, e.number, COALESCE(v.name, e.title, '') AS plant
		   FROM entries e LEFT JOIN varieties v ON v.id = e.variety_id
		  WHERE e.show_id = :showId AND e.status NOT IN ('withdrawn', 'scratched')
		  ORDER BY e.number`,
		{ replacements: { showId }, type: QueryTypes.SELECT }
	);
	return classes.map((c) => ({
		id: c.id,
		code: c.code,
		name: c.name,
		division: c.division,
		panel: c.panel,
		scaleName: c.scale_name,
		criteria: c.criteria ?? [],
		entries: entries
			.filter((e) => e.class_id === c.id)
			.map((e) => ({ id: e.id, number: e.number, plant: e.plant }))
	}));
}

/** The panels of a show with judges, clerk and the classes they judge (entry numbers only). */
export async function loadPaperPanels(showId: string, panelId?: string): Promise<PaperPanel[]> {
	const panels = await sequelize.query<{
		id: string;
		name: string;
		judges: string[] | null;
		clerk: string | null;
		clerk_id: string | null;
	}>(
		`SELECT p.id, p.name, p.clerk_id,
		        (SELECT array_agg(COALESCE(u.name, u.email) ORDER BY u.name)
		           FROM panel_judges pj JOIN users u ON u.id = pj.user_id WHERE pj.panel_id = p.id) AS judges,
		        (SELECT COALESCE(u.name, u.email) FROM users u WHERE u.id = p.clerk_id) AS clerk
		   FROM panels p WHERE p.show_id = :showId ${panelId ? 'AND p.id = :panelId' : ''}
		  ORDER BY p.name`,
		{ replacements: { showId, panelId: panelId ?? null }, type: QueryTypes.SELECT }
	);
	const classes = await loadPaperClasses(showId);
	const links = await sequelize.query<{ panel_id: string; class_id: string }>(
		`SELECT pc.panel_id, pc.class_id FROM panel_classes pc JOIN panels p ON p.id = pc.panel_id
		  WHERE p.show_id = :showId`,
		{ replacements: { showId }, type: QueryTypes.SELECT }
	);
	return panels.map((p) => ({
		id: p.id,
		name: p.name,
		judges: p.judges ?? [],
		clerk: p.clerk,
		clerkId: p.clerk_id,
		classes: classes
			.filter((c) => links.some((l) => l.panel_id === p.id && l.class_id === c.id))
			.map((c) => ({
				id: c.id,
				code: c.code,
				name: c.name,
				entries: c.entries.map((e) => e.number)
			}))
	}));
}

/**
 * Saves a paper judging sheet typed in by the panel's clerk: for every entry with something
 * typed, the points given per criterion become the deductions the tablet stores (most points
 * less points given), and the sheet goes through `saveSheet`, as the tablet's changes do (the
 * panel's sheet, on the version the form was opened on: a sheet changed meanwhile is refused with
 * 409 and reported). Rows left empty are skipped. Returns how many were saved and every problem.
 */
export async function typePaperSheets(
	actor: { id: string; email: string },
	cls: JudgeClass,
	form: FormData
): Promise<{ saved: number; problems: string[] }> {
	const problems: string[] = [];
	let saved = 0;
	if (cls.sheetKind !== 'consensus') {
		return {
			saved,
			problems: [
				'In this show each judge keeps their own sheet: judges type their paper sheets on their own judging pages.'
			]
		};
	}
	for (const entry of cls.entries) {
		const field = (name: string) => {
			const value = form.get(`${name}.${entry.id}`);
			return typeof value === 'string' ? value.trim() : '';
		};
		const typed = cls.scale.criteria.map((k) => ({ k, value: field(k.key) }));
		const comment = field('comment');
		if (typed.every((t) => t.value === '') && comment === '') continue;
		const deductions: Record<string, number> = {};
		const wrong = typed.find(
			(t) => t.value !== '' && !(Number.isFinite(Number(t.value)) && Number(t.value) >= 0)
		);
		if (wrong) {
			problems.push(`Entry ${entry.number}: write the points for ${wrong.k.label} as a number.`);
			continue;
		}
		for (const t of typed) {
			if (t.value !== '') deductions[t.k.key] = t.k.maxPoints - Number(t.value);
		}
		const parsed = sheetChangeSchema.safeParse({
			changeId: randomUUID(),
			entryId: entry.id,
			baseVersion: Number(field('version') || '0'),
			deductions,
			comment
		});
		if (!parsed.success) {
			problems.push(
				`Entry ${entry.number}: ${parsed.error.issues.map((i) => i.message).join(' ')}`
			);
			continue;
		}
		try {
			await saveSheet(actor, parsed.data);
			saved++;
		} catch (e) {
			if (!isRefusal(e)) throw e;
			problems.push(
				e.status === 409
					? `Entry ${entry.number}: the sheet was changed meanwhile on a tablet; open the page again and compare.`
					: `Entry ${entry.number}: ${e.message}`
			);
		}
	}
	return { saved, problems };
}
