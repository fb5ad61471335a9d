import { z } from 'zod';
import { text } from './text';
import { isIsoDate } from '$lib/domain/dates';
import { ENTRY_FEE_REFUNDS } from '$lib/domain/dues';
import { CURRENCIES, parseAmountToCents } from '$lib/domain/money';

const isoDate = (message: string) =>
	text(message)
		.trim()
		.refine((v) => isIsoDate(v), message);

/** An amount typed as "25" or "25.00", read into whole cents. */
const amount = (options: { allowZero: boolean }) =>
	text('Enter an amount, like 25.00.')
		.transform((v, ctx) => {
			const cents = parseAmountToCents(v);
			if (cents === null) {
				ctx.addIssue({ code: 'custom', message: 'Enter an amount, like 25.00.' });
				return z.NEVER;
			}
			return cents;
		})
		.refine((c) => options.allowZero || c > 0, 'The amount must be more than zero.')
		.refine((c) => c <= 100_000_00, 'Keep the amount under 100,000.');

/** Form: a new dues period of a society. */
export const duesPeriodSchema = z
	.object({
		societyId: z.uuid('Choose a society.'),
		label: text('Name the period, like "Membership year 2027".')
			.trim()
			.min(2, 'Name the period, like "Membership year 2027".')
			.max(120, 'Keep the name under 120 characters.'),
		amountCents: amount({ allowZero: false }),
		startsOn: isoDate('Enter the first day of the period.'),
		endsOn: isoDate('Enter the last day of the period.')
	})
	.refine((v) => v.startsOn <= v.endsOn, {
		message: 'The last day must be on or after the first day.',
		path: ['endsOn']
	});

/** Form: the currency a society keeps its dues and fees in. */
export const currencySchema = z.object({
	societyId: z.uuid('Choose a society.'),
	currency: z.enum(CURRENCIES, 'Choose one of the listed currencies.')
});

/** Form: a show's entry fee and its refund policy. */
export const showFeeSchema = z.object({
	societyId: z.uuid('Choose a society.'),
	showId: z.uuid('Choose a show.'),
	entryFeeCents: amount({ allowZero: true }),
	entryFeeRefund: z.enum(ENTRY_FEE_REFUNDS, 'Choose one of the refund rules.')
});

/** Form: pay one dues period. */
export const payDuesSchema = z.object({
	societyId: z.uuid('Choose a society.'),
	periodId: z.uuid('Choose a dues period.')
});

/** Form: pay the entry fees owed for one show. */
export const payFeesSchema = z.object({ showId: z.uuid('Choose a show.') });
