import Stripe from 'stripe';
import { config } from '$lib/server/config';

/** The local payment fake (scripts/payment-fake.js) that development uses when nothing is set. */
const DEV_SECRET_KEY = 'sk_test_crownbench_development_only';
const DEV_WEBHOOK_SECRET = 'whsec_crownbench_development_only';

let client: Stripe | null = null;

/**
 * The payment service client. STRIPE_SECRET_KEY selects the account; STRIPE_API_HOST, _PORT and
 * _PROTOCOL point the SDK elsewhere (the local fake). Without a key, outside production, it talks
 * to the local fake on 127.0.0.1:12111.
 */
export function stripe(): Stripe {
	if (client) return client;
	const settings = config();
	const key = settings.stripeSecretKey;
	if (!key && settings.production && !settings.stripeApiHost) {
		throw new Error('Payments are not set up: set STRIPE_SECRET_KEY.');
	}
	const fakeDefaults = !key;
	const host = settings.stripeApiHost || (fakeDefaults ? '127.0.0.1' : undefined);
	const port = settings.stripeApiPort || (fakeDefaults ? 12111 : undefined);
	const protocol = settings.stripeApiProtocol || (fakeDefaults ? 'http' : undefined);
	client = new Stripe(key || DEV_SECRET_KEY, {
		...(host ? { host } : {}),
		...(port ? { port } : {}),
		...(protocol ? { protocol } : {}),
		maxNetworkRetries: 2,
		timeout: 15_000,
		appInfo: { name: 'Crownbench' }
	});
	return client;
}

/** The secret that signs webhooks; null when payments are not set up in production. */
export function webhookSecret(): string | null {
	const settings = config();
	if (settings.stripeWebhookSecret) return settings.stripeWebhookSecret;
	return settings.production ? null : DEV_WEBHOOK_SECRET;
}

/** Verifies a webhook's signature and returns the event; throws when it does not verify. */
export function verifyWebhook(rawBody: string, signature: string, secret: string): Stripe.Event {
	return stripe().webhooks.constructEvent(rawBody, signature, secret);
}
