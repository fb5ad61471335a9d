'use strict';

/**
 * Entry photos (files kept outside static/, served through an authorised route), and the size
 * class an entry is shown as when the entry desk moves an oversized plant to the class of its
 * measured size.
 */
module.exports = {
	async up(queryInterface, Sequelize) {
		await queryInterface.addColumn('entries', 'shown_size_class', {
			type: Sequelize.STRING(16)
		});
		await queryInterface.sequelize.query(`ALTER TABLE entries
			ADD CONSTRAINT entries_shown_size_known
			CHECK (shown_size_class IS NULL OR shown_size_class IN ('miniature','semiminiature','standard','large'))`);
		await queryInterface.addColumn('entries', 'desk_note', { type: Sequelize.STRING(240) });
		await queryInterface.addIndex('entries', ['show_id', 'status']);

		await queryInterface.createTable('entry_photos', {
			id: {
				type: Sequelize.UUID,
				primaryKey: true,
				defaultValue: Sequelize.literal('gen_random_uuid()')
			},
			entry_id: {
				type: Sequelize.UUID,
				allowNull: false,
				references: { model: 'entries', key: 'id' },
				onDelete: 'CASCADE'
			},
			uploaded_by: {
				type: Sequelize.UUID,
				allowNull: false,
				references: { model: 'users', key: 'id' },
				onDelete: 'CASCADE'
			},
			file_name: { type: Sequelize.STRING(80), allowNull: false, unique: true },
			content_type: { type: Sequelize.STRING(32), allowNull: false },
			bytes: { type: Sequelize.INTEGER, allowNull: false },
			width: { type: Sequelize.INTEGER },
			height: { type: Sequelize.INTEGER },
			created_at: {
				type: Sequelize.DATE,
				allowNull: false,
				defaultValue: Sequelize.literal('now()')
			}
		});
		await queryInterface.addIndex('entry_photos', ['entry_id']);
	},

	async down(queryInterface) {
		await queryInterface.dropTable('entry_photos');
		await queryInterface.removeIndex('entries', ['show_id', 'status']);
		await queryInterface.removeColumn('entries', 'desk_note');
		await queryInterface.sequelize.query(
			'ALTER TABLE entries DROP CONSTRAINT IF EXISTS entries_shown_size_known'
		);
		await queryInterface.removeColumn('entries', 'shown_size_class');
	}
};
