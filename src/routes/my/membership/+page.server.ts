import { fail, redirect } from '@sveltejs/kit';
import { z } from 'zod';
import { payDuesSchema } from '$lib/schemas/payments';
import { requireRole } from '$lib/server/policies';
import {
	PaymentStartError,
	membershipOverview,
	paymentForSession,
	paymentsOfMember,
	startDuesCheckout
} from '$lib/server/payments/payments';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	const user = requireRole(event, ['member']);
	const sessionId = event.url.searchParams.get('paid');
	const [societies, payments, returned] = await Promise.all([
		membershipOverview(user.id),
		paymentsOfMember(user.id),
		sessionId && /^cs_\w{1,250}$/.test(sessionId) ? paymentForSession(user.id, sessionId) : null
	]);
	return {
		societies,
		payments: payments.filter((p) => p.purpose === 'dues'),
		returned,
		cancelled: event.url.searchParams.has('cancelled')
	};
};

export const actions: Actions = {
	pay: async (event) => {
		const form = await event.request.formData();
		const parsed = payDuesSchema.safeParse({
			societyId: form.get('societyId'),
			periodId: form.get('periodId')
		});
		if (!parsed.success) {
			const errors = z.flattenError(parsed.error).fieldErrors;
			return fail(400, { message: errors.periodId?.[0] ?? 'Choose a dues period.' });
		}
		const user = requireRole(event, ['member'], parsed.data.societyId);
		let url: string;
		try {
			({ url } = await startDuesCheckout(user, parsed.data, { origin: event.url.origin }));
		} catch (err) {
			if (err instanceof PaymentStartError) return fail(400, { message: err.message });
			throw err;
		}
		redirect(303, url);
	}
};
