import { Op, QueryTypes, type Transaction } from 'sequelize';
import type { IsoDate } from '../../domain/dates';
import { refundAllowed, type EntryFeeRefund } from '../../domain/dues';
import { Entry, Payment, Refund, Show, sequelize } from '../db';
import { stripe } from '../payments/stripe';
import { societyToday } from './society-today';

/** What happened to the fee of a withdrawn entry. */
export type WithdrawnFeeOutcome = 'none' | 'cancelled' | 'refund_requested' | 'kept';

/**
 * Settles the fee of an entry that is being withdrawn, inside the withdrawal's transaction:
 * an unpaid fee is no longer owed; a paid fee is refunded where the show's policy allows it on
 * that day (a refund row is written and sent to the payment service after the commit, see
 * sendRequestedRefunds); otherwise the fee is kept.
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
	await Refund.create(
		{ paymentId: payment.id, entryId: entry.id, amountCents: payment.unitAmountCents },
		{ transaction }
	);
	await entry.update({ feeStatus: 'refund_pending' }, { transaction });
	return 'refund_requested';
}

/**
 * Sends refunds that are written but not yet sent to the payment service. Each carries an
 * idempotency key made from its own id, so sending one twice (two app processes, a retry after a
 * lost answer) refunds once. Only a later verified webhook marks a refund 'succeeded'.
 */
export async function sendRequestedRefunds(limit = 20): Promise<{ sent: number; failed: number }> {
	const due = await sequelize.query<{
		id: string;
		amount_cents: number;
		payment_intent_id: string;
	}>(
		`SELECT r.id, r.amount_cents, p.payment_intent_id
		   FROM refunds r JOIN payments p ON p.id = r.payment_id
		  WHERE r.status = 'requested' AND p.payment_intent_id IS NOT NULL
		  ORDER BY r.created_at LIMIT $1`,
		{ bind: [limit], type: QueryTypes.SELECT }
	);
	const result = { sent: 0, failed: 0 };
	for (const row of due) {
		try {
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
			result.sent++;
		} catch (error) {
			const message = error instanceof Error ? error.message : String(error);
			await Refund.update({ lastError: message.slice(0, 1000) }, { where: { id: row.id } });
			result.failed++;
		}
	}
	return result;
}

/** Sends requested refunds now and then, like the mail outbox worker; returns a stop function. */
export function startRefundSender(
	intervalMs = Number(process.env.CB_REFUND_INTERVAL_MS ?? 30_000)
): () => void {
	const timer = setInterval(() => {
		sendRequestedRefunds().catch((error: unknown) =>
			console.error('refunds:', error instanceof Error ? error.message : error)
		);
	}, intervalMs);
	timer.unref();
	return () => clearInterval(timer);
}
