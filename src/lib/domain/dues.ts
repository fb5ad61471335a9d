import { compareIsoDates, type IsoDate } from './dates';

/**
 * Membership standing on a day: 'current' when dues are paid through that day or later,
 * 'lapsed' when they ran out before it, 'none' when the person never paid dues (a visiting
 * judge, say).
 */
export type DuesStanding = 'current' | 'lapsed' | 'none';

/** The standing of a member whose dues are paid through `paidThrough`, on the day `on`. */
export function duesStanding(paidThrough: IsoDate | null, on: IsoDate): DuesStanding {
	if (!paidThrough) return 'none';
	return compareIsoDates(paidThrough, on) >= 0 ? 'current' : 'lapsed';
}

/**
 * The paid-through date after paying a dues period that ends on `periodEnd`: the later of the
 * two, so paying an older period (or the same one twice, or out of order) never shortens it.
 */
export function extendPaidThrough(paidThrough: IsoDate | null, periodEnd: IsoDate): IsoDate {
	if (!paidThrough) return periodEnd;
	return compareIsoDates(periodEnd, paidThrough) > 0 ? periodEnd : paidThrough;
}

/**
 * Whether paying a dues period would move the paid-through date on: a period that ends on or
 * before the date already paid through adds nothing and is not offered.
 */
export function periodAddsTime(paidThrough: IsoDate | null, periodEnd: IsoDate): boolean {
	return !paidThrough || compareIsoDates(periodEnd, paidThrough) > 0;
}

/** When a show gives back the entry fee of a withdrawn entry. */
export type EntryFeeRefund = 'none' | 'until_entries_close' | 'until_entry_day';

export const ENTRY_FEE_REFUNDS: readonly EntryFeeRefund[] = [
	'none',
	'until_entries_close',
	'until_entry_day'
];

/** Plain words for each refund policy, for the admin's form and the member's pages. */
export const ENTRY_FEE_REFUND_LABELS: Record<EntryFeeRefund, string> = {
	none: 'No refunds for withdrawn entries',
	until_entries_close: 'Refund entries withdrawn on or before the day entries close',
	until_entry_day: 'Refund entries withdrawn before entry day'
};

/**
 * Whether the fee of an entry withdrawn on `withdrawnOn` is given back under the show's policy.
 * 'until_entries_close' includes the closing day; 'until_entry_day' stops the day before entry day.
 */
export function refundAllowed(
	policy: EntryFeeRefund,
	show: { entriesClose: IsoDate; entryDay: IsoDate },
	withdrawnOn: IsoDate
): boolean {
	if (policy === 'until_entries_close') return compareIsoDates(withdrawnOn, show.entriesClose) <= 0;
	if (policy === 'until_entry_day') return compareIsoDates(withdrawnOn, show.entryDay) < 0;
	return false;
}

/** The fee status a new entry starts with: 'due' where the show charges a fee. */
export function initialFeeStatus(entryFeeCents: number): 'due' | 'not_required' {
	return entryFeeCents > 0 ? 'due' : 'not_required';
}
