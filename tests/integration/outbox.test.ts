import { afterAll, beforeEach, describe, expect, it } from 'vitest';
import { QueryTypes } from 'sequelize';
import { sequelize } from '$lib/server/db';
import {
	deliverDueMail,
	mailProgress,
	MAX_ATTEMPTS,
	queueMail,
	resendMail
} from '$lib/server/mail/outbox';
import { mailFor } from '../e2e/support/mail';

const fake = process.env.CB_DEV_MAIL_URL ?? 'http://127.0.0.1:2536';
const run = `${Date.now()}`;

async function refuse(count: number | 'off'): Promise<void> {
	const query = count === 'off' ? 'until=off' : `count=${count}`;
	const response = await fetch(`${fake}/refuse?${query}`, { method: 'POST' });
	expect(response.ok).toBe(true);
}

async function rows(kind: string) {
	return sequelize.query<{ id: string; status: string; attempts: number }>(
		'SELECT id, status, attempts FROM outbox_messages WHERE kind = $1 ORDER BY to_address',
		{ bind: [kind], type: QueryTypes.SELECT }
	);
}

/** Makes every waiting message due now, instead of waiting out the back-off. */
async function makeDue(kind: string): Promise<void> {
	await sequelize.query(`UPDATE outbox_messages SET next_attempt_at = now() WHERE kind = $1`, {
		bind: [kind]
	});
}

async function deliverAll(kind: string): Promise<void> {
	for (let i = 0; i < 20; i++) {
		await makeDue(kind);
		const r = await deliverDueMail({ limit: 50 });
		if (r.sent + r.retried + r.failed === 0) return;
	}
}

const mail = (kind: string, to: string, dedupeKey?: string) => ({
	kind,
	to,
	subject: `Test ${kind}`,
	text: `Hello ${to}`,
	dedupeKey
});

beforeEach(async () => {
	await refuse('off');
});

afterAll(async () => {
	await refuse('off');
	await sequelize.close();
});

describe('mail outbox', () => {
	it('writes nothing when the transaction that queued it rolls back', async () => {
		const kind = `rollback-${run}`;
		await expect(
			sequelize.transaction(async (transaction) => {
				await queueMail([mail(kind, `a-${run}@crownbench.test`)], { transaction });
				throw new Error('publishing failed half-way');
			})
		).rejects.toThrow('publishing failed');
		expect(await rows(kind)).toEqual([]);
	});

	it('queues a message once per dedupe key', async () => {
		const kind = `dedupe-${run}`;
		const first = await sequelize.transaction((transaction) =>
			queueMail([mail(kind, `b-${run}@crownbench.test`, `k-${run}`)], { transaction })
		);
		const second = await sequelize.transaction((transaction) =>
			queueMail([mail(kind, `b-${run}@crownbench.test`, `k-${run}`)], { transaction })
		);
		expect([first, second]).toEqual([1, 0]);
		expect(await rows(kind)).toHaveLength(1);
	});

	it('survives an SMTP server that refuses mail for a while: every message arrives once', async () => {
		const kind = `outage-${run}`;
		const addresses = Array.from({ length: 6 }, (_, i) => `outage${i}-${run}@crownbench.test`);
		await sequelize.transaction((transaction) =>
			queueMail(
				addresses.map((a) => mail(kind, a)),
				{ transaction }
			)
		);
		await refuse(9); // every message refused once, three of them twice
		await deliverDueMail({ limit: 50 });
		const afterFirstRound = await rows(kind);
		expect(afterFirstRound.map((r) => [r.status, r.attempts])).toEqual(
			Array(6).fill(['waiting', 1])
		);
		await deliverAll(kind);

		const final = await rows(kind);
		expect(final.map((r) => r.status)).toEqual(Array(6).fill('sent'));
		for (const address of addresses) {
			expect(await mailFor(address)).toHaveLength(1);
		}
	});

	it('two workers at once never send the same message twice', async () => {
		const kind = `parallel-${run}`;
		const addresses = Array.from({ length: 30 }, (_, i) => `par${i}-${run}@crownbench.test`);
		await sequelize.transaction((transaction) =>
			queueMail(
				addresses.map((a) => mail(kind, a)),
				{ transaction }
			)
		);
		await Promise.all([
			deliverDueMail({ limit: 30 }),
			deliverDueMail({ limit: 30 }),
			deliverDueMail({ limit: 30 })
		]);
		await deliverAll(kind);
		for (const address of addresses) {
			expect(await mailFor(address)).toHaveLength(1);
		}
	});

	it('marks a message failed after its last try, and sends it when asked again', async () => {
		const kind = `failing-${run}`;
		const address = `fail-${run}@crownbench.test`;
		await sequelize.transaction((transaction) => queueMail([mail(kind, address)], { transaction }));
		await refuse(MAX_ATTEMPTS);
		await deliverAll(kind);
		const [row] = await rows(kind);
		expect(row.status).toBe('failed');
		expect(row.attempts).toBe(MAX_ATTEMPTS);
		expect(await mailFor(address)).toHaveLength(0);

		await refuse('off');
		expect(await sequelize.transaction((transaction) => resendMail(row.id, { transaction }))).toBe(
			true
		);
		await deliverAll(kind);
		expect((await rows(kind))[0].status).toBe('sent');
		expect(await mailFor(address)).toHaveLength(1);
	});

	it('counts progress per show', async () => {
		const [show] = await sequelize.query<{ id: string }>('SELECT id FROM shows LIMIT 1', {
			type: QueryTypes.SELECT
		});
		const kind = `progress-${run}`;
		await sequelize.transaction((transaction) =>
			queueMail(
				[
					{ ...mail(kind, `p1-${run}@crownbench.test`), showId: show.id },
					{ ...mail(kind, `p2-${run}@crownbench.test`), showId: show.id }
				],
				{ transaction }
			)
		);
		expect(await mailProgress(show.id, kind)).toEqual({
			waiting: 2,
			sending: 0,
			sent: 0,
			failed: 0
		});
		await deliverAll(kind);
		expect(await mailProgress(show.id, kind)).toEqual({
			waiting: 0,
			sending: 0,
			sent: 2,
			failed: 0
		});
	});
});
