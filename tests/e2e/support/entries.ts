import { randomUUID } from 'node:crypto';
import { loadParams } from '../access/params';
import { withDb } from './judging-fixture';

/**
 * Puts a new plant into a person's collection (the society's first variety, bought `daysOwned`
 * days ago) and enters it in the first class of the demo's spring show, straight in the
 * database. The entry is named by `title`, or by the variety when no title is given.
 */
export async function enterNewPlant(options: {
	email: string;
	label: string;
	title?: string;
	daysOwned: number;
}): Promise<{
	user: { id: string; name: string; email: string };
	plantId: string;
	entryId: string;
	number: number;
	classId: string;
}> {
	const params = await loadParams();
	return withDb(async (db) => {
		const one = async (sql: string, values: unknown[] = []) =>
			(await db.query(sql, values)).rows[0];
		const user = await one(`SELECT id, name, email FROM users WHERE email = $1`, [options.email]);
		const cls = await one(`SELECT id FROM classes WHERE show_id = $1 ORDER BY position LIMIT 1`, [
			params.showId
		]);
		const variety = await one(
			`SELECT id FROM varieties WHERE society_id = $1 ORDER BY name LIMIT 1`,
			[params.societyId]
		);
		const plantId = randomUUID();
		await db.query(
			`INSERT INTO plants (id, owner_id, variety_id, label, obtained_how, obtained_on)
			 VALUES ($1, $2, $3, $4, 'bought', current_date - CAST($5 AS int))`,
			[plantId, user.id, variety.id, options.label, options.daysOwned]
		);
		const entryId = randomUUID();
		const number = 20000 + Math.floor(Math.random() * 9e5);
		await db.query(
			`INSERT INTO entries (id, show_id, class_id, exhibitor_id, title, variety_id, number, plant_id)
			 VALUES ($1, $2, $3, $4, $5, $6, $7, $8)`,
			[
				entryId,
				params.showId,
				cls.id,
				user.id,
				options.title ?? null,
				options.title ? null : variety.id,
				number,
				plantId
			]
		);
		return { user, plantId, entryId, number, classId: cls.id as string };
	});
}
