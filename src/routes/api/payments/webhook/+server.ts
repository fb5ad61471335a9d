import { json } from '@sveltejs/kit';
import { receiveWebhook } from '$lib/server/payments/payment-events';
import type { RequestHandler } from './$types';

/**
 * Webhooks from the payment service. Public, but only events whose Stripe-Signature verifies
 * against STRIPE_WEBHOOK_SECRET change anything; the raw body is verified as received.
 */
export const POST: RequestHandler = async ({ request }) => {
	const raw = await request.text();
	const answer = await receiveWebhook(raw, request.headers.get('stripe-signature'));
	return json(answer.body, { status: answer.status });
};
