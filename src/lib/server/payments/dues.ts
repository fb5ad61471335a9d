import type { Transaction } from 'sequelize';
import type { EntryFeeRefund } from '../../domain/dues';
import { recordAudit, type AuditActor } from '../audit';
import { DuesPeriod, Payment, Show, Society, User } from '../db';
import { timeZonesOf, toPaymentRow, type PaymentRow } from './payments';
import { verdictFor } from '../shows/show-stage';

/** A dues period as the admin sees it. */
export interface DuesPeriodRow {
	id: string;
	label: string;
	amountCents: number;
	startsOn: string;
	endsOn: string;
	paymentCount: number;
}

/** The society's dues periods, latest first, with how many payments each has. */
export async function listDuesPeriods(societyId: string): Promise<DuesPeriodRow[]> {
	const periods = await DuesPeriod.findAll({
		where: { societyId },
		order: [['endsOn', 'DESC']]
	});
	const paid = (await Payment.count({
		where: { duesPeriodId: periods.map((p) => p.id), status: ['paid', 'partly_refunded'] },
		group: ['duesPeriodId']
	})) as unknown as { duesPeriodId: string; count: number }[];
	const counts = new Map(paid.map((c) => [c.duesPeriodId, Number(c.count)]));
	return periods.map((p) => ({
		id: p.id,
		label: p.label,
		amountCents: p.amountCents,
		startsOn: p.startsOn,
		endsOn: p.endsOn,
		paymentCount: counts.get(p.id) ?? 0
	}));
}

/** Adds a dues period: paying it makes a member's dues paid through its last day. */
export async function addDuesPeriod(
	input: {
		societyId: string;
		label: string;
		amountCents: number;
		startsOn: string;
		endsOn: string;
	},
	options: { transaction: Transaction }
): Promise<DuesPeriod> {
	return DuesPeriod.create(input, { transaction: options.transaction });
}

/**
 * Removes a dues period that nobody has started paying; returns false (and keeps it) when a
 * payment refers to it, since receipts and standing rest on it. A removal is audited.
 */
export async function removeDuesPeriod(
	input: { societyId: string; periodId: string },
	options: { transaction: Transaction; actor: AuditActor }
): Promise<boolean> {
	const { transaction } = options;
	const period = await DuesPeriod.findOne({
		where: { id: input.periodId, societyId: input.societyId },
		transaction
	});
	if (!period) return false;
	const used = await Payment.count({ where: { duesPeriodId: period.id }, transaction });
	if (used > 0) return false;
	await period.destroy({ transaction });
	await recordAudit(
		{
			societyId: input.societyId,
			actor: options.actor,
			action: 'dues_period.remove',
			target: { kind: 'dues_period', id: period.id, label: period.label },
			details: {
				before: {
					label: period.label,
					amountCents: period.amountCents,
					startsOn: period.startsOn,
					endsOn: period.endsOn
				}
			}
		},
		{ transaction }
	);
	return true;
}

/** Sets the currency of a society's dues and fees (payments already made keep theirs). */
export async function setSocietyCurrency(
	input: { societyId: string; currency: string },
	options: { transaction: Transaction }
): Promise<void> {
	await Society.update(
		{ currency: input.currency },
		{ where: { id: input.societyId }, transaction: options.transaction }
	);
}

/** A show with its entry fee, for the admin's fee settings. */
export interface ShowFeeRow {
	id: string;
	name: string;
	judgingDay: string;
	entryFeeCents: number;
	entryFeeRefund: EntryFeeRefund;
}

/** The society's shows with their entry fees, newest first. */
export async function listShowFees(societyId: string): Promise<ShowFeeRow[]> {
	const shows = await Show.findAll({ where: { societyId }, order: [['judgingDay', 'DESC']] });
	return shows.map((s) => ({
		id: s.id,
		name: s.name,
		judgingDay: s.judgingDay,
		entryFeeCents: s.entryFeeCents,
		entryFeeRefund: s.entryFeeRefund
	}));
}

/**
 * Sets a show's entry fee and refund rule. Entries already made keep their fee status; new
 * entries owe the new fee. Returns false when the show is not the society's, and the stage's
 * reason when the show can no longer change (results published).
 */
export async function setShowFee(
	input: {
		societyId: string;
		showId: string;
		entryFeeCents: number;
		entryFeeRefund: EntryFeeRefund;
	},
	options: { transaction: Transaction }
): Promise<boolean | string> {
	const show = await Show.findOne({
		where: { id: input.showId, societyId: input.societyId },
		transaction: options.transaction
	});
	if (!show) return false;
	const verdict = await verdictFor(show, 'fees', options);
	if (!verdict.allowed) return verdict.reason;
	const [count] = await Show.update(
		{ entryFeeCents: input.entryFeeCents, entryFeeRefund: input.entryFeeRefund },
		{ where: { id: input.showId, societyId: input.societyId }, transaction: options.transaction }
	);
	return count === 1;
}

/** The society's latest payments (any member), for the admin. */
export async function recentPayments(societyId: string, limit = 30): Promise<PaymentRow[]> {
	const rows = await Payment.findAll({
		where: { societyId, status: ['paid', 'refunded', 'partly_refunded'] },
		include: [{ model: User, as: 'user', attributes: ['name', 'email'] }],
		order: [['paidAt', 'DESC']],
		limit
	});
	const zone = (await timeZonesOf([societyId])).get(societyId) ?? 'UTC';
	return rows.map((p) => {
		const user = p.get('user') as User;
		return { ...toPaymentRow(p, zone), payerName: user.name, payerEmail: user.email };
	});
}

/** The currency the society's dues and fees are in (US dollars until the admin sets one). */
export async function societyCurrency(societyId: string): Promise<string> {
	const society = await Society.findByPk(societyId, { attributes: ['currency'] });
	return society?.currency ?? 'USD';
}
