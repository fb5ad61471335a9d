'use strict';

/**
 * The schedule editor's new fields and versions of scales of points:
 * - classes: per-class possession period and entry limits (null = the show's), largest pot size;
 * - shows: the general rules and the show committee as text printed in the schedule;
 * - scales: a version number and the scale a new version replaces (a scale that a scored sheet
 *   uses is never changed; editing it makes a new row).
 */
module.exports = {
	async up(queryInterface, Sequelize) {
		await queryInterface.sequelize.transaction(async (transaction) => {
			const add = (table, column, spec) =>
				queryInterface.addColumn(table, column, spec, { transaction });
			await add('classes', 'possession_months', { type: Sequelize.INTEGER });
			await add('classes', 'max_entries_per_exhibitor', { type: Sequelize.INTEGER });
			await add('classes', 'max_entries_per_variety', { type: Sequelize.INTEGER });
			await add('classes', 'max_pot_in', { type: Sequelize.DECIMAL(5, 2) });
			await queryInterface.sequelize.query(
				`ALTER TABLE classes
				ADD CONSTRAINT classes_possession_months_range CHECK (possession_months IS NULL OR possession_months BETWEEN 0 AND 24),
				ADD CONSTRAINT classes_max_per_exhibitor_range CHECK (max_entries_per_exhibitor IS NULL OR max_entries_per_exhibitor BETWEEN 1 AND 20),
				ADD CONSTRAINT classes_max_per_variety_range CHECK (max_entries_per_variety IS NULL OR max_entries_per_variety BETWEEN 1 AND 20),
				ADD CONSTRAINT classes_max_pot_positive CHECK (max_pot_in IS NULL OR max_pot_in > 0)`,
				{ transaction }
			);
			await add('shows', 'general_rules', { type: Sequelize.TEXT });
			await add('shows', 'committee', { type: Sequelize.TEXT });
			await add('scales', 'version', {
				type: Sequelize.INTEGER,
				allowNull: false,
				defaultValue: 1
			});
			await add('scales', 'replaces_id', {
				type: Sequelize.UUID,
				references: { model: 'scales', key: 'id' },
				onDelete: 'SET NULL'
			});
			await queryInterface.sequelize.query(
				'ALTER TABLE scales ADD CONSTRAINT scales_version_positive CHECK (version >= 1)',
				{ transaction }
			);
			await queryInterface.addIndex('scales', ['society_id'], { transaction });
		});
	},

	async down(queryInterface) {
		await queryInterface.sequelize.transaction(async (transaction) => {
			const drop = (table, column) => queryInterface.removeColumn(table, column, { transaction });
			await queryInterface.removeIndex('scales', ['society_id'], { transaction });
			await drop('scales', 'replaces_id');
			await drop('scales', 'version');
			await drop('shows', 'committee');
			await drop('shows', 'general_rules');
			await drop('classes', 'max_pot_in');
			await drop('classes', 'max_entries_per_variety');
			await drop('classes', 'max_entries_per_exhibitor');
			await drop('classes', 'possession_months');
		});
	}
};
