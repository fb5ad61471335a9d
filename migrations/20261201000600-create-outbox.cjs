'use strict';

/**
 * The mail outbox: every message is written here in the same transaction as the change that
 * causes it, then sent by the outbox worker with retries. The row is the record of its delivery.
 */
module.exports = {
	async up(queryInterface, Sequelize) {
		await queryInterface.createTable('outbox_messages', {
			id: {
				type: Sequelize.UUID,
				primaryKey: true,
				defaultValue: Sequelize.literal('gen_random_uuid()')
			},
			kind: { type: Sequelize.STRING(40), allowNull: false },
			society_id: {
				type: Sequelize.UUID,
				references: { model: 'societies', key: 'id' },
				onDelete: 'CASCADE'
			},
			show_id: {
				type: Sequelize.UUID,
				references: { model: 'shows', key: 'id' },
				onDelete: 'CASCADE'
			},
			recipient_id: {
				type: Sequelize.UUID,
				references: { model: 'users', key: 'id' },
				onDelete: 'SET NULL'
			},
			to_address: { type: Sequelize.STRING(254), allowNull: false },
			subject: { type: Sequelize.STRING(240), allowNull: false },
			text_body: { type: Sequelize.TEXT, allowNull: false },
			html_body: { type: Sequelize.TEXT },
			dedupe_key: { type: Sequelize.STRING(200), unique: true },
			status: { type: Sequelize.STRING(16), allowNull: false, defaultValue: 'waiting' },
			attempts: { type: Sequelize.INTEGER, allowNull: false, defaultValue: 0 },
			last_error: { type: Sequelize.TEXT },
			next_attempt_at: {
				type: Sequelize.DATE,
				allowNull: false,
				defaultValue: Sequelize.literal('now()')
			},
			locked_until: { type: Sequelize.DATE },
			sent_at: { type: Sequelize.DATE },
			created_at: {
				type: Sequelize.DATE,
				allowNull: false,
				defaultValue: Sequelize.literal('now()')
			}
		});
		await queryInterface.sequelize.query(`ALTER TABLE outbox_messages
			ADD CONSTRAINT outbox_status_known CHECK (status IN ('waiting','sending','sent','failed'))`);
		await queryInterface.sequelize.query(
			`CREATE INDEX outbox_due ON outbox_messages (next_attempt_at) WHERE status IN ('waiting','sending')`
		);
		await queryInterface.addIndex('outbox_messages', ['show_id', 'kind', 'status']);
	},

	async down(queryInterface) {
		await queryInterface.dropTable('outbox_messages');
	}
};
