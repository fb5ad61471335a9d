import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { Op, QueryTypes } from 'sequelize';
import type { RequestEvent } from '@sveltejs/kit';
import {
	DuesPeriod,
	Entry,
	Membership,
	Payment,
	Refund,
	Show,
	ShowClass,
	Society,
	User,
	sequelize
} from '$lib/server/db';
import { stripe, webhookSecret } from '$lib/server/payments/stripe';
import { startDuesCheckout, startEntryFeeCheckout } from '$lib/server/payments/payments';
import { withdrawEntry } from '$lib/server/entries/entries';
import { feeStatusForNewEntry } from '$lib/server/entries/entry-fees';
import { sendRefund, settleFeeOfWithdrawnEntry } from '$lib/server/payments/refunds';
import { workDueJobs } from '$lib/server/jobs/worker';
import { jobsFor } from './jobs';
import { POST } from '../../src/routes/api/payments/webhook/+server';

// The payment fake started by scripts/test.sh (STRIPE_API_PORT); it signs with STRIPE_WEBHOOK_SECRET.
const fakeBase = `http://127.0.0.1:${process.env.STRIPE_API_PORT ?? '12111'}`;
const origin = 'http://127.0.0.1:4999';

interface FakeEvent {
	id: string;
	type: string;
	data: { object: Record<string, unknown> };
}

/** Posts a body to the webhook route, signed with `secret` (or unsigned when null). */
async function deliver(
	body: string,
	secret: string | null = webhookSecret()
): Promise<{ status: number; outcome: string }> {
	const headers = new Headers({ 'content-type': 'application/json' });
	if (secret) {
		headers.set(
			'stripe-signature',
			stripe().webhooks.generateTestHeaderString({ payload: body, secret })
		);
	}
	const request = new Request(`${origin}/api/payments/webhook`, { method: 'POST', headers, body });
	const response = await POST({ request } as unknown as RequestEvent<
		Record<string, never>,
		'/api/payments/webhook'
	>);
	const json = (await response.json()) as { outcome: string };
	return { status: response.status, outcome: json.outcome };
}

let eventCounter = 0;
/** An event in the payment service's shape, with a fresh id. */
function event(type: string, object: Record<string, unknown>, id?: string): string {
	return JSON.stringify({
		id: id ?? `evt_test_integration_${Date.now()}_${eventCounter++}`,
		object: 'event',
		api_version: '2026-10-28.endive',
		created: Math.floor(Date.now() / 1000),
		data: { object },
		livemode: false,
		pending_webhooks: 1,
		request: { id: null, idempotency_key: null },
		type
	});
}

/** Pays a checkout on the fake as a person would (the "Pay" button) and returns its completed event. */
async function payOnFake(checkoutUrl: string): Promise<FakeEvent> {
	const pay = await fetch(`${checkoutUrl}/pay`, { method: 'POST', redirect: 'manual' });
	expect(pay.status).toBe(303);
	const sessionId = checkoutUrl.split('/').pop();
	const events = (await (await fetch(`${fakeBase}/_fake/events`)).json()) as FakeEvent[];
	const completed = events.find(
		(e) => e.type === 'checkout.session.completed' && e.data.object.id === sessionId
	);
	if (!completed) throw new Error('the fake sent no completed event');
	return completed;
}

/** The fake's charge.refunded events for a payment intent, newest first. */
async function refundEventsFor(paymentIntent: string): Promise<FakeEvent[]> {
	for (let i = 0; i < 40; i++) {
		const events = (await (await fetch(`${fakeBase}/_fake/events`)).json()) as FakeEvent[];
		const found = events.filter(
			(e) => e.type === 'charge.refunded' && e.data.object.payment_intent === paymentIntent
		);
		if (found.length) return found;
		await new Promise((r) => setTimeout(r, 100));
	}
	throw new Error('the fake sent no refund event');
}

async function mailCount(kind: string, to: string): Promise<number> {
	const [row] = await sequelize.query<{ n: string }>(
		'SELECT count(*) AS n FROM outbox_messages WHERE kind = $1 AND to_address = $2',
		{ bind: [kind, to], type: QueryTypes.SELECT }
	);
	return Number(row.n);
}

async function eventRecorded(id: string): Promise<boolean> {
	const rows = await sequelize.query('SELECT 1 FROM payment_events WHERE event_id = $1', {
		bind: [id],
		type: QueryTypes.SELECT
	});
	return rows.length === 1;
}

let society: Society;
let lapsed: User;
let period: DuesPeriod;

/** A fresh member of the demo society whose dues ran out (so tests do not disturb each other). */
// The demo society's spring show by its short name: other test files add shows to the society.
function springShow(): Promise<Show | null> {
	return Show.findOne({
		where: { societyId: society.id, slug: { [Op.like]: 'larkspur-spring-%' } }
	});
}

async function newLapsedMember(tag: string): Promise<User> {
	const user = await User.create({
		email: `${tag}-${Date.now()}@crownbench.test`,
		name: `Test ${tag}`,
		emailVerified: null,
		image: null
	});
	await Membership.create({
		societyId: society.id,
		userId: user.id,
		roles: ['member'],
		household: null,
		duesPaidThrough: '2020-12-31'
	});
	created.push(user.id);
	return user;
}

/** A new lapsed member who has started paying the open dues period and not finished yet. */
async function lapsedMemberAtCheckout(tag: string) {
	const member = await newLapsedMember(tag);
	const started = await startDuesCheckout(
		member,
		{ societyId: society.id, periodId: period.id },
		{ origin }
	);
	return { member, ...started };
}

/** A new entry, not yet checked in, whose fee is owed. */
function entryOwingFee(
	showId: string,
	classId: string,
	exhibitorId: string,
	title: string,
	number: number
): Promise<Entry> {
	return Entry.create({
		showId,
		classId,
		exhibitorId,
		varietyId: null,
		title,
		number,
		acquiredOn: null,
		measuredDiameterIn: null,
		measuredCrowns: null,
		potSizeIn: null,
		checkedInAt: null,
		checkedInBy: null,
		feeStatus: 'due'
	});
}

async function paidThrough(userId: string): Promise<string | null> {
	const m = await Membership.findOne({ where: { societyId: society.id, userId } });
	return m?.duesPaidThrough ?? null;
}

beforeAll(async () => {
	society = (await Society.findOne({ where: { slug: 'larkspur-valley' } }))!;
	lapsed = (await User.findOne({ where: { email: 'lapsed@crownbench.test' } }))!;
	period = (await DuesPeriod.findOne({
		where: { societyId: society.id },
		order: [['endsOn', 'ASC']]
	}))!;
});

const created: string[] = [];

afterAll(async () => {
	// Leave the database as the seed made it (the migrations test counts the seeded people).
	await sequelize.query('DELETE FROM entries WHERE exhibitor_id = ANY($1::uuid[])', {
		bind: [created]
	});
	await User.destroy({ where: { id: created } });
	// Messages queued here must not wait in the outbox for another test's sender.
	await sequelize.query(
		`DELETE FROM outbox_messages WHERE kind IN ('payment-receipt', 'payment-refund')`
	);
	await Payment.destroy({ where: { userId: lapsed.id } });
	await sequelize.close();
});

describe('paying dues through the hosted checkout', () => {
	it('records nothing until the webhook: checkout leaves a pending payment', async () => {
		const before = await paidThrough(lapsed.id);
		const { url, paymentId } = await startDuesCheckout(
			lapsed,
			{ societyId: society.id, periodId: period.id },
			{ origin }
		);
		expect(url).toMatch(/\/checkout\/cs_test_\w+$/);
		const payment = await Payment.findByPk(paymentId);
		expect(payment?.status).toBe('pending');
		expect(payment?.amountCents).toBe(period.amountCents);
		expect(await paidThrough(lapsed.id)).toBe(before);
	});

	it('a valid signed completion records the payment, moves standing and queues one receipt', async () => {
		const { member, url, paymentId } = await lapsedMemberAtCheckout('valid');
		const completed = await payOnFake(url);
		const answer = await deliver(JSON.stringify(completed));
		expect(answer).toEqual({ status: 200, outcome: 'recorded dues payment' });

		const payment = await Payment.findByPk(paymentId);
		expect(payment?.status).toBe('paid');
		expect(payment?.paymentIntentId).toMatch(/^pi_test_/);
		expect(await paidThrough(member.id)).toBe(period.endsOn);
		expect(await mailCount('payment-receipt', member.email)).toBe(1);
	});

	it('a bad signature, a tampered body or no signature changes nothing', async () => {
		const { member, url, paymentId } = await lapsedMemberAtCheckout('forged');
		const completed = await payOnFake(url);
		const body = JSON.stringify(completed);

		expect((await deliver(body, 'whsec_not_the_secret')).status).toBe(400);
		expect((await deliver(body, null)).status).toBe(400);
		// Signed correctly, then altered: the amount is raised after signing.
		const headers = new Headers({
			'stripe-signature': stripe().webhooks.generateTestHeaderString({
				payload: body,
				secret: webhookSecret()!
			})
		});
		const tampered = body.replace(`"amount_total":${period.amountCents}`, '"amount_total":1');
		const request = new Request(`${origin}/api/payments/webhook`, {
			method: 'POST',
			headers,
			body: tampered
		});
		const response = await POST({ request } as never);
		expect(response.status).toBe(400);

		expect((await Payment.findByPk(paymentId))?.status).toBe('pending');
		expect(await paidThrough(member.id)).toBe('2020-12-31');
		expect(await eventRecorded(completed.id)).toBe(false);
		expect(await mailCount('payment-receipt', member.email)).toBe(0);
	});

	it('a replayed event, and a second event for the same checkout, change nothing', async () => {
		const { member, url, paymentId } = await lapsedMemberAtCheckout('replay');
		const completed = await payOnFake(url);
		const body = JSON.stringify(completed);
		expect((await deliver(body)).outcome).toBe('recorded dues payment');
		// Someone sets dues by hand in between; a replay must not put them back.
		await Membership.update(
			{ duesPaidThrough: '2099-12-31' },
			{ where: { societyId: society.id, userId: member.id } }
		);
		expect(await deliver(body)).toEqual({ status: 200, outcome: 'already processed' });
		const again = event(
			'checkout.session.async_payment_succeeded',
			completed.data.object as Record<string, unknown>
		);
		expect((await deliver(again)).outcome).toBe('already recorded');

		expect(await paidThrough(member.id)).toBe('2099-12-31');
		expect(await mailCount('payment-receipt', member.email)).toBe(1);
		expect(await Payment.count({ where: { id: paymentId, status: 'paid' } })).toBe(1);
	});

	it('refuses a completion whose amount differs from the payment', async () => {
		const { member, url, paymentId } = await lapsedMemberAtCheckout('amount');
		const completed = await payOnFake(url);
		const object = { ...completed.data.object, amount_total: 1 };
		const answer = await deliver(event('checkout.session.completed', object));
		expect(answer.outcome).toBe('amount or currency differs; not recorded');
		expect((await Payment.findByPk(paymentId))?.status).toBe('pending');
		expect(await paidThrough(member.id)).toBe('2020-12-31');
	});

	it('handles events out of order: a stale expiry after payment, a refund before the payment', async () => {
		const { member, url, paymentId } = await lapsedMemberAtCheckout('order');
		const completed = await payOnFake(url);
		const session = completed.data.object as { id: string; payment_intent: string };

		// The refund arrives first (refunded straight away with the payment service).
		const charge = {
			id: 'ch_test_early',
			object: 'charge',
			amount: period.amountCents,
			amount_refunded: period.amountCents,
			currency: 'usd',
			payment_intent: session.payment_intent,
			refunded: true,
			refunds: {
				object: 'list',
				data: [
					{
						id: `re_test_early_${Date.now()}`,
						object: 'refund',
						amount: period.amountCents,
						status: 'succeeded',
						metadata: {},
						payment_intent: session.payment_intent
					}
				]
			}
		};
		const refundEvent = event('charge.refunded', charge);
		const early = await deliver(refundEvent);
		expect(early.status).toBe(409);
		expect(await eventRecorded(JSON.parse(refundEvent).id)).toBe(false);

		expect((await deliver(JSON.stringify(completed))).outcome).toBe('recorded dues payment');
		// A stale "expired" for the same checkout leaves the payment paid.
		const expired = event('checkout.session.expired', { ...session, status: 'expired' });
		expect((await deliver(expired)).outcome).toBe('left as paid');

		// The service sends the refund again; now it applies.
		expect((await deliver(refundEvent)).status).toBe(200);
		const payment = await Payment.findByPk(paymentId);
		expect(payment?.status).toBe('refunded');
		expect(payment?.refundedCents).toBe(period.amountCents);
		// An older snapshot of the charge (nothing refunded yet) arriving last changes nothing.
		const older = event('charge.refunded', {
			...charge,
			amount_refunded: 0,
			refunds: { data: [] }
		});
		expect((await deliver(older)).status).toBe(200);
		expect((await Payment.findByPk(paymentId))?.refundedCents).toBe(period.amountCents);
		expect(await mailCount('payment-refund', member.email)).toBe(1);
	});

	it('refuses to start paying a period that adds nothing, or another society', async () => {
		const member = await newLapsedMember('ahead');
		await Membership.update(
			{ duesPaidThrough: '2099-12-31' },
			{ where: { societyId: society.id, userId: member.id } }
		);
		await expect(
			startDuesCheckout(member, { societyId: society.id, periodId: period.id }, { origin })
		).rejects.toThrow('already paid through');
		const other = (await Society.findOne({ where: { slug: 'cedar-ridge' } }))!;
		const otherPeriod = (await DuesPeriod.findOne({ where: { societyId: other.id } }))!;
		await expect(
			startDuesCheckout(member, { societyId: other.id, periodId: otherPeriod.id }, { origin })
		).rejects.toThrow('not a member');
	});
});

describe('entry fees and refunds for withdrawn entries', () => {
	it('a new entry owes a fee only where its show charges one', async () => {
		const show = (await springShow())!;
		const other = (await Show.findOne({ where: { slug: { [Op.like]: 'cedar-ridge-autumn-%' } } }))!;
		expect(other.entryFeeCents).toBe(0);
		const [charged, free] = await sequelize.transaction(async (transaction) => [
			await feeStatusForNewEntry(show.id, { transaction }),
			await feeStatusForNewEntry(other.id, { transaction })
		]);
		expect([charged, free]).toEqual(['due', 'not_required']);
	});

	it('a paid fee goes back when an entry is withdrawn in time, recorded from the webhook', async () => {
		const member = await newLapsedMember('fees');
		const show = (await springShow())!;
		// Demo setting: a 2.00 fee, refunded up to the close of entries.
		expect(show.entryFeeCents).toBe(200);
		const classes = await ShowClass.findAll({ where: { showId: show.id }, limit: 2 });
		const base = 90000 + Math.floor(Math.random() * 9000);
		const entries = await Promise.all(
			classes.map((c, i) => entryOwingFee(show.id, c.id, member.id, `Fee test ${i}`, base + i))
		);
		const { url, paymentId } = await startEntryFeeCheckout(member, { showId: show.id }, { origin });
		expect((await Payment.findByPk(paymentId))?.amountCents).toBe(400);
		const completed = await payOnFake(url);
		expect((await deliver(JSON.stringify(completed))).outcome).toBe('recorded entry_fees payment');
		for (const e of entries) expect((await e.reload()).feeStatus).toBe('paid');

		// Withdrawn by the exhibitor while entries are open: the policy allows a refund.
		const problem = await sequelize.transaction((transaction) =>
			withdrawEntry(member.id, entries[0].id, { transaction })
		);
		expect(problem).toBeNull();
		await entries[0].reload();
		expect([entries[0].status, entries[0].feeStatus]).toEqual(['withdrawn', 'refund_pending']);
		// Settling it again changes nothing.
		expect(
			await sequelize.transaction((transaction) =>
				settleFeeOfWithdrawnEntry(entries[0].id, { transaction, today: show.entriesClose })
			)
		).toBe('none');
		// A day later the other entry keeps its fee.
		const late = await sequelize.transaction((transaction) =>
			settleFeeOfWithdrawnEntry(entries[1].id, {
				transaction,
				today: '2999-01-01'
			})
		);
		expect(late).toBe('kept');

		// The withdrawal queued the refund's job in its own transaction; a worker sends it.
		const refund = (await Refund.findOne({ where: { entryId: entries[0].id } }))!;
		expect((await jobsFor('refund-send', 'refundId', refund.id)).map((j) => j.state)).toEqual([
			'created'
		]);
		expect(await workDueJobs('refund-send')).toBeGreaterThanOrEqual(1);
		expect((await refund.reload()).status).toBe('sent');
		expect((await jobsFor('refund-send', 'refundId', refund.id)).map((j) => j.state)).toEqual([
			'completed'
		]);
		// Sending again does not refund twice (the row is no longer 'requested').
		expect(await sendRefund(refund.id)).toBe('not-due');

		const payment = (await Payment.findByPk(paymentId))!;
		const [refunded] = await refundEventsFor(payment.paymentIntentId!);
		expect((await deliver(JSON.stringify(refunded))).outcome).toBe('recorded 1 refund(s)');
		expect((await refund.reload()).status).toBe('succeeded');
		expect((await entries[0].reload()).feeStatus).toBe('refunded');
		expect((await entries[1].reload()).feeStatus).toBe('paid');
		await payment.reload();
		expect([payment.status, payment.refundedCents]).toEqual(['partly_refunded', 200]);
		expect(await mailCount('payment-refund', member.email)).toBe(1);
		// The fake refunded exactly one fee.
		expect(refunded.data.object.amount_refunded).toBe(200);
	});

	it('an unpaid fee of a withdrawn entry is simply no longer owed', async () => {
		const member = await newLapsedMember('unpaid');
		const show = (await springShow())!;
		const klass = (await ShowClass.findOne({ where: { showId: show.id } }))!;
		const entry = await entryOwingFee(
			show.id,
			klass.id,
			member.id,
			'Unpaid',
			99500 + Math.floor(Math.random() * 400)
		);
		const outcome = await sequelize.transaction((transaction) =>
			settleFeeOfWithdrawnEntry(entry.id, { transaction })
		);
		expect(outcome).toBe('cancelled');
		expect((await entry.reload()).feeStatus).toBe('not_required');
		await expect(startEntryFeeCheckout(member, { showId: show.id }, { origin })).rejects.toThrow(
			'no entry fees'
		);
	});
});
