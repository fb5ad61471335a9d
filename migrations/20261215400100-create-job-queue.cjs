'use strict';

/**
 * The job queue (pg-boss 10) in its own schema, made by pg-boss's own construction plan, and its
 * queues, so that a change can queue its job in its own transaction before any worker started.
 * Each queue's retry and back-off defaults are set here; a job may carry its own (the mail
 * outbox's attempts are a host setting). Mail and refunds written before get their jobs.
 * worker_heartbeats: the workers alive (for /readyz).
 */
const PgBoss = require('pg-boss');

const SCHEMA = 'pgboss';

/** Queue name and options, in pg-boss's words. Jobs that fail for good stay (see the worker). */
const QUEUES = [
	['mail-send', { retryLimit: 7, retryDelay: 5, retryBackoff: true, expireInSeconds: 120 }],
	['refund-send', { retryLimit: 8, retryDelay: 30, retryBackoff: true, expireInSeconds: 120 }],
	['reminders-check', { retryLimit: 3, retryDelay: 60, retryBackoff: true, expireInSeconds: 1800 }],
	['show-pdf', { retryLimit: 3, retryDelay: 10, retryBackoff: true, expireInSeconds: 900 }]
];

module.exports = {
	async up(queryInterface) {
		const { sequelize } = queryInterface;
		const [[existing]] = await sequelize.query(
			`SELECT to_regclass('${SCHEMA}.version') IS NOT NULL AS present`
		);
		if (!existing.present) await sequelize.query(PgBoss.getConstructionPlans(SCHEMA));
		for (const [name, options] of QUEUES) {
			await sequelize.query(`SELECT ${SCHEMA}.create_queue(:name, :options::json)`, {
				replacements: { name, options: JSON.stringify({ policy: 'standard', ...options }) }
			});
		}
		// Work written before the queue existed gets its job: mail still to send, refunds to send.
		await sequelize.query(`
			INSERT INTO ${SCHEMA}.job (name, data, retry_limit, retry_delay, retry_backoff)
			SELECT 'mail-send', json_build_object('messageId', id, 'societyId', society_id), 7, 5, true
			  FROM outbox_messages WHERE status IN ('waiting', 'sending')`);
		await sequelize.query(`
			INSERT INTO ${SCHEMA}.job (name, data, retry_limit, retry_delay, retry_backoff)
			SELECT 'refund-send', json_build_object('refundId', r.id, 'societyId', p.society_id), 8, 30, true
			  FROM refunds r JOIN payments p ON p.id = r.payment_id WHERE r.status = 'requested'`);
		await sequelize.query(`
			CREATE TABLE worker_heartbeats (
				id text PRIMARY KEY,
				started_at timestamptz NOT NULL DEFAULT now(),
				seen_at timestamptz NOT NULL DEFAULT now()
			)`);
	},

	async down(queryInterface) {
		await queryInterface.sequelize.query(
			`DROP TABLE IF EXISTS worker_heartbeats; DROP SCHEMA IF EXISTS ${SCHEMA} CASCADE;`
		);
	}
};
