import { QueryTypes, type Transaction } from 'sequelize';
import type Stripe from 'stripe';
import { formatDateLong, formatIsoDate } from '../../domain/dates';
import { extendPaidThrough } from '../../domain/dues';
import { DuesPeriod, Membership, Payment, Refund, Society, User, sequelize } from '../db';
import { queueMail, type QueuedMail } from '../mail/outbox';
import { paymentReceiptMessage, refundMessage } from './payment-messages';
import { verifyWebhook, webhookSecret } from './stripe';
import { requestRefund } from './refunds';

/** The answer the webhook route gives. */
export interface WebhookAnswer {
	status: number;
	body: { received: boolean; outcome: string };
}

/** Thrown inside the transaction when an event came too early: nothing is kept, the service retries. */
class NotReadyYet extends Error {}

interface Handled {
	outcome: string;
}

/**
 * Verifies a webhook from the payment service and applies it once. A payment is recorded only
 * here. The signature must verify against STRIPE_WEBHOOK_SECRET (else 400, nothing changes); the
 * event id is written in the same transaction as its effects, so a replay finds it and changes
 * nothing; an event that arrives before the one it depends on (a refund before the payment is
 * recorded) is refused with 409 and nothing is kept, so the service sends it again later.
 */
export async function receiveWebhook(
	rawBody: string,
	signature: string | null
): Promise<WebhookAnswer> {
	const secret = webhookSecret();
	if (!secret) {
		return { status: 503, body: { received: false, outcome: 'Payments are not set up.' } };
	}
	if (!signature) {
		return { status: 400, body: { received: false, outcome: 'Missing Stripe-Signature header.' } };
	}
	let event: Stripe.Event;
	try {
		event = verifyWebhook(rawBody, signature, secret);
	} catch {
		return { status: 400, body: { received: false, outcome: 'The signature does not verify.' } };
	}
	let handled: Handled;
	try {
		handled = await sequelize.transaction((transaction) => applyEvent(event, transaction));
	} catch (error) {
		if (error instanceof NotReadyYet) {
			return { status: 409, body: { received: false, outcome: error.message } };
		}
		throw error;
	}
	return { status: 200, body: { received: true, outcome: handled.outcome } };
}

/** Records the event id first: when it is already there, this is a replay and nothing happens. */
async function applyEvent(event: Stripe.Event, transaction: Transaction): Promise<Handled> {
	const fresh = await sequelize.query(
		`INSERT INTO payment_events (event_id, type, outcome) VALUES (:eventId, :type, 'processing')
		 ON CONFLICT (event_id) DO NOTHING RETURNING event_id`,
		{ replacements: { eventId: event.id, type: event.type }, type: QueryTypes.SELECT, transaction }
	);
	if (fresh.length === 0) return { outcome: 'already processed' };

	let handled: Handled;
	switch (event.type) {
		case 'checkout.session.completed':
		case 'checkout.session.async_payment_succeeded':
			handled = await recordPaidSession(event.data.object, transaction);
			break;
		case 'checkout.session.expired':
		case 'checkout.session.async_payment_failed':
			handled = await recordUnpaidSession(
				event.data.object,
				event.type === 'checkout.session.expired' ? 'expired' : 'failed',
				transaction
			);
			break;
		case 'charge.refunded':
			handled = await recordRefundedCharge(event.data.object, transaction);
			break;
		default:
			handled = { outcome: 'ignored' };
	}
	await sequelize.query('UPDATE payment_events SET outcome = :outcome WHERE event_id = :eventId', {
		replacements: { eventId: event.id, outcome: handled.outcome.slice(0, 240) },
		transaction
	});
	return handled;
}

async function findPaymentOfSession(
	session: Stripe.Checkout.Session,
	transaction: Transaction
): Promise<Payment | null> {
	const id = session.metadata?.payment_id ?? session.client_reference_id;
	const byId =
		id && /^[0-9a-f-]{36}$/i.test(id)
			? await Payment.findByPk(id, { transaction, lock: transaction.LOCK.UPDATE })
			: null;
	if (byId) return byId;
	return Payment.findOne({
		where: { checkoutSessionId: session.id },
		transaction,
		lock: transaction.LOCK.UPDATE
	});
}

const PAID_STATES = new Set(['paid', 'refunded', 'partly_refunded']);

async function recordPaidSession(
	session: Stripe.Checkout.Session,
	transaction: Transaction
): Promise<Handled> {
	if (session.payment_status !== 'paid') return { outcome: 'checkout done, payment not yet made' };
	const payment = await findPaymentOfSession(session, transaction);
	if (!payment) return { outcome: 'not a payment of ours' };
	if (payment.checkoutSessionId && payment.checkoutSessionId !== session.id) {
		return { outcome: 'session does not match the payment' };
	}
	if (
		session.amount_total !== payment.amountCents ||
		(session.currency ?? '').toUpperCase() !== payment.currency.toUpperCase()
	) {
		console.error(`payment ${payment.id}: amount or currency differs from the checkout`);
		return { outcome: 'amount or currency differs; not recorded' };
	}
	if (PAID_STATES.has(payment.status)) return { outcome: 'already recorded' };

	const paidAt = new Date();
	await payment.update(
		{
			status: 'paid',
			paidAt,
			checkoutSessionId: session.id,
			paymentIntentId:
				typeof session.payment_intent === 'string'
					? session.payment_intent
					: (session.payment_intent?.id ?? null)
		},
		{ transaction }
	);

	const result =
		payment.purpose === 'dues'
			? await applyDues(payment, transaction)
			: await applyEntryFees(payment, transaction);
	await queueReceipt(payment, paidAt, result.note, transaction);
	return { outcome: `recorded ${payment.purpose} payment` };
}

/** Moves the member's dues forward to the end of the period paid (never backwards). */
async function applyDues(
	payment: Payment,
	transaction: Transaction
): Promise<{ note?: string; refund: boolean }> {
	const [membership, period] = await Promise.all([
		Membership.findOne({
			where: { societyId: payment.societyId, userId: payment.userId },
			transaction,
			lock: transaction.LOCK.UPDATE
		}),
		payment.duesPeriodId ? DuesPeriod.findByPk(payment.duesPeriodId, { transaction }) : null
	]);
	// The whole payment goes back, with the reason in the receipt.
	const refundWhole = async (note: string) => {
		await requestRefund(
			{ paymentId: payment.id, entryId: null, amountCents: payment.amountCents },
			{ transaction, societyId: payment.societyId }
		);
		return { note, refund: true };
	};
	if (!membership || !period) {
		return refundWhole(
			'The dues period or membership no longer exists, so this payment will be refunded.'
		);
	}
	const next = extendPaidThrough(membership.duesPaidThrough, period.endsOn);
	if (next === membership.duesPaidThrough) {
		return refundWhole(
			'Your dues were already paid for this period, so this payment will be refunded.'
		);
	}
	await membership.update({ duesPaidThrough: next }, { transaction });
	return { note: `Your dues are now paid through ${formatDateLong(next)}.`, refund: false };
}

/** Marks the entries' fees paid; fees for entries no longer owing (withdrawn, paid twice) go back. */
async function applyEntryFees(
	payment: Payment,
	transaction: Transaction
): Promise<{ note?: string; refund: boolean }> {
	const moved =
		payment.entryIds.length === 0
			? []
			: await sequelize.query<{ id: string }>(
					`UPDATE entries SET fee_status = 'paid', fee_payment_id = :paymentId, updated_at = now()
					  WHERE id IN (:entryIds) AND fee_status = 'due' AND status NOT IN ('withdrawn', 'scratched')
					RETURNING id`,
					{
						replacements: { paymentId: payment.id, entryIds: payment.entryIds },
						type: QueryTypes.SELECT,
						transaction
					}
				);
	const movedIds = new Set(moved.map((r) => r.id));
	const notOwing = payment.entryIds.filter((id) => !movedIds.has(id));
	for (const entryId of notOwing) {
		await requestRefund(
			{ paymentId: payment.id, entryId, amountCents: payment.unitAmountCents },
			{ transaction, societyId: payment.societyId }
		);
	}
	if (notOwing.length === 0) return { refund: false };
	return {
		note: `${notOwing.length} of these entries no longer owed a fee (withdrawn or already paid); that part will be refunded.`,
		refund: true
	};
}

async function queueReceipt(
	payment: Payment,
	paidAt: Date,
	note: string | undefined,
	transaction: Transaction
): Promise<void> {
	const [user, society] = await Promise.all([
		User.findByPk(payment.userId, { transaction }),
		Society.findByPk(payment.societyId, { transaction })
	]);
	if (!user || !society) return;
	const message = paymentReceiptMessage({
		societyName: society.name,
		description: payment.description,
		amountCents: payment.amountCents,
		currency: payment.currency,
		paidOn: formatDateLong(formatIsoDate(paidAt)),
		reference: payment.id,
		note
	});
	const mail: QueuedMail = {
		kind: 'payment-receipt',
		to: user.email,
		societyId: society.id,
		showId: payment.showId,
		recipientId: user.id,
		dedupeKey: `receipt:${payment.id}`,
		...message
	};
	await queueMail([mail], { transaction });
}

async function recordUnpaidSession(
	session: Stripe.Checkout.Session,
	status: 'expired' | 'failed',
	transaction: Transaction
): Promise<Handled> {
	const payment = await findPaymentOfSession(session, transaction);
	if (!payment) return { outcome: 'not a payment of ours' };
	// A stale "expired" after the payment was recorded changes nothing.
	if (payment.status !== 'pending') return { outcome: `left as ${payment.status}` };
	await payment.update({ status }, { transaction });
	return { outcome: `checkout ${status}` };
}

/**
 * Records refunds of a charge. Refunds we asked for are matched by their metadata (or id) and
 * marked succeeded; the entry's fee becomes 'refunded' and the member gets a message. The
 * payment's refunded total only ever grows, so an older snapshot arriving late changes nothing.
 */
async function recordRefundedCharge(
	charge: Stripe.Charge,
	transaction: Transaction
): Promise<Handled> {
	const intentId =
		typeof charge.payment_intent === 'string' ? charge.payment_intent : charge.payment_intent?.id;
	if (!intentId) return { outcome: 'charge without payment' };
	const payment = await Payment.findOne({
		where: { paymentIntentId: intentId },
		transaction,
		lock: transaction.LOCK.UPDATE
	});
	if (!payment) {
		// Either not ours, or the completed checkout has not been recorded yet: ask for it again later.
		throw new NotReadyYet('No recorded payment for this charge yet; send it again later.');
	}
	const ours = await Refund.findAll({
		where: { paymentId: payment.id },
		order: [['createdAt', 'ASC']],
		transaction,
		lock: transaction.LOCK.UPDATE
	});
	const listed = charge.refunds?.data ?? [];
	const succeeded: Refund[] = [];
	for (const remote of listed) {
		if (remote.status !== 'succeeded') continue;
		const match = ours.find(
			(r) => r.stripeRefundId === remote.id || r.id === remote.metadata?.refund_id
		);
		if (match && match.status !== 'succeeded') {
			await match.update({ status: 'succeeded', stripeRefundId: remote.id }, { transaction });
			succeeded.push(match);
		} else if (!match) {
			// A refund made directly with the payment service (not through Crownbench).
			const created = await Refund.create(
				{
					paymentId: payment.id,
					entryId: null,
					amountCents: remote.amount,
					status: 'succeeded',
					stripeRefundId: remote.id
				},
				{ transaction }
			);
			ours.push(created);
			succeeded.push(created);
		}
	}
	if (listed.length === 0) {
		// Without the list, count our sent refunds in order up to the total refunded.
		let covered = ours
			.filter((r) => r.status === 'succeeded')
			.reduce((s, r) => s + r.amountCents, 0);
		for (const r of ours) {
			if (r.status !== 'sent' && r.status !== 'requested') continue;
			if (covered + r.amountCents > charge.amount_refunded) break;
			covered += r.amountCents;
			await r.update({ status: 'succeeded' }, { transaction });
			succeeded.push(r);
		}
	}
	const refundedCents = Math.min(
		payment.amountCents,
		Math.max(payment.refundedCents, charge.amount_refunded)
	);
	await payment.update(
		{
			refundedCents,
			status:
				refundedCents >= payment.amountCents
					? 'refunded'
					: refundedCents > 0
						? 'partly_refunded'
						: payment.status
		},
		{ transaction }
	);
	const entryIds = succeeded.map((r) => r.entryId).filter((id): id is string => Boolean(id));
	if (entryIds.length) {
		await sequelize.query(
			`UPDATE entries SET fee_status = 'refunded', updated_at = now()
			  WHERE id IN (:entryIds) AND fee_payment_id = :paymentId`,
			{ replacements: { entryIds, paymentId: payment.id }, transaction }
		);
	}
	if (succeeded.length) await queueRefundMessages(payment, succeeded, transaction);
	return {
		outcome: succeeded.length ? `recorded ${succeeded.length} refund(s)` : 'no new refunds'
	};
}

async function queueRefundMessages(
	payment: Payment,
	refunds: Refund[],
	transaction: Transaction
): Promise<void> {
	const [user, society] = await Promise.all([
		User.findByPk(payment.userId, { transaction }),
		Society.findByPk(payment.societyId, { transaction })
	]);
	if (!user || !society) return;
	await queueMail(
		refunds.map((r) => ({
			kind: 'payment-refund',
			to: user.email,
			societyId: society.id,
			showId: payment.showId,
			recipientId: user.id,
			dedupeKey: `refund:${r.id}`,
			...refundMessage({
				societyName: society.name,
				description: r.entryId
					? `${payment.description}, one withdrawn entry`
					: payment.description,
				amountCents: r.amountCents,
				currency: payment.currency,
				reference: r.id
			})
		})),
		{ transaction }
	);
}
