import { RateLimiterPostgres, RateLimiterRes } from 'rate-limiter-flexible';
import { config } from '../config';
import { sequelize } from '../db';

const WINDOW_SECONDS = 15 * 60;

function limiter(prefix: string, points: number): RateLimiterPostgres {
	return new RateLimiterPostgres({
		storeClient: sequelize,
		storeType: 'sequelize',
		tableName: 'rate_limits',
		tableCreated: true,
		clearExpiredByTimeout: false,
		keyPrefix: prefix,
		points,
		duration: WINDOW_SECONDS
	});
}

/**
 * Sign-in links per e-mail address and per client address, per 15 minutes; kept in PostgreSQL,
 * so every app instance on the database counts against the same limits.
 */
const perAddress = limiter('signin-address', config().signInLimitPerAddress);
const perClient = limiter('signin-client', config().signInLimitPerClient);

/**
 * Counts one sign-in request for the address and the client; returns null when allowed, or the
 * whole minutes to wait when either limit is used up.
 */
export async function takeSignInAttempt(
	email: string,
	clientAddress: string
): Promise<number | null> {
	try {
		await Promise.all([perAddress.consume(email.toLowerCase()), perClient.consume(clientAddress)]);
		return null;
	} catch (outcome) {
		if (outcome instanceof RateLimiterRes)
			return Math.max(1, Math.ceil(outcome.msBeforeNext / 60_000));
		throw outcome;
	}
}
