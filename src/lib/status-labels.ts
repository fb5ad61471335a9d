/** Plain words for a payment's status, for members and admins alike. */
export const PAYMENT_STATUS_LABELS: Record<string, string> = {
	pending: 'Waiting for the payment service',
	paid: 'Paid',
	expired: 'Not completed',
	failed: 'Not completed',
	refunded: 'Refunded',
	partly_refunded: 'Partly refunded'
};

/** The status of a payment in plain words; an unknown status is shown as it is. */
export function paymentStatusLabel(status: string): string {
	return PAYMENT_STATUS_LABELS[status] ?? status;
}

/** Plain words for where an entry stands. */
export const ENTRY_STATUS_LABELS: Record<string, string> = {
	entered: 'Entered',
	checked_in: 'Checked in',
	scratched: 'Scratched',
	withdrawn: 'Withdrawn'
};

/** The status of an entry in plain words; an unknown status is shown as it is. */
export function entryStatusLabel(status: string): string {
	return ENTRY_STATUS_LABELS[status] ?? status;
}
