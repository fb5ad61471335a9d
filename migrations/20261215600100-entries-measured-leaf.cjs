'use strict';

/**
 * The longest leaf blade of an entered plant, as measured at the desk, in inches: a miniature
 * Sinningia is sized by its leaf blade, not by its span. Null while not measured (and for plants
 * whose size is measured across).
 */
module.exports = {
	async up(queryInterface, Sequelize) {
		await queryInterface.addColumn('entries', 'measured_leaf_in', {
			type: Sequelize.DECIMAL(4, 2),
			allowNull: true
		});
	},

	async down(queryInterface) {
		await queryInterface.removeColumn('entries', 'measured_leaf_in');
	}
};
