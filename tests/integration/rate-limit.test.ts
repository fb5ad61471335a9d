import { afterAll, describe, expect, it } from 'vitest';

// The limits are read when the module loads: set small ones for this file.
process.env.CB_SIGNIN_LIMIT_PER_ADDRESS = '3';
process.env.CB_SIGNIN_LIMIT_PER_IP = '5';
const { takeSignInAttempt } = await import('$lib/server/http/rate-limit');
const { sequelize } = await import('$lib/server/db');

afterAll(() => sequelize.close());

describe('sign-in rate limits kept in PostgreSQL', () => {
	const run = Date.now();

	it('allows a few links per address, then says how long to wait', async () => {
		const email = `limit-${run}@crownbench.test`;
		const results = [];
		for (let i = 0; i < 4; i++) results.push(await takeSignInAttempt(email, `10.0.${run % 250}.1`));
		expect(results.slice(0, 3)).toEqual([null, null, null]);
		expect(results[3]).toBeGreaterThanOrEqual(1);
		expect(results[3]).toBeLessThanOrEqual(15);
	});

	it('limits one client asking for many addresses', async () => {
		const client = `10.1.${run % 250}.2`;
		const results = [];
		for (let i = 0; i < 6; i++)
			results.push(await takeSignInAttempt(`many${i}-${run}@crownbench.test`, client));
		expect(results.filter((r) => r === null)).toHaveLength(5);
		expect(results[5]).not.toBeNull();
	});

	it('keeps its counters in the database, where every app instance sees them', async () => {
		const [rows] = await sequelize.query(`SELECT key, points FROM rate_limits WHERE key LIKE $1`, {
			bind: [`signin-address:limit-${run}%`]
		});
		expect(rows).toEqual([{ key: `signin-address:limit-${run}@crownbench.test`, points: 4 }]);
	});
});
