import { Op, QueryTypes } from 'sequelize';
import { compareIsoDates, todayIn, type IsoDate } from '../../domain/dates';
import { duesStanding, periodAddsTime, type DuesStanding } from '../../domain/dues';
import { sumCents } from '../../domain/money';
import { DEFAULT_SOCIETY_SETTINGS } from '../../domain/society-settings';
import { DuesPeriod, Entry, Membership, Payment, Show, Society, sequelize } from '../db';
import type { PaymentPurpose, PaymentStatus } from '../db/models/payment';
import { stripe } from './stripe';

/** A payment could not be started; the message is meant for the member. */
export class PaymentStartError extends Error {
	constructor(
		message: string,
		readonly field?: string
	) {
		super(message);
	}
}

interface CheckoutLine {
	name: string;
	unitAmountCents: number;
	quantity: number;
}

/**
 * Opens a hosted checkout for a pending payment row and stores the session id. The payment stays
 * 'pending' until a verified webhook records it. When the payment service cannot be reached the
 * row is marked 'failed' and the member is told to try again.
 */
async function openCheckout(
	payment: Payment,
	line: CheckoutLine,
	input: { email: string; returnPath: string; origin: string }
): Promise<string> {
	const back = `${input.origin}${input.returnPath}`;
	const join = back.includes('?') ? '&' : '?';
	try {
		const session = await stripe().checkout.sessions.create(
			{
				mode: 'payment',
				client_reference_id: payment.id,
				customer_email: input.email,
				metadata: { payment_id: payment.id, purpose: payment.purpose },
				payment_intent_data: { metadata: { payment_id: payment.id } },
				line_items: [
					{
						quantity: line.quantity,
						price_data: {
							currency: payment.currency.toLowerCase(),
							unit_amount: line.unitAmountCents,
							product_data: { name: line.name }
						}
					}
				],
				success_url: `${back}${join}paid={CHECKOUT_SESSION_ID}`,
				cancel_url: `${back}${join}cancelled=1`
			},
			{ idempotencyKey: `checkout-${payment.id}` }
		);
		if (!session.url) throw new Error('The payment service gave no checkout address.');
		await payment.update({ checkoutSessionId: session.id });
		return session.url;
	} catch (error) {
		console.error('checkout:', error instanceof Error ? error.message : error);
		await payment.update({ status: 'failed' });
		throw new PaymentStartError(
			'The payment service did not answer. Nothing was charged; please try again in a few minutes.'
		);
	}
}

/**
 * Starts paying dues: checks that the member belongs to the society and that the period still
 * adds time, records a pending payment, and returns the hosted checkout address.
 */
export async function startDuesCheckout(
	user: { id: string; email: string },
	input: { societyId: string; periodId: string },
	urls: { origin: string },
	today?: IsoDate
): Promise<{ url: string; paymentId: string }> {
	const [membership, period, society] = await Promise.all([
		Membership.findOne({ where: { societyId: input.societyId, userId: user.id } }),
		DuesPeriod.findOne({ where: { id: input.periodId, societyId: input.societyId } }),
		Society.findByPk(input.societyId)
	]);
	if (!membership || !society) throw new PaymentStartError('You are not a member of that society.');
	if (!period) throw new PaymentStartError('Choose one of the dues periods listed.', 'periodId');
	today ??= todayIn(society.timeZone);
	if (
		compareIsoDates(period.endsOn, today) < 0 ||
		!periodAddsTime(membership.duesPaidThrough, period.endsOn)
	) {
		throw new PaymentStartError(
			'Your dues are already paid through the end of that period.',
			'periodId'
		);
	}
	const payment = await Payment.create({
		societyId: society.id,
		userId: user.id,
		purpose: 'dues',
		amountCents: period.amountCents,
		unitAmountCents: period.amountCents,
		currency: society.currency,
		description: `Dues: ${period.label}`,
		duesPeriodId: period.id,
		showId: null
	});
	const url = await openCheckout(
		payment,
		{
			name: `${society.name}: dues, ${period.label}`,
			unitAmountCents: period.amountCents,
			quantity: 1
		},
		{ email: user.email, returnPath: '/my/membership', origin: urls.origin }
	);
	return { url, paymentId: payment.id };
}

/**
 * Starts paying the entry fees a member owes for one show (every entry whose fee is due), and
 * returns the hosted checkout address.
 */
export async function startEntryFeeCheckout(
	user: { id: string; email: string },
	input: { showId: string },
	urls: { origin: string }
): Promise<{ url: string; paymentId: string }> {
	const show = await Show.findByPk(input.showId, {
		include: [{ model: Society, as: 'society' }]
	});
	if (!show) throw new PaymentStartError('That show does not exist.');
	const entries = await Entry.findAll({
		where: {
			showId: show.id,
			exhibitorId: user.id,
			feeStatus: 'due',
			status: { [Op.notIn]: ['withdrawn', 'scratched'] }
		},
		order: [['number', 'ASC']]
	});
	if (entries.length === 0 || show.entryFeeCents <= 0) {
		throw new PaymentStartError('You owe no entry fees for that show.');
	}
	const society = show.get('society') as Society;
	const payment = await Payment.create({
		societyId: society.id,
		userId: user.id,
		purpose: 'entry_fees',
		amountCents: sumCents(entries.map(() => show.entryFeeCents)),
		unitAmountCents: show.entryFeeCents,
		currency: society.currency,
		description: `Entry fees: ${show.name} (${entries.length} ${entries.length === 1 ? 'entry' : 'entries'})`,
		duesPeriodId: null,
		showId: show.id,
		entryIds: entries.map((e) => e.id)
	});
	const url = await openCheckout(
		payment,
		{
			name: `${show.name}: entry fee`,
			unitAmountCents: show.entryFeeCents,
			quantity: entries.length
		},
		{ email: user.email, returnPath: '/my/payments', origin: urls.origin }
	);
	return { url, paymentId: payment.id };
}

/** One society on the member's membership page. */
export interface MembershipView {
	societyId: string;
	societyName: string;
	currency: string;
	paidThrough: string | null;
	standing: DuesStanding;
	nextShow: { name: string; judgingDay: string; standing: DuesStanding } | null;
	periods: { id: string; label: string; amountCents: number; startsOn: string; endsOn: string }[];
}

/**
 * The member's standing in each society, with the dues periods they can still pay; each
 * society's "today" is read in its own time zone.
 */
export async function membershipOverview(
	userId: string,
	now: Date = new Date()
): Promise<MembershipView[]> {
	const memberships = await Membership.findAll({
		where: { userId },
		include: [{ model: Society, as: 'society' }]
	});
	const societyIds = memberships.map((m) => m.societyId);
	if (societyIds.length === 0) return [];
	const todayOf = new Map(
		memberships.map((m) => [m.societyId, todayIn((m.get('society') as Society).timeZone, now)])
	);
	// The earliest of the societies' days, so no society's rows are left out; each is then
	// compared with its own day below.
	const today = [...todayOf.values()].sort(compareIsoDates)[0];
	const [periods, shows] = await Promise.all([
		DuesPeriod.findAll({
			where: { societyId: societyIds, endsOn: { [Op.gte]: today } },
			order: [['endsOn', 'ASC']]
		}),
		Show.findAll({
			where: {
				societyId: societyIds,
				judgingDay: { [Op.gte]: today },
				schedulePublishedAt: { [Op.ne]: null }
			},
			order: [['judgingDay', 'ASC']]
		})
	]);
	return memberships
		.filter((m) => m.roles.includes('member'))
		.map((m) => {
			const society = m.get('society') as Society;
			const today = todayOf.get(m.societyId)!;
			const next =
				shows.find(
					(s) => s.societyId === m.societyId && compareIsoDates(s.judgingDay, today) >= 0
				) ?? null;
			return {
				societyId: m.societyId,
				societyName: society.name,
				currency: society.currency,
				paidThrough: m.duesPaidThrough,
				standing: duesStanding(m.duesPaidThrough, today),
				nextShow: next
					? {
							name: next.name,
							judgingDay: next.judgingDay,
							standing: duesStanding(m.duesPaidThrough, next.judgingDay)
						}
					: null,
				periods: periods
					.filter(
						(p) =>
							p.societyId === m.societyId &&
							compareIsoDates(p.endsOn, today) >= 0 &&
							periodAddsTime(m.duesPaidThrough, p.endsOn)
					)
					.map((p) => ({
						id: p.id,
						label: p.label,
						amountCents: p.amountCents,
						startsOn: p.startsOn,
						endsOn: p.endsOn
					}))
			};
		})
		.sort((a, b) => a.societyName.localeCompare(b.societyName));
}

/** One payment in a member's or an admin's list. */
export interface PaymentRow {
	id: string;
	purpose: PaymentPurpose;
	status: PaymentStatus;
	description: string;
	amountCents: number;
	refundedCents: number;
	currency: string;
	createdAt: string;
	paidAt: string | null;
	/** The calendar day it was paid (or started) in the society's time zone. */
	day: IsoDate;
	payerName?: string | null;
	payerEmail?: string;
}

/** A payment as the member and admin pages list it, dated in its society's time zone. */
export function toPaymentRow(p: Payment, timeZone: string): PaymentRow {
	return {
		id: p.id,
		purpose: p.purpose,
		status: p.status,
		description: p.description,
		amountCents: p.amountCents,
		refundedCents: p.refundedCents,
		currency: p.currency,
		createdAt: p.createdAt.toISOString(),
		paidAt: p.paidAt ? p.paidAt.toISOString() : null,
		day: todayIn(timeZone, p.paidAt ?? p.createdAt)
	};
}

/** The time zone of each of the given societies. */
export async function timeZonesOf(societyIds: string[]): Promise<Map<string, string>> {
	const unique = [...new Set(societyIds)];
	if (unique.length === 0) return new Map();
	const rows = await Society.findAll({ where: { id: unique }, attributes: ['id', 'timeZone'] });
	return new Map(rows.map((s) => [s.id, s.timeZone]));
}

function zoneOf(zones: Map<string, string>, societyId: string): string {
	return zones.get(societyId) ?? DEFAULT_SOCIETY_SETTINGS.timeZone;
}

/** A member's payments, newest first (abandoned checkouts older than a day are left out). */
export async function paymentsOfMember(userId: string): Promise<PaymentRow[]> {
	const dayAgo = new Date(Date.now() - 24 * 3600 * 1000);
	const rows = await Payment.findAll({
		where: {
			userId,
			[Op.or]: [
				{ status: { [Op.notIn]: ['pending', 'failed'] } },
				{ createdAt: { [Op.gte]: dayAgo } }
			]
		},
		order: [['createdAt', 'DESC']],
		limit: 100
	});
	const zones = await timeZonesOf(rows.map((p) => p.societyId));
	return rows.map((p) => toPaymentRow(p, zoneOf(zones, p.societyId)));
}

/** Entry fees a member owes or has paid, grouped by show. */
export interface EntryFeeShow {
	showId: string;
	showName: string;
	currency: string;
	feeCents: number;
	refundPolicy: string;
	entries: { id: string; number: number; plant: string; feeStatus: string; status: string }[];
	dueCents: number;
}

/** The member's entries in shows that charge a fee, with what is still due per show. */
export async function entryFeesOfMember(userId: string): Promise<EntryFeeShow[]> {
	const rows = await sequelize.query<{
		id: string;
		number: number;
		plant: string;
		fee_status: string;
		status: string;
		show_id: string;
		show_name: string;
		fee: number;
		refund: string;
		currency: string;
	}>(
		`SELECT e.id, e.number, COALESCE(v.name, e.title, '') AS plant, e.fee_status, e.status,
		        s.id AS show_id, s.name AS show_name, s.entry_fee_cents AS fee, s.entry_fee_refund AS refund,
		        so.currency
		   FROM entries e
		   JOIN shows s ON s.id = e.show_id
		   JOIN societies so ON so.id = s.society_id
		   LEFT JOIN varieties v ON v.id = e.variety_id
		  WHERE e.exhibitor_id = :userId AND e.fee_status <> 'not_required'
		  ORDER BY s.judging_day DESC, e.number`,
		{ replacements: { userId }, type: QueryTypes.SELECT }
	);
	const byShow = new Map<string, EntryFeeShow>();
	for (const r of rows) {
		let show = byShow.get(r.show_id);
		if (!show) {
			show = {
				showId: r.show_id,
				showName: r.show_name,
				currency: r.currency,
				feeCents: r.fee,
				refundPolicy: r.refund,
				entries: [],
				dueCents: 0
			};
			byShow.set(r.show_id, show);
		}
		show.entries.push({
			id: r.id,
			number: r.number,
			plant: r.plant,
			feeStatus: r.fee_status,
			status: r.status
		});
		if (r.fee_status === 'due' && r.status !== 'withdrawn' && r.status !== 'scratched') {
			show.dueCents += r.fee;
		}
	}
	return [...byShow.values()];
}

/** The status of one of the member's payments, for the page they return to after checkout. */
export async function paymentForSession(
	userId: string,
	sessionId: string
): Promise<PaymentRow | null> {
	const p = await Payment.findOne({ where: { userId, checkoutSessionId: sessionId } });
	if (!p) return null;
	return toPaymentRow(p, zoneOf(await timeZonesOf([p.societyId]), p.societyId));
}
