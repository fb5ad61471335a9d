'use strict';

/** An entry may name the plant of the exhibitor's collection it was made from. */
module.exports = {
	async up(queryInterface, Sequelize) {
		await queryInterface.addColumn('entries', 'plant_id', {
			type: Sequelize.UUID,
			references: { model: 'plants', key: 'id' },
			onDelete: 'SET NULL'
		});
		await queryInterface.addIndex('entries', ['plant_id']);
	},

	async down(queryInterface) {
		await queryInterface.removeColumn('entries', 'plant_id');
	}
};
