'use strict';

/**
 * The audit log: one row for each destructive or irreversible action (a removal, a scratch, a
 * withdrawal, a move, a role taken away, results published), written in the same transaction as
 * the change itself. Who did it is kept as written at the time (no foreign key: the record
 * outlives accounts). A member's own collection belongs to no society (society_id null).
 */
module.exports = {
	async up(queryInterface, Sequelize) {
		await queryInterface.createTable('audit_events', {
			id: { type: Sequelize.BIGINT, primaryKey: true, autoIncrement: true },
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
			actor_id: { type: Sequelize.UUID, allowNull: false },
			actor_label: { type: Sequelize.STRING(320), allowNull: false },
			action: { type: Sequelize.STRING(48), allowNull: false },
			target_kind: { type: Sequelize.STRING(32), allowNull: false },
			target_id: { type: Sequelize.STRING(64), allowNull: false },
			target_label: { type: Sequelize.STRING(200), allowNull: false },
			details: { type: Sequelize.JSONB, allowNull: false, defaultValue: {} },
			at: {
				type: Sequelize.DATE,
				allowNull: false,
				defaultValue: Sequelize.literal('now()')
			}
		});
		// Read newest first by society, by show and by person.
		await queryInterface.addIndex('audit_events', ['society_id', { name: 'at', order: 'DESC' }], {
			name: 'audit_events_society_at'
		});
		await queryInterface.addIndex('audit_events', ['show_id', { name: 'at', order: 'DESC' }], {
			name: 'audit_events_show_at'
		});
		await queryInterface.addIndex('audit_events', ['actor_id', 'at'], {
			name: 'audit_events_actor_at'
		});
	},

	async down(queryInterface) {
		await queryInterface.dropTable('audit_events');
	}
};
