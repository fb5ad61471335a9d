import { describe, expect, it } from 'vitest';
import { retryDelaySeconds } from './backoff';

describe('retryDelaySeconds', () => {
	it.each([
		[1, 5],
		[2, 10],
		[3, 20],
		[4, 40],
		[10, 1800],
		[30, 1800]
	])('attempt %i waits %i s', (attempt, seconds) => {
		expect(retryDelaySeconds(attempt)).toBe(seconds);
	});

	it('refuses attempt numbers below 1', () => {
		expect(() => retryDelaySeconds(0)).toThrow(RangeError);
	});
});
