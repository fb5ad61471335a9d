'use strict';

/**
 * Which kinds of optional e-mail a person wants, one column per kind (reminders: entries closing
 * soon; results: placements after a show). No row means every kind is on.
 */
module.exports = {
	async up(queryInterface, Sequelize) {
		await queryInterface.createTable('mail_preferences', {
			user_id: {
				type: Sequelize.UUID,
				primaryKey: true,
				references: { model: 'users', key: 'id' },
				onDelete: 'CASCADE'
			},
			reminders: { type: Sequelize.BOOLEAN, allowNull: false, defaultValue: true },
			results: { type: Sequelize.BOOLEAN, allowNull: false, defaultValue: true },
			updated_at: {
				type: Sequelize.DATE,
				allowNull: false,
				defaultValue: Sequelize.literal('now()')
			}
		});
	},

	async down(queryInterface) {
		await queryInterface.dropTable('mail_preferences');
	}
};
