import { fail, type RequestEvent } from '@sveltejs/kit';
import { z } from 'zod';
import { CURRENCIES } from '$lib/domain/money';
import { ENTRY_FEE_REFUND_LABELS, ENTRY_FEE_REFUNDS } from '$lib/domain/dues';
import { currencySchema, duesPeriodSchema, showFeeSchema } from '$lib/schemas/payments';
import { sequelize } from '$lib/server/db';
import { requireConfirmation } from '$lib/server/http/confirm';
import { requireRole } from '$lib/server/policies';
import * as dues from '$lib/server/payments/dues';
import { chooseSociety } from '$lib/server/people/society-choice';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	const user = requireRole(event, ['admin']);
	const society = chooseSociety(user, ['admin'], event.url.searchParams.get('society'));
	const [currency, periods, shows, payments] = await Promise.all([
		dues.societyCurrency(society.societyId),
		dues.listDuesPeriods(society.societyId),
		dues.listShowFees(society.societyId),
		dues.recentPayments(society.societyId)
	]);
	return {
		society,
		currency,
		currencies: CURRENCIES.map((c) => ({ value: c, label: c })),
		refundOptions: ENTRY_FEE_REFUNDS.map((r) => ({ value: r, label: ENTRY_FEE_REFUND_LABELS[r] })),
		periods,
		shows,
		payments
	};
};

/** Reads a form with a schema; the admin role is checked for the society the form names. */
async function read<T extends { societyId: string }>(
	event: RequestEvent,
	schema: z.ZodType<T>,
	fields: string[]
): Promise<
	| { ok: true; data: T; form: FormData }
	| { ok: false; errors: Record<string, string[] | undefined>; raw: Record<string, unknown> }
> {
	const form = await event.request.formData();
	const raw = Object.fromEntries(fields.map((f) => [f, form.get(f) ?? undefined]));
	const parsed = schema.safeParse(raw);
	if (!parsed.success) {
		return {
			ok: false,
			errors: z.flattenError(parsed.error).fieldErrors as Record<string, string[]>,
			raw
		};
	}
	requireRole(event, ['admin'], parsed.data.societyId);
	return { ok: true, data: parsed.data, form };
}

export const actions: Actions = {
	addPeriod: async (event) => {
		const r = await read(event, duesPeriodSchema, [
			'societyId',
			'label',
			'amountCents',
			'startsOn',
			'endsOn'
		]);
		if (!r.ok) return fail(400, { period: { errors: r.errors, saved: null } });
		await sequelize.transaction((transaction) => dues.addDuesPeriod(r.data, { transaction }));
		return { period: { errors: null, saved: `Added “${r.data.label}”.` } };
	},

	removePeriod: async (event) => {
		const r = await read(event, z.object({ societyId: z.uuid(), periodId: z.uuid() }), [
			'societyId',
			'periodId'
		]);
		if (!r.ok) return fail(400, { remove: { message: 'Choose a period from the list.' } });
		const unconfirmed = requireConfirmation(event, r.form, 'Remove this dues period?');
		if (unconfirmed) return unconfirmed;
		const actor = requireRole(event, ['admin'], r.data.societyId);
		const removed = await sequelize.transaction((transaction) =>
			dues.removeDuesPeriod(r.data, { transaction, actor })
		);
		if (!removed) {
			return fail(400, {
				remove: { message: 'That period has payments, so it stays (receipts refer to it).' }
			});
		}
		return { remove: { message: null } };
	},

	setCurrency: async (event) => {
		const r = await read(event, currencySchema, ['societyId', 'currency']);
		if (!r.ok) return fail(400, { currency: { message: 'Choose one of the listed currencies.' } });
		await sequelize.transaction((transaction) => dues.setSocietyCurrency(r.data, { transaction }));
		return { currency: { message: null } };
	},

	setFee: async (event) => {
		const r = await read(event, showFeeSchema, [
			'societyId',
			'showId',
			'entryFeeCents',
			'entryFeeRefund'
		]);
		if (!r.ok) {
			return fail(400, { fee: { errors: r.errors, showId: String(r.raw.showId), saved: null } });
		}
		const saved = await sequelize.transaction((transaction) =>
			dues.setShowFee(r.data, { transaction })
		);
		if (saved !== true) {
			const errors: Record<string, string[] | undefined> = {
				entryFeeCents: [saved || 'That show is not this society’s.']
			};
			return fail(400, { fee: { errors, showId: r.data.showId, saved: null } });
		}
		const errors: Record<string, string[] | undefined> | null = null;
		return { fee: { errors, showId: r.data.showId, saved: 'Entry fee saved.' } };
	}
};
