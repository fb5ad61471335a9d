import { fail, redirect } from '@sveltejs/kit';
import { ENTRY_FEE_REFUND_LABELS, type EntryFeeRefund } from '$lib/domain/dues';
import { payFeesSchema } from '$lib/schemas/payments';
import { requireRole } from '$lib/server/policies';
import {
	PaymentStartError,
	entryFeesOfMember,
	paymentForSession,
	paymentsOfMember,
	startEntryFeeCheckout
} from '$lib/server/payments/payments';
import { societyOfShow } from '$lib/server/shows/shows';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	const user = requireRole(event, ['member']);
	const sessionId = event.url.searchParams.get('paid');
	const [shows, payments, returned] = await Promise.all([
		entryFeesOfMember(user.id),
		paymentsOfMember(user.id),
		sessionId && /^cs_\w{1,250}$/.test(sessionId) ? paymentForSession(user.id, sessionId) : null
	]);
	return {
		shows: shows.map((s) => ({
			...s,
			refundRule: ENTRY_FEE_REFUND_LABELS[s.refundPolicy as EntryFeeRefund] ?? ''
		})),
		payments: payments.filter((p) => p.purpose === 'entry_fees'),
		returned,
		cancelled: event.url.searchParams.has('cancelled')
	};
};

export const actions: Actions = {
	pay: async (event) => {
		const form = await event.request.formData();
		const parsed = payFeesSchema.safeParse({ showId: form.get('showId') });
		if (!parsed.success) return fail(400, { message: 'Choose a show from the list.' });
		const societyId = await societyOfShow(parsed.data.showId);
		if (!societyId) return fail(400, { message: 'Choose a show from the list.' });
		const user = requireRole(event, ['member'], societyId);
		let url: string;
		try {
			({ url } = await startEntryFeeCheckout(user, parsed.data, { origin: event.url.origin }));
		} catch (err) {
			if (err instanceof PaymentStartError) return fail(400, { message: err.message });
			throw err;
		}
		redirect(303, url);
	}
};
