'use strict';

/** Judging panels of a show: their judges, an optional clerk, and the classes they judge. */
module.exports = {
	async up(queryInterface, Sequelize) {
		const stamp = () => ({
			type: Sequelize.DATE,
			allowNull: false,
			defaultValue: Sequelize.literal('now()')
		});
		await queryInterface.createTable('panels', {
			id: {
				type: Sequelize.UUID,
				primaryKey: true,
				defaultValue: Sequelize.literal('gen_random_uuid()')
			},
			show_id: {
				type: Sequelize.UUID,
				allowNull: false,
				references: { model: 'shows', key: 'id' },
				onDelete: 'CASCADE'
			},
			name: { type: Sequelize.STRING(80), allowNull: false },
			clerk_id: {
				type: Sequelize.UUID,
				references: { model: 'users', key: 'id' },
				onDelete: 'SET NULL'
			},
			created_at: stamp()
		});
		await queryInterface.sequelize.query(
			'CREATE UNIQUE INDEX panels_show_name_unique ON panels (show_id, lower(name))'
		);
		await queryInterface.createTable('panel_judges', {
			panel_id: {
				type: Sequelize.UUID,
				allowNull: false,
				primaryKey: true,
				references: { model: 'panels', key: 'id' },
				onDelete: 'CASCADE'
			},
			user_id: {
				type: Sequelize.UUID,
				allowNull: false,
				primaryKey: true,
				references: { model: 'users', key: 'id' },
				onDelete: 'CASCADE'
			},
			created_at: stamp()
		});
		await queryInterface.addIndex('panel_judges', ['user_id']);
		// A class is judged by one panel at most: class_id is the key.
		await queryInterface.createTable('panel_classes', {
			class_id: {
				type: Sequelize.UUID,
				allowNull: false,
				primaryKey: true,
				references: { model: 'classes', key: 'id' },
				onDelete: 'CASCADE'
			},
			panel_id: {
				type: Sequelize.UUID,
				allowNull: false,
				references: { model: 'panels', key: 'id' },
				onDelete: 'CASCADE'
			},
			created_at: stamp()
		});
		await queryInterface.addIndex('panel_classes', ['panel_id']);
	},

	async down(queryInterface) {
		await queryInterface.dropTable('panel_classes');
		await queryInterface.dropTable('panel_judges');
		await queryInterface.dropTable('panels');
	}
};
