import { RateLimiterPostgres, RateLimiterRes } from 'rate-limiter-flexible';
import { sequelize } from './db';

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

/** Sign-in links per e-mail address and per client address, per 15 minutes; kept in PostgreSQL. */
const perAddress = limiter('signin-address', Number(process.env.CB_SIGNIN_LIMIT_PER_ADDRESS ?? 5));
const perClient = limiter('signin-client', Number(process.env.CB_SIGNIN_LIMIT_PER_IP ?? 50));

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
