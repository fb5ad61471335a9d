import pg from 'pg';
import { Sequelize } from 'sequelize';
import { config } from '../config';

/** The default local database, as started by ./docker-less-db.sh. */
export const DEFAULT_DATABASE_URL = 'postgres://postgres@127.0.0.1:54329/crownbench';

/** The database URL the process uses: DATABASE_URL, or the local database of docker-less-db.sh. */
export function databaseUrl(): string {
	return config().databaseUrl || DEFAULT_DATABASE_URL;
}

/** Creates a Sequelize instance for PostgreSQL; the pg driver is passed so bundles find it. */
export function createSequelize(url: string = databaseUrl()): Sequelize {
	return new Sequelize(url, {
		dialect: 'postgres',
		dialectModule: pg,
		logging: false,
		pool: { max: config().dbPoolMax, min: 0, idle: 10_000, acquire: 20_000 },
		define: { underscored: true, timestamps: false }
	});
}

/** Error codes of a database out of reach: refused connections, shutting down, starting up. */
const DOWN_CODES = new Set(['ECONNREFUSED', '57P01', '57P02', '57P03']);

/** Lost connections: the database's only when the error came through Sequelize (not mail, say). */
const LOST_CODES = new Set(['ECONNRESET', 'EPIPE']);

/** What the pg driver says when the server closed the connection under a query. */
const LOST_CONNECTION = /^Connection terminated|connection error and is not queryable/;

/**
 * True when an error means PostgreSQL could not be reached: not running, shutting down or starting
 * up, or the connection was lost mid-query (SQLSTATE class 08, or the driver's own words).
 */
export function isDatabaseDown(error: unknown): boolean {
	let e: unknown = error;
	let viaSequelize = false;
	for (let depth = 0; e && depth < 4; depth++) {
		const err = e as {
			name?: string;
			code?: string;
			message?: string;
			parent?: unknown;
			original?: unknown;
			cause?: unknown;
		};
		viaSequelize ||= typeof err.name === 'string' && err.name.startsWith('Sequelize');
		if (
			err.name === 'SequelizeConnectionRefusedError' ||
			err.name === 'SequelizeHostNotFoundError' ||
			err.name === 'SequelizeConnectionError' ||
			(typeof err.code === 'string' &&
				(DOWN_CODES.has(err.code) ||
					/^08[0-9A-Z]{3}$/.test(err.code) ||
					(viaSequelize && LOST_CODES.has(err.code)))) ||
			(typeof err.message === 'string' && LOST_CONNECTION.test(err.message))
		) {
			return true;
		}
		e = err.parent ?? err.original ?? err.cause;
	}
	return false;
}

/** What a person using the app reads when the database cannot be reached. */
export const DATABASE_DOWN_MESSAGE =
	'Crownbench cannot reach its database just now; please try again in a moment.';

/** What a developer running a script reads: it names the command that starts the database. */
export const DATABASE_DOWN_HINT =
	'The database is not running. Start it with ./docker-less-db.sh start (then try again).';
