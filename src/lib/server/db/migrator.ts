import { createRequire } from 'node:module';
import path from 'node:path';
import { Sequelize, type QueryInterface } from 'sequelize';
import { SequelizeStorage, Umzug } from 'umzug';

const require = createRequire(import.meta.url);

type MigrationModule = {
	up: (qi: QueryInterface, S: typeof Sequelize) => Promise<void>;
	down: (qi: QueryInterface, S: typeof Sequelize) => Promise<void>;
};

function build(sequelize: Sequelize, folder: string, table: string): Umzug<QueryInterface> {
	return new Umzug({
		migrations: {
			glob: path.join(folder, '*.cjs').replaceAll('\\', '/'),
			resolve: ({ name, path: file, context }) => {
				const mod = require(file as string) as MigrationModule;
				return {
					name,
					up: () => mod.up(context, Sequelize),
					down: () => mod.down(context, Sequelize)
				};
			}
		},
		context: sequelize.getQueryInterface(),
		storage: new SequelizeStorage({ sequelize, tableName: table, modelName: table }),
		logger: undefined
	});
}

/** Runs schema migrations from migrations/ (the same files sequelize-cli would run). */
export function createMigrator(sequelize: Sequelize, root = process.cwd()): Umzug<QueryInterface> {
	return build(sequelize, path.join(root, 'migrations'), 'SequelizeMeta');
}

/** Runs seeders from seeders/, recorded in their own table so they run once. */
export function createSeeder(sequelize: Sequelize, root = process.cwd()): Umzug<QueryInterface> {
	return build(sequelize, path.join(root, 'seeders'), 'SequelizeData');
}
