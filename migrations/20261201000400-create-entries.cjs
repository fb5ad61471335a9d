'use strict';

/** Entries: one plant (or collection, or design) entered by an exhibitor into a class of a show. */
module.exports = {
	async up(queryInterface, Sequelize) {
		await queryInterface.createTable('entries', {
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
			class_id: {
				type: Sequelize.UUID,
				allowNull: false,
				references: { model: 'classes', key: 'id' }
			},
			exhibitor_id: {
				type: Sequelize.UUID,
				allowNull: false,
				references: { model: 'users', key: 'id' }
			},
			variety_id: { type: Sequelize.UUID, references: { model: 'varieties', key: 'id' } },
			collection_variety_ids: {
				type: Sequelize.ARRAY(Sequelize.UUID),
				allowNull: false,
				defaultValue: []
			},
			title: { type: Sequelize.STRING(160) },
			number: { type: Sequelize.INTEGER, allowNull: false },
			acquired_on: { type: Sequelize.DATEONLY },
			status: { type: Sequelize.STRING(16), allowNull: false, defaultValue: 'entered' },
			measured_diameter_in: { type: Sequelize.DECIMAL(5, 2) },
			measured_crowns: { type: Sequelize.INTEGER },
			pot_size_in: { type: Sequelize.DECIMAL(4, 2) },
			checked_in_at: { type: Sequelize.DATE },
			checked_in_by: { type: Sequelize.UUID, references: { model: 'users', key: 'id' } },
			created_at: {
				type: Sequelize.DATE,
				allowNull: false,
				defaultValue: Sequelize.literal('now()')
			},
			updated_at: {
				type: Sequelize.DATE,
				allowNull: false,
				defaultValue: Sequelize.literal('now()')
			}
		});
		await queryInterface.addConstraint('entries', {
			fields: ['show_id', 'number'],
			type: 'unique',
			name: 'entries_show_number_unique'
		});
		await queryInterface.sequelize.query(`ALTER TABLE entries
			ADD CONSTRAINT entries_status_known CHECK (status IN ('entered','checked_in','scratched','withdrawn'))`);
		await queryInterface.addIndex('entries', ['class_id']);
		await queryInterface.addIndex('entries', ['exhibitor_id']);
	},

	async down(queryInterface) {
		await queryInterface.dropTable('entries');
	}
};
