'use strict';

/** Counters of the sign-in rate limits, shared by every app instance (rate-limiter-flexible's layout). */
module.exports = {
	async up(queryInterface) {
		await queryInterface.sequelize.query(`CREATE TABLE rate_limits (
			key varchar(255) PRIMARY KEY,
			points integer NOT NULL DEFAULT 0,
			expire bigint
		)`);
	},

	async down(queryInterface) {
		await queryInterface.dropTable('rate_limits');
	}
};
