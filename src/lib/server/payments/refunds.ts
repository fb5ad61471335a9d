import { Op, QueryTypes, type Transaction } from 'sequelize';
import type { IsoDate } from '../../domain/dates';
import { refundAllowed, type EntryFeeRefund } from '../../domain/dues';
import { Entry, Payment, Refund, Show, sequelize } from '../db';
import { enqueue } from '../jobs/enqueue';
import { stripe } from './stripe';
import { societyToday } from '../people/society-today';

/** What happened to the fee of a withdrawn entry. */
export type WithdrawnFeeOutcome = 'none' | 'cancelled' | 'refund_requested' | 'kept';

/**
 * Settles the fee of an entry that is being withdrawn, inside the withdrawal's transaction:
 * an unpaid fee is no longer owed; a paid fee is refunded where the show's policy allows it on
 * that day (a refund row is written with its `refund-send` job, see requestRefund); otherwise
 * the fee is kept.
 */
export async function settleFeeOfWithdrawnEntry(
	entryId: string,
	options: { transaction: Transaction; today?: IsoDate }
): Promise<WithdrawnFeeOutcome> {
	const { transaction } = options;
	const entry = await Entry.findByPk(entryId, { transaction, lock: transaction.LOCK.UPDATE });
	if (!entry) return 'none';
	if (entry.feeStatus === 'due') {
		await entry.update({ feeStatus: 'not_required' }, { transaction });
		return 'cancelled';
	}
	if (entry.feeStatus !== 'paid' || !entry.feePaymentId) return 'none';
	const show = await Show.findByPk(entry.showId, { transaction });
	const payment = await Payment.findByPk(entry.feePaymentId, { transaction });
	if (!show || !payment) return 'none';
	const today = options.today ?? (await societyToday(show.societyId, { transaction }));
	if (!refundAllowed(show.entryFeeRefund as EntryFeeRefund, show, today)) return 'kept';
	await requestRefund(
		{ paymentId: payment.id, entryId: entry.id, amountCents: payment.unitAmountCents },
		{ transaction, societyId: show.societyId }
	);
	await entry.update({ feeStatus: 'refund_pending' }, { transaction });
	return 'refund_requested';
}

/**
 * Writes a requested refund and its `refund-send` job in the caller's transaction: the refund
 * goes to the payment service once the change that asked for it is committed.
 */
export async function requestRefund(
	values: { paymentId: string; entryId: string | null; amountCents: number },
	options: { transaction: Transaction; societyId: string }
): Promise<Refund> {
	const refund = await Refund.create(values, { transaction: options.transaction });
	await enqueue(
		'refund-send',
		{ refundId: refund.id, societyId: options.societyId },
		{ transaction: options.transaction }
	);
	return refund;
}

/** What became of one refund when its job ran. */
export type RefundOutcome = 'sent' | 'not-due';

/**
 * Sends one requested refund to the payment service: the `refund-send` job's effect. It carries
 * an idempotency key made from its own id, so sending it twice (two workers, a retry after a lost
 * answer) refunds once; a refund no longer 'requested' is left alone. A failure is recorded on
 * the row and thrown, for the queue to try again with back-off. Only a later verified webhook
 * marks a refund 'succeeded'.
 */
export async function sendRefund(refundId: string): Promise<RefundOutcome> {
	const [row] = await sequelize.query<{
		id: string;
		amount_cents: number;
		payment_intent_id: string | null;
	}>(
		`SELECT r.id, r.amount_cents, p.payment_intent_id
		   FROM refunds r JOIN payments p ON p.id = r.payment_id
		  WHERE r.id = :refundId AND r.status = 'requested'`,
		{ replacements: { refundId }, type: QueryTypes.SELECT }
	);
	if (!row) return 'not-due';
	try {
		if (!row.payment_intent_id) {
			throw new Error('The payment has no payment intent yet; the refund waits for it.');
		}
		const refund = await stripe().refunds.create(
			{
				payment_intent: row.payment_intent_id,
				amount: row.amount_cents,
				metadata: { refund_id: row.id },
				reason: 'requested_by_customer'
			},
			{ idempotencyKey: `refund-${row.id}` }
		);
		await Refund.update(
			{ status: 'sent', stripeRefundId: refund.id, lastError: null },
			{ where: { id: row.id, status: 'requested' } }
		);
		// The webhook may have come first and recorded the refund already: keep its id.
		await Refund.update(
			{ stripeRefundId: refund.id },
			{ where: { id: row.id, stripeRefundId: { [Op.is]: null } } }
		);
		return 'sent';
	} catch (error) {
		const message = error instanceof Error ? error.message : String(error);
		await Refund.update({ lastError: message.slice(0, 1000) }, { where: { id: row.id } });
		throw error;
	}
}
