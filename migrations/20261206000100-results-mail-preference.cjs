'use strict';

/**
 * Lets members turn placements e-mails off: mail_preferences.results (no row means on). The same
 * table is created by the plants-and-reminders work (create-mail-preferences, with a reminders
 * column too); whichever runs first creates it, and this one then only makes sure the results
 * column is there. Down removes the table only when this migration created it.
 */
const CREATED_HERE = "COMMENT ON TABLE mail_preferences IS 'created by results-mail-preference'";

module.exports = {
	async up(queryInterface) {
		const [rows] = await queryInterface.sequelize.query(
			"SELECT to_regclass('public.mail_preferences') IS NOT NULL AS present"
		);
		if (!rows[0].present) {
			await queryInterface.sequelize.query(`CREATE TABLE mail_preferences (
				user_id uuid PRIMARY KEY REFERENCES users(id) ON DELETE CASCADE,
				reminders boolean NOT NULL DEFAULT true,
				results boolean NOT NULL DEFAULT true,
				updated_at timestamptz NOT NULL DEFAULT now()
			)`);
			await queryInterface.sequelize.query(CREATED_HERE);
		} else {
			await queryInterface.sequelize.query(
				'ALTER TABLE mail_preferences ADD COLUMN IF NOT EXISTS results boolean NOT NULL DEFAULT true'
			);
		}
	},

	async down(queryInterface) {
		const [rows] = await queryInterface.sequelize.query(
			"SELECT obj_description('public.mail_preferences'::regclass, 'pg_class') AS note WHERE to_regclass('public.mail_preferences') IS NOT NULL"
		);
		if (rows[0]?.note === 'created by results-mail-preference') {
			await queryInterface.dropTable('mail_preferences');
		}
	}
};
