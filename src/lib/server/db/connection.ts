import pg from 'pg';
import { Sequelize } from 'sequelize';

/** The default local database, as started by ./docker-less-db.sh. */
export const DEFAULT_DATABASE_URL = 'postgres://postgres@127.0.0.1:54329/crownbench';

/** The database URL the process uses: DATABASE_URL, or the local database of docker-less-db.sh. */
export function databaseUrl(): string {
	return process.env.DATABASE_URL || DEFAULT_DATABASE_URL;
}

/** Creates a Sequelize instance for PostgreSQL; the pg driver is passed so bundles find it. */
export function createSequelize(url: string = databaseUrl()): Sequelize {
	return new Sequelize(url, {
		dialect: 'postgres',
		dialectModule: pg,
		logging: false,
		pool: { max: Number(process.env.DB_POOL_MAX ?? 10), min: 0, idle: 10_000, acquire: 20_000 },
		define: { underscored: true, timestamps: false }
	});
}

/** True when an error means PostgreSQL could not be reached at all. */
export function isDatabaseDown(error: unknown): boolean {
	let e: unknown = error;
	for (let depth = 0; e && depth < 4; depth++) {
		const err = e as {
			name?: string;
			code?: string;
			parent?: unknown;
			original?: unknown;
			cause?: unknown;
		};
		if (
			err.name === 'SequelizeConnectionRefusedError' ||
			err.name === 'SequelizeHostNotFoundError' ||
			err.name === 'SequelizeConnectionError' ||
			err.code === 'ECONNREFUSED' ||
			err.code === '57P01' ||
			err.code === '57P03'
		) {
			return true;
		}
		e = err.parent ?? err.original ?? err.cause;
	}
	return false;
}

/** The message shown when the database is not running: it names the command that starts it. */
export const DATABASE_DOWN_MESSAGE =
	'The database is not running. Start it with ./docker-less-db.sh start (then try again).';
