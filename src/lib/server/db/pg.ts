/**
 * The few paths that run many times a second (the signed-in person behind every request, a
 * judge's score sheet save) send their statements through pg itself, on a connection of
 * Sequelize's pool: named statements, which PostgreSQL parses and plans once per connection,
 * and none of the model layer's work per query (replacements, stack capture, result shaping).
 * Everything else uses Sequelize. The statements still go through Sequelize's `logging` option,
 * so whatever logs or counts Sequelize's queries sees these too.
 */
import pg from 'pg';
import { sequelize } from './index';

/** A statement with a name of its own (one name per text: pg prepares it once per connection). */
export interface Statement {
	name: string;
	text: string;
	/** The placeholder names, in the order of pg's $1, $2, … */
	params: string[];
}

/**
 * A named statement written with `:name` placeholders, as Sequelize's replacements are, turned
 * into pg's `$1, $2, …` once. Write casts as CAST(x AS type), not `::`.
 */
export function statement(name: string, sql: string): Statement {
	const params: string[] = [];
	const text = sql.replace(/(?<![:\w]):([A-Za-z]\w*)/g, (_match, param: string) => {
		let i = params.indexOf(param);
		if (i < 0) i = params.push(param) - 1;
		return `$${i + 1}`;
	});
	return { name, text, params };
}

/** A pooled connection, handed to the work of one transaction. */
export type PgClient = pg.ClientBase;

function log(sql: string): void {
	// Sequelize's typings leave `options` out.
	const logging = (sequelize as unknown as { options: { logging?: unknown } }).options.logging;
	if (typeof logging === 'function') (logging as (sql: string) => void)(`Executing (pg): ${sql}`);
}

/** Runs one named statement on the client with the values of its placeholders; returns the rows. */
export async function run<R extends pg.QueryResultRow>(
	client: PgClient,
	statement: Statement,
	values: Record<string, unknown>
): Promise<R[]> {
	const list = statement.params.map((param) => {
		if (!(param in values)) throw new Error(`${statement.name}: no value for :${param}`);
		return values[param];
	});
	log(statement.text);
	const result = await client.query<R>({
		name: statement.name,
		text: statement.text,
		values: list
	});
	return result.rows;
}

async function command(client: PgClient, sql: 'BEGIN' | 'COMMIT' | 'ROLLBACK'): Promise<void> {
	log(sql);
	await client.query(sql);
}

async function acquire(): Promise<PgClient> {
	return (await sequelize.connectionManager.getConnection({ type: 'write' })) as PgClient;
}

/** Runs one named statement on a pooled connection (no transaction of its own). */
export async function query<R extends pg.QueryResultRow>(
	statement: Statement,
	values: Record<string, unknown>
): Promise<R[]> {
	const client = await acquire();
	try {
		return await run<R>(client, statement, values);
	} finally {
		// A connection pg found broken is marked so, and the pool drops it instead of lending it.
		sequelize.connectionManager.releaseConnection(client);
	}
}

/**
 * Runs `work` in one transaction on one pooled connection: committed when it returns, rolled
 * back when it throws (the error is passed on).
 */
export async function inTransaction<T>(work: (client: PgClient) => Promise<T>): Promise<T> {
	const client = await acquire();
	try {
		await command(client, 'BEGIN');
		const result = await work(client);
		await command(client, 'COMMIT');
		return result;
	} catch (err) {
		await command(client, 'ROLLBACK').catch(() => {});
		throw err;
	} finally {
		sequelize.connectionManager.releaseConnection(client);
	}
}
