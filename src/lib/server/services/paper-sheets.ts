import { QueryTypes } from 'sequelize';
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
