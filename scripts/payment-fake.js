/**
 * A local stand-in for the few endpoints of the hosted payment service (Stripe's API) that
 * Crownbench uses, so development and tests need no network. Same wire format as the real
 * service: form-encoded requests with a secret key, JSON answers, ids like cs_test_…, signed
 * webhooks. Everything lives in memory.
 *
 *   POST /v1/checkout/sessions          create a Checkout Session (mode=payment, price_data items)
 *   GET  /v1/checkout/sessions/:id      read one back
 *   POST /v1/refunds                    refund part or all of a paid session (Idempotency-Key honoured)
 *   GET  /checkout/:id                  the hosted checkout page: "Pay" or "Cancel"
 *   POST /checkout/:id/pay              marks it paid, posts checkout.session.completed, goes to success_url
 *   POST /checkout/:id/cancel           goes back to cancel_url
 *   GET  /_fake/events                  the events sent so far (newest first), for tests
 *   GET  /health
 *
 * Settings (environment): PAYMENT_FAKE_PORT (12111), PAYMENT_FAKE_PUBLIC_URL (where browsers reach
 * it, http://127.0.0.1:PORT), PAYMENT_FAKE_WEBHOOK_URL (the app's webhook address),
 * STRIPE_WEBHOOK_SECRET (signs the webhooks), STRIPE_SECRET_KEY (when set, the only key accepted;
 * otherwise any sk_test_ key).
 */
import { createHmac, randomBytes } from 'node:crypto';
import http from 'node:http';

const port = Number(process.env.PAYMENT_FAKE_PORT ?? 12111);
const host = '127.0.0.1';
const publicUrl = (process.env.PAYMENT_FAKE_PUBLIC_URL ?? `http://${host}:${port}`).replace(
	/\/$/,
	''
);
const webhookUrl =
	process.env.PAYMENT_FAKE_WEBHOOK_URL ?? 'http://127.0.0.1:5173/api/payments/webhook';
const webhookSecret = process.env.STRIPE_WEBHOOK_SECRET ?? 'whsec_crownbench_development_only';
const requiredKey = process.env.STRIPE_SECRET_KEY ?? null;
const API_VERSION = '2026-10-28.endive';

/** @type {Map<string, any>} */ const sessions = new Map();
/** @type {Map<string, any>} */ const charges = new Map(); // by payment intent id
/** @type {Map<string, { status: number, body: any }>} */ const idempotent = new Map();
/** @type {any[]} */ const events = [];

const newId = (prefix) => `${prefix}_test_${randomBytes(12).toString('hex')}`;
const nowSeconds = () => Math.floor(Date.now() / 1000);

/**
 * Reads Stripe's form encoding: `a[b][0][c]=1` becomes { a: { b: [ { c: '1' } ] } }.
 * @param {string} body
 */
function parseForm(body) {
	/** @type {any} */
	const root = {};
	for (const [rawKey, value] of new URLSearchParams(body)) {
		const parts = rawKey.split(/\[|\]\[|\]/).filter((p) => p !== '');
		let node = root;
		parts.forEach((part, i) => {
			const last = i === parts.length - 1;
			if (last) {
				node[part] = value;
				return;
			}
			const nextIsIndex = /^\d+$/.test(parts[i + 1]);
			node[part] ??= nextIsIndex ? [] : {};
			node = node[part];
		});
	}
	return root;
}

/** @param {http.IncomingMessage} req */
function readBody(req) {
	return new Promise((resolve, reject) => {
		let data = '';
		req.setEncoding('utf8');
		req.on('data', (chunk) => {
			data += chunk;
			if (data.length > 1_000_000) reject(new Error('body too large'));
		});
		req.on('end', () => resolve(data));
		req.on('error', reject);
	});
}

/**
 * @param {http.ServerResponse} res
 * @param {number} status
 * @param {unknown} body
 */
function json(res, status, body) {
	res.writeHead(status, { 'content-type': 'application/json', 'request-id': newId('req') });
	res.end(JSON.stringify(body));
}

function stripeError(res, status, message, type = 'invalid_request_error', param) {
	json(res, status, { error: { type, message, ...(param ? { param } : {}) } });
}

const escapeHtml = (s) =>
	String(s).replace(
		/[&<>"']/g,
		(c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[c]
	);

/** Signs and posts an event to the app, as the real service does (a few quick retries). */
async function sendEvent(type, object) {
	const event = {
		id: newId('evt'),
		object: 'event',
		api_version: API_VERSION,
		created: nowSeconds(),
		data: { object },
		livemode: false,
		pending_webhooks: 1,
		request: { id: null, idempotency_key: null },
		type
	};
	events.unshift(event);
	const payload = JSON.stringify(event);
	for (let attempt = 1; attempt <= 3; attempt++) {
		const t = nowSeconds();
		const v1 = createHmac('sha256', webhookSecret).update(`${t}.${payload}`).digest('hex');
		try {
			const answer = await fetch(webhookUrl, {
				method: 'POST',
				headers: {
					'content-type': 'application/json; charset=utf-8',
					'stripe-signature': `t=${t},v1=${v1}`,
					'user-agent': 'Stripe/1.0 (+https://stripe.com/docs/webhooks)'
				},
				body: payload
			});
			event.delivered = answer.status;
			if (answer.ok) return event;
		} catch (error) {
			event.delivered = `error: ${error instanceof Error ? error.message : error}`;
		}
		await new Promise((r) => setTimeout(r, 200 * attempt));
	}
	console.error(`payment fake: webhook ${type} not accepted (${event.delivered})`);
	return event;
}

function createSession(params) {
	if (params.mode !== 'payment') throw new Error('Only mode=payment is supported by the fake.');
	if (!params.success_url || !params.cancel_url)
		throw new Error('success_url and cancel_url are required.');
	const items = Array.isArray(params.line_items) ? params.line_items : [];
	if (items.length === 0) throw new Error('line_items is required.');
	let total = 0;
	let currency = null;
	const lines = items.map((item) => {
		const price = item.price_data ?? {};
		const unit = Number(price.unit_amount);
		const quantity = Number(item.quantity ?? 1);
		if (!Number.isInteger(unit) || unit < 0 || !Number.isInteger(quantity) || quantity < 1) {
			throw new Error('Each line item needs an integer unit_amount and quantity.');
		}
		if (currency && price.currency !== currency) throw new Error('Mixed currencies.');
		currency = String(price.currency ?? '').toLowerCase();
		total += unit * quantity;
		return { name: price.product_data?.name ?? 'Item', unit, quantity };
	});
	const id = newId('cs');
	const session = {
		id,
		object: 'checkout.session',
		amount_subtotal: total,
		amount_total: total,
		cancel_url: params.cancel_url,
		client_reference_id: params.client_reference_id ?? null,
		created: nowSeconds(),
		currency,
		customer_email: params.customer_email ?? null,
		expires_at: nowSeconds() + 24 * 3600,
		livemode: false,
		metadata: params.metadata ?? {},
		mode: 'payment',
		payment_intent: null,
		payment_status: 'unpaid',
		status: 'open',
		success_url: params.success_url,
		url: `${publicUrl}/checkout/${id}`
	};
	sessions.set(id, { session, lines });
	return session;
}

function createRefund(params) {
	const intent = params.payment_intent;
	const charge = intent ? charges.get(intent) : null;
	if (!charge)
		throw Object.assign(new Error(`No such payment_intent: '${intent}'`), { status: 404 });
	const left = charge.amount - charge.amount_refunded;
	const amount = params.amount === undefined ? left : Number(params.amount);
	if (!Number.isInteger(amount) || amount <= 0 || amount > left) {
		throw new Error(`Refund amount must be between 1 and ${left}.`);
	}
	const refund = {
		id: newId('re'),
		object: 'refund',
		amount,
		charge: charge.id,
		created: nowSeconds(),
		currency: charge.currency,
		metadata: params.metadata ?? {},
		payment_intent: intent,
		reason: params.reason ?? null,
		status: 'succeeded'
	};
	charge.amount_refunded += amount;
	charge.refunded = charge.amount_refunded === charge.amount;
	charge.refunds.data.unshift(refund);
	charge.refunds.total_count += 1;
	// The real service tells the app by webhook, a moment after answering.
	setTimeout(() => void sendEvent('charge.refunded', structuredClone(charge)), 50);
	return refund;
}

function checkoutPage(entry) {
	const { session, lines } = entry;
	const money = (cents) => `${(cents / 100).toFixed(2)} ${String(session.currency).toUpperCase()}`;
	const rows = lines
		.map(
			(l) =>
				`<tr><td>${escapeHtml(l.name)}</td><td>${l.quantity}</td><td>${money(l.unit * l.quantity)}</td></tr>`
		)
		.join('');
	const done = session.status !== 'open';
	return `<!doctype html><html lang="en"><head><meta charset="utf-8">
<meta name="viewport" content="width=device-width, initial-scale=1">
<title>Test checkout</title>
<style>body{font-family:sans-serif;max-width:32rem;margin:2rem auto;padding:0 1rem;color:#1b1b1b}
table{width:100%;border-collapse:collapse}td,th{padding:.4rem;border-bottom:1px solid #ccc;text-align:left}
button{min-height:44px;padding:0 1.2rem;font-size:1rem;border-radius:8px;margin-right:.5rem}
.pay{background:#1d4ed8;color:#fff;border:0}.note{background:#fff7d6;padding:.6rem;border-radius:6px}</style>
</head><body><main>
<h1>Test checkout</h1>
<p class="note">This is the local payment fake: no card is needed and no money moves.</p>
<table><caption>What you are paying for</caption><thead><tr><th scope="col">Item</th><th scope="col">Quantity</th><th scope="col">Amount</th></tr></thead>
<tbody>${rows}</tbody></table>
<p><strong>Total: ${money(session.amount_total)}</strong></p>
${
	done
		? `<p>This checkout is ${escapeHtml(session.status)}.</p>`
		: `<form method="post" action="/checkout/${session.id}/pay" style="display:inline"><button class="pay" type="submit">Pay ${money(session.amount_total)}</button></form>
<form method="post" action="/checkout/${session.id}/cancel" style="display:inline"><button type="submit">Cancel</button></form>`
}
</main></body></html>`;
}

async function completeSession(entry) {
	const { session } = entry;
	if (session.status === 'open') {
		session.status = 'complete';
		session.payment_status = 'paid';
		session.payment_intent = newId('pi');
		session.url = null;
		charges.set(session.payment_intent, {
			id: newId('ch'),
			object: 'charge',
			amount: session.amount_total,
			amount_refunded: 0,
			currency: session.currency,
			metadata: session.metadata,
			paid: true,
			payment_intent: session.payment_intent,
			refunded: false,
			refunds: { object: 'list', data: [], has_more: false, total_count: 0 },
			status: 'succeeded'
		});
		await sendEvent('checkout.session.completed', structuredClone(session));
	}
	return session;
}

function authorised(req) {
	const header = req.headers.authorization ?? '';
	const key = header.startsWith('Bearer ') ? header.slice(7) : '';
	return requiredKey ? key === requiredKey : key.startsWith('sk_test_');
}

const server = http.createServer(async (req, res) => {
	const url = new URL(req.url ?? '/', `http://${host}`);
	const path = url.pathname;
	try {
		if (path === '/health') return json(res, 200, { ok: true, sessions: sessions.size });
		if (path === '/_fake/events' && req.method === 'GET') return json(res, 200, events);

		let match = path.match(/^\/checkout\/(cs_test_\w+)(?:\/(pay|cancel))?$/);
		if (match) {
			const entry = sessions.get(match[1]);
			if (!entry) {
				res.writeHead(404, { 'content-type': 'text/plain' });
				return res.end('No such checkout.');
			}
			if (!match[2] && req.method === 'GET') {
				res.writeHead(200, { 'content-type': 'text/html; charset=utf-8' });
				return res.end(checkoutPage(entry));
			}
			if (req.method === 'POST' && match[2] === 'pay') {
				const session = await completeSession(entry);
				const to = session.success_url.replace('{CHECKOUT_SESSION_ID}', session.id);
				res.writeHead(303, { location: to });
				return res.end();
			}
			if (req.method === 'POST' && match[2] === 'cancel') {
				res.writeHead(303, { location: entry.session.cancel_url });
				return res.end();
			}
		}

		if (path.startsWith('/v1/')) {
			if (!authorised(req)) {
				return stripeError(res, 401, 'Invalid API Key provided.', 'invalid_request_error');
			}
			const key = req.headers['idempotency-key'];
			const cacheKey = typeof key === 'string' ? `${req.method} ${path} ${key}` : null;
			if (cacheKey && idempotent.has(cacheKey)) {
				const cached = idempotent.get(cacheKey);
				return json(res, cached.status, cached.body);
			}
			const remember = (status, body) => {
				if (cacheKey) idempotent.set(cacheKey, { status, body });
				json(res, status, body);
			};
			const params = req.method === 'POST' ? parseForm(await readBody(req)) : {};

			if (path === '/v1/checkout/sessions' && req.method === 'POST') {
				try {
					return remember(200, createSession(params));
				} catch (error) {
					return stripeError(res, 400, error.message);
				}
			}
			match = path.match(/^\/v1\/checkout\/sessions\/(cs_test_\w+)$/);
			if (match && req.method === 'GET') {
				const entry = sessions.get(match[1]);
				if (!entry) return stripeError(res, 404, `No such checkout.session: '${match[1]}'`);
				return json(res, 200, entry.session);
			}
			if (path === '/v1/refunds' && req.method === 'POST') {
				try {
					return remember(200, createRefund(params));
				} catch (error) {
					return stripeError(res, error.status ?? 400, error.message);
				}
			}
			return stripeError(res, 404, `Unrecognized request URL (${req.method}: ${path}).`);
		}
		res.writeHead(404, { 'content-type': 'text/plain' });
		res.end('Not found');
	} catch (error) {
		console.error('payment fake:', error);
		stripeError(res, 500, 'The payment fake failed.', 'api_error');
	}
});

server.listen(port, host, () => {
	console.log(`payment fake: API and checkout on ${publicUrl}, webhooks to ${webhookUrl}`);
});

const stop = () => {
	server.close(() => process.exit(0));
	setTimeout(() => process.exit(0), 1000).unref();
};
process.on('SIGTERM', stop);
process.on('SIGINT', stop);
