/**
 * Retry delays for mail delivery: exponential back-off from `baseSeconds`, doubled after each
 * failed attempt and capped at `maxSeconds`, so a mail server that is down for a while is not
 * hammered and a short outage costs little delay.
 */
export function retryDelaySeconds(attempt: number, baseSeconds = 5, maxSeconds = 30 * 60): number {
	if (!Number.isInteger(attempt) || attempt < 1) throw new RangeError('attempt counts from 1');
	return Math.min(maxSeconds, baseSeconds * 2 ** (attempt - 1));
}
