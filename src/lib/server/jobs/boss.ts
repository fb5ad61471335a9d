/**
 * pg-boss over Sequelize's own pool: one PgBoss per process, whose SQL runs on pooled connections
 * (no second pool), and a Db for a Sequelize transaction, so that a job is queued in the same
 * transaction as the change that causes it (pg-boss's `db` option).
 */
import PgBoss from 'pg-boss';
import type { Transaction } from 'sequelize';
import { config } from '../config';
import { sequelize } from '../db';
import type pg from 'pg';

/** A connection of Sequelize's pool (a pg client). */
type PgClient = pg.ClientBase;

export const JOB_SCHEMA = 'pgboss';

/** Runs pg-boss's statements on a connection lent by Sequelize's pool. */
const pooledDb: PgBoss.Db = {
	async executeSql(text, values) {
		const client = (await sequelize.connectionManager.getConnection({
			type: 'write'
		})) as PgClient;
		try {
			return await client.query(text, values);
		} finally {
			sequelize.connectionManager.releaseConnection(client);
		}
	}
};

/** pg-boss's statements inside a Sequelize transaction (its connection is a pg client). */
export function transactionDb(transaction: Transaction): PgBoss.Db {
	const client = (transaction as unknown as { connection: PgClient }).connection;
	return { executeSql: (text, values) => client.query(text, values) };
}

let boss: PgBoss | null = null;

/**
 * This process's PgBoss (not started: queueing needs no start). The worker starts it with
 * maintenance and the schedule; failed jobs are kept a year before pg-boss archives them.
 */
export function jobBoss(): PgBoss {
	boss ??= new PgBoss({
		db: pooledDb,
		schema: JOB_SCHEMA,
		migrate: false,
		pollingIntervalSeconds: config().jobsPollSeconds,
		archiveCompletedAfterSeconds: 24 * 60 * 60,
		archiveFailedAfterSeconds: 365 * 24 * 60 * 60,
		deleteAfterDays: 30
	});
	return boss;
}

/** Forgets this process's PgBoss (one whose start failed cannot be started again). */
export function forgetJobBoss(): void {
	boss = null;
}
