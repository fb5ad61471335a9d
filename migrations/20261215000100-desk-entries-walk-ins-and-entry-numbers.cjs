'use strict';

/**
 * Entry day at the desk (issue 14): exhibitors without an account (walk-ins), until when the desk
 * takes entries, and how a show's entry numbers are formed and when they were fixed.
 */
module.exports = {
	async up(queryInterface, Sequelize) {
		await queryInterface.createTable('walk_in_exhibitors', {
			id: {
				type: Sequelize.UUID,
				primaryKey: true,
				defaultValue: Sequelize.literal('gen_random_uuid()')
			},
			society_id: {
				type: Sequelize.UUID,
				allowNull: false,
				references: { model: 'societies', key: 'id' },
				onDelete: 'CASCADE'
			},
			// The person's record that their entries belong to; signing in with `email` reaches it.
			user_id: {
				type: Sequelize.UUID,
				allowNull: false,
				unique: true,
				references: { model: 'users', key: 'id' },
				onDelete: 'CASCADE'
			},
			name: { type: Sequelize.STRING(120), allowNull: false },
			email: { type: Sequelize.STRING(254) },
			household: { type: Sequelize.STRING(120) },
			created_by: { type: Sequelize.UUID, references: { model: 'users', key: 'id' } },
			created_at: {
				type: Sequelize.DATE,
				allowNull: false,
				defaultValue: Sequelize.literal('now()')
			},
			claimed_at: { type: Sequelize.DATE }
		});
		await queryInterface.addIndex('walk_in_exhibitors', ['society_id']);
		await queryInterface.sequelize.query(
			`CREATE UNIQUE INDEX walk_in_exhibitors_email ON walk_in_exhibitors (lower(email)) WHERE email IS NOT NULL`
		);

		await queryInterface.addColumn('shows', 'desk_entries_until', {
			type: Sequelize.STRING(24),
			allowNull: false,
			defaultValue: 'judging_starts'
		});
		await queryInterface.sequelize
			.query(`ALTER TABLE shows ADD CONSTRAINT shows_desk_entries_until_known
			CHECK (desk_entries_until IN ('judging_starts', 'entry_day_ends', 'never'))`);
		await queryInterface.addColumn('shows', 'entry_number_form', {
			type: Sequelize.STRING(16),
			allowNull: false,
			defaultValue: 'show_sequence'
		});
		await queryInterface.sequelize
			.query(`ALTER TABLE shows ADD CONSTRAINT shows_entry_number_form_known
			CHECK (entry_number_form IN ('show_sequence', 'class_prefix'))`);
		await queryInterface.addColumn('shows', 'entry_number_seed', { type: Sequelize.INTEGER });
		await queryInterface.addColumn('shows', 'entry_number_digits', { type: Sequelize.INTEGER });
		await queryInterface.addColumn('shows', 'entry_numbers_fixed_at', { type: Sequelize.DATE });

		await queryInterface.addColumn('entries', 'entered_at_desk_by', {
			type: Sequelize.UUID,
			references: { model: 'users', key: 'id' }
		});
	},

	async down(queryInterface) {
		await queryInterface.removeColumn('entries', 'entered_at_desk_by');
		await queryInterface.removeColumn('shows', 'entry_numbers_fixed_at');
		await queryInterface.removeColumn('shows', 'entry_number_digits');
		await queryInterface.removeColumn('shows', 'entry_number_seed');
		await queryInterface.sequelize.query(
			'ALTER TABLE shows DROP CONSTRAINT shows_entry_number_form_known'
		);
		await queryInterface.removeColumn('shows', 'entry_number_form');
		await queryInterface.sequelize.query(
			'ALTER TABLE shows DROP CONSTRAINT shows_desk_entries_until_known'
		);
		await queryInterface.removeColumn('shows', 'desk_entries_until');
		await queryInterface.dropTable('walk_in_exhibitors');
	}
};
