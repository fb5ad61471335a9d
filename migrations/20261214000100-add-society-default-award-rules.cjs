'use strict';

/**
 * A society's own award rules, which its new shows start from: filled with the default award
 * rules when the society is started. Societies from before keep an empty object (the defaults).
 */
module.exports = {
	async up(queryInterface, Sequelize) {
		await queryInterface.addColumn('societies', 'default_award_rules', {
			type: Sequelize.JSONB,
			allowNull: false,
			defaultValue: {}
		});
	},

	async down(queryInterface) {
		await queryInterface.removeColumn('societies', 'default_award_rules');
	}
};
