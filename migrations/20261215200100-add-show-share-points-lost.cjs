'use strict';

/**
 * Whether a show shares with each exhibitor the points their plants lost per criterion of the
 * scale, once results are published. Off for every show until its chair turns it on.
 */
module.exports = {
	async up(queryInterface, Sequelize) {
		await queryInterface.addColumn('shows', 'share_points_lost', {
			type: Sequelize.BOOLEAN,
			allowNull: false,
			defaultValue: false
		});
	},

	async down(queryInterface) {
		await queryInterface.removeColumn('shows', 'share_points_lost');
	}
};
