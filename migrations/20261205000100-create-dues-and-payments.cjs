'use strict';

/**
 * Dues and payments: a society's currency and dues periods, entry fees and their refund policy on
 * shows, the fee status of each entry, payments made through the hosted checkout, refunds, and
 * the ids of payment-service events already processed (so a replayed event changes nothing).
 * Money is always integer cents.
 */
module.exports = {
	async up(queryInterface, Sequelize) {
		const id = () => ({
			type: Sequelize.UUID,
			primaryKey: true,
			defaultValue: Sequelize.literal('gen_random_uuid()')
		});
		const now = () => ({
			type: Sequelize.DATE,
			allowNull: false,
			defaultValue: Sequelize.literal('now()')
		});
		const ref = (model, allowNull = false, onDelete = 'CASCADE') => ({
			type: Sequelize.UUID,
			allowNull,
			references: { model, key: 'id' },
			onDelete
		});

		await queryInterface.addColumn('societies', 'currency', {
			type: Sequelize.STRING(3),
			allowNull: false,
			defaultValue: 'USD'
		});

		await queryInterface.createTable('dues_periods', {
			id: id(),
			society_id: ref('societies'),
			label: { type: Sequelize.STRING(120), allowNull: false },
			amount_cents: { type: Sequelize.INTEGER, allowNull: false },
			starts_on: { type: Sequelize.DATEONLY, allowNull: false },
			ends_on: { type: Sequelize.DATEONLY, allowNull: false },
			created_at: now()
		});
		await queryInterface.sequelize.query(`ALTER TABLE dues_periods
			ADD CONSTRAINT dues_periods_amount_positive CHECK (amount_cents > 0),
			ADD CONSTRAINT dues_periods_dates_in_order CHECK (starts_on <= ends_on)`);
		await queryInterface.addIndex('dues_periods', ['society_id', 'ends_on']);

		await queryInterface.addColumn('shows', 'entry_fee_cents', {
			type: Sequelize.INTEGER,
			allowNull: false,
			defaultValue: 0
		});
		await queryInterface.addColumn('shows', 'entry_fee_refund', {
			type: Sequelize.STRING(24),
			allowNull: false,
			defaultValue: 'none'
		});
		await queryInterface.sequelize.query(`ALTER TABLE shows
			ADD CONSTRAINT shows_entry_fee_not_negative CHECK (entry_fee_cents >= 0),
			ADD CONSTRAINT shows_entry_fee_refund_known
			  CHECK (entry_fee_refund IN ('none','until_entries_close','until_entry_day'))`);

		await queryInterface.createTable('payments', {
			id: id(),
			society_id: ref('societies'),
			user_id: ref('users'),
			purpose: { type: Sequelize.STRING(16), allowNull: false },
			status: { type: Sequelize.STRING(16), allowNull: false, defaultValue: 'pending' },
			amount_cents: { type: Sequelize.INTEGER, allowNull: false },
			unit_amount_cents: { type: Sequelize.INTEGER, allowNull: false },
			currency: { type: Sequelize.STRING(3), allowNull: false },
			description: { type: Sequelize.STRING(240), allowNull: false },
			dues_period_id: ref('dues_periods', true, 'SET NULL'),
			show_id: ref('shows', true, 'SET NULL'),
			entry_ids: { type: Sequelize.ARRAY(Sequelize.UUID), allowNull: false, defaultValue: [] },
			checkout_session_id: { type: Sequelize.STRING(255), unique: true },
			payment_intent_id: { type: Sequelize.STRING(255) },
			refunded_cents: { type: Sequelize.INTEGER, allowNull: false, defaultValue: 0 },
			paid_at: { type: Sequelize.DATE },
			created_at: now(),
			updated_at: now()
		});
		await queryInterface.sequelize.query(`ALTER TABLE payments
			ADD CONSTRAINT payments_purpose_known CHECK (purpose IN ('dues','entry_fees')),
			ADD CONSTRAINT payments_status_known
			  CHECK (status IN ('pending','paid','expired','failed','refunded','partly_refunded')),
			ADD CONSTRAINT payments_amount_positive CHECK (amount_cents > 0 AND unit_amount_cents > 0),
			ADD CONSTRAINT payments_refund_within_amount CHECK (refunded_cents BETWEEN 0 AND amount_cents)`);
		await queryInterface.addIndex('payments', ['user_id', 'created_at']);
		await queryInterface.addIndex('payments', ['society_id', 'created_at']);
		await queryInterface.addIndex('payments', ['payment_intent_id']);

		await queryInterface.addColumn('entries', 'fee_status', {
			type: Sequelize.STRING(16),
			allowNull: false,
			defaultValue: 'not_required'
		});
		await queryInterface.addColumn('entries', 'fee_payment_id', ref('payments', true, 'SET NULL'));
		await queryInterface.sequelize.query(`ALTER TABLE entries
			ADD CONSTRAINT entries_fee_status_known
			  CHECK (fee_status IN ('not_required','due','paid','refund_pending','refunded'))`);

		await queryInterface.createTable('refunds', {
			id: id(),
			payment_id: ref('payments'),
			entry_id: ref('entries', true, 'SET NULL'),
			amount_cents: { type: Sequelize.INTEGER, allowNull: false },
			status: { type: Sequelize.STRING(16), allowNull: false, defaultValue: 'requested' },
			stripe_refund_id: { type: Sequelize.STRING(255), unique: true },
			last_error: { type: Sequelize.TEXT },
			created_at: now(),
			updated_at: now()
		});
		await queryInterface.sequelize.query(`ALTER TABLE refunds
			ADD CONSTRAINT refunds_amount_positive CHECK (amount_cents > 0),
			ADD CONSTRAINT refunds_status_known CHECK (status IN ('requested','sent','succeeded','failed'))`);
		await queryInterface.addIndex('refunds', ['payment_id']);

		await queryInterface.createTable('payment_events', {
			event_id: { type: Sequelize.STRING(255), primaryKey: true },
			type: { type: Sequelize.STRING(80), allowNull: false },
			outcome: { type: Sequelize.STRING(240), allowNull: false },
			received_at: now()
		});
	},

	async down(queryInterface) {
		await queryInterface.dropTable('payment_events');
		await queryInterface.dropTable('refunds');
		await queryInterface.sequelize.query(
			'ALTER TABLE entries DROP CONSTRAINT IF EXISTS entries_fee_status_known'
		);
		await queryInterface.removeColumn('entries', 'fee_payment_id');
		await queryInterface.removeColumn('entries', 'fee_status');
		await queryInterface.dropTable('payments');
		await queryInterface.sequelize.query(`ALTER TABLE shows
			DROP CONSTRAINT IF EXISTS shows_entry_fee_not_negative,
			DROP CONSTRAINT IF EXISTS shows_entry_fee_refund_known`);
		await queryInterface.removeColumn('shows', 'entry_fee_refund');
		await queryInterface.removeColumn('shows', 'entry_fee_cents');
		await queryInterface.dropTable('dues_periods');
		await queryInterface.removeColumn('societies', 'currency');
	}
};
