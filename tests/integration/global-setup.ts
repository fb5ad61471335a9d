import { createSequelize } from '../../src/lib/server/db/connection';
import { createMigrator, createSeeder } from '../../src/lib/server/db/migrator';

/** Every integration run starts from an empty schema, migrated and seeded. */
export default async function setup(): Promise<void> {
	if (!process.env.DATABASE_URL?.includes('_test')) {
		throw new Error('Integration tests need DATABASE_URL pointing at a *_test database.');
	}
	const sequelize = createSequelize();
	try {
		await sequelize.query(
			'DROP SCHEMA IF EXISTS pgboss CASCADE; DROP SCHEMA public CASCADE; CREATE SCHEMA public;'
		);
		await createMigrator(sequelize).up();
		await createSeeder(sequelize).up();
	} finally {
		await sequelize.close();
	}
}
