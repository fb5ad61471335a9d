/**
 * Database chores from the command line:
 *   tsx scripts/db.ts migrate | rollback | seed | reset | empty | status
 * reset drops every table, migrates and seeds: the demo's fresh start. empty drops every table
 * and migrates without the seed: a host's first start (the fresh-database browser tests).
 */
import {
	createSequelize,
	databaseUrl,
	isDatabaseDown,
	DATABASE_DOWN_HINT
} from '../src/lib/server/db/connection';
import { createMigrator, createSeeder } from '../src/lib/server/db/migrator';

/** Every table, and the job queue's own schema (made again by its migration). */
const DROP_EVERYTHING =
	'DROP SCHEMA IF EXISTS pgboss CASCADE; DROP SCHEMA public CASCADE; CREATE SCHEMA public;';

const command = process.argv[2] ?? 'status';
const sequelize = createSequelize();
const migrator = createMigrator(sequelize);
const seeder = createSeeder(sequelize);

async function main(): Promise<void> {
	switch (command) {
		case 'migrate': {
			const done = await migrator.up();
			console.log(`migrated: ${done.length} migration(s) applied`);
			break;
		}
		case 'rollback': {
			await seeder.down({ to: 0 });
			const undone = await migrator.down({ to: 0 });
			console.log(`rolled back: ${undone.length} migration(s) undone`);
			break;
		}
		case 'seed': {
			const done = await seeder.up();
			console.log(`seeded: ${done.length} seeder(s) run`);
			break;
		}
		case 'reset': {
			await sequelize.query(DROP_EVERYTHING);
			const m = await migrator.up();
			const s = await seeder.up();
			console.log(`reset: ${m.length} migration(s), ${s.length} seeder(s)`);
			break;
		}
		case 'empty': {
			await sequelize.query(DROP_EVERYTHING);
			const m = await migrator.up();
			console.log(`empty: ${m.length} migration(s), no seed`);
			break;
		}
		case 'status': {
			const pending = await migrator.pending();
			const executed = await migrator.executed();
			console.log(`${databaseUrl()}: ${executed.length} applied, ${pending.length} pending`);
			break;
		}
		default:
			console.error('usage: tsx scripts/db.ts migrate | rollback | seed | reset | empty | status');
			process.exitCode = 2;
	}
}

main()
	.catch((error: unknown) => {
		console.error(isDatabaseDown(error) ? DATABASE_DOWN_HINT : error);
		process.exitCode = 1;
	})
	.finally(() => sequelize.close());
