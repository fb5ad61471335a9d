'use strict';

/**
 * A society's own settings: its country, the unit lengths are shown in first, the paper its
 * documents print on and its time zone (the currency came with dues and payments).
 */
module.exports = {
	async up(queryInterface, Sequelize) {
		await queryInterface.addColumn('societies', 'country', {
			type: Sequelize.STRING(2),
			allowNull: false,
			defaultValue: 'US'
		});
		await queryInterface.addColumn('societies', 'length_unit', {
			type: Sequelize.STRING(2),
			allowNull: false,
			defaultValue: 'in'
		});
		await queryInterface.addColumn('societies', 'paper_size', {
			type: Sequelize.STRING(8),
			allowNull: false,
			defaultValue: 'letter'
		});
		await queryInterface.addColumn('societies', 'time_zone', {
			type: Sequelize.STRING(64),
			allowNull: false,
			defaultValue: 'America/New_York'
		});
		await queryInterface.addColumn('societies', 'updated_at', {
			type: Sequelize.DATE,
			allowNull: false,
			defaultValue: Sequelize.literal('now()')
		});
		await queryInterface.sequelize.query(`ALTER TABLE societies
			ADD CONSTRAINT societies_country_code CHECK (country ~ '^[A-Z]{2}$'),
			ADD CONSTRAINT societies_length_unit_known CHECK (length_unit IN ('in','cm')),
			ADD CONSTRAINT societies_paper_size_known CHECK (paper_size IN ('letter','a4'))`);
	},

	async down(queryInterface) {
		await queryInterface.sequelize.query(`ALTER TABLE societies
			DROP CONSTRAINT societies_country_code,
			DROP CONSTRAINT societies_length_unit_known,
			DROP CONSTRAINT societies_paper_size_known`);
		for (const column of ['updated_at', 'time_zone', 'paper_size', 'length_unit', 'country']) {
			await queryInterface.removeColumn('societies', column);
		}
	}
};
