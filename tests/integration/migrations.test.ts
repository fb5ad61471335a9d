import { afterAll, describe, expect, it } from 'vitest';
import { QueryTypes } from 'sequelize';
import { createSequelize } from '../../src/lib/server/db/connection';
import { createMigrator, createSeeder } from '../../src/lib/server/db/migrator';

const sequelize = createSequelize();
const migrator = createMigrator(sequelize);
const seeder = createSeeder(sequelize);

async function tables(): Promise<string[]> {
	const rows = await sequelize.query<{ name: string }>(
		`SELECT table_name::text AS name FROM information_schema.tables
		  WHERE table_schema = 'public' AND table_name NOT IN ('SequelizeMeta', 'SequelizeData')
		  ORDER BY table_name`,
		{ type: QueryTypes.SELECT }
	);
	return rows.map((r) => r.name);
}

async function count(table: string): Promise<number> {
	const [row] = await sequelize.query<{ n: string }>(`SELECT count(*) AS n FROM ${table}`, {
		type: QueryTypes.SELECT
	});
	return Number(row.n);
}

afterAll(() => sequelize.close());

describe('migrations and seed', () => {
	it('go down to nothing, up again, and the demo seed loads', async () => {
		const before = await tables();
		expect(before).toEqual(
			expect.arrayContaining(['users', 'sessions', 'memberships', 'shows', 'classes', 'entries'])
		);

		await seeder.down({ to: 0 });
		expect(await count('users')).toBe(0);
		await migrator.down({ to: 0 });
		expect(await tables()).toEqual([]);

		await migrator.up();
		expect(await tables()).toEqual(before);
		expect(await migrator.pending()).toEqual([]);

		await seeder.up();
		expect(await count('societies')).toBeGreaterThanOrEqual(2);
		expect(await count('varieties')).toBeGreaterThanOrEqual(35);
		expect(await count('classes')).toBeGreaterThanOrEqual(20);
		expect(await count('entries')).toBeGreaterThanOrEqual(30);
		const roles = await sequelize.query<{ role: string }>(
			'SELECT DISTINCT unnest(roles) AS role FROM memberships ORDER BY 1',
			{ type: QueryTypes.SELECT }
		);
		expect(roles.map((r) => r.role)).toEqual(['admin', 'chair', 'clerk', 'judge', 'member']);
	});

	it('refuses a role that does not exist', async () => {
		await expect(
			sequelize.query(`UPDATE memberships SET roles = ARRAY['owner']::varchar(16)[]`)
		).rejects.toThrow(/memberships_roles_known/);
	});
});
