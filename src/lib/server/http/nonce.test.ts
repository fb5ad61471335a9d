import { describe, expect, it } from 'vitest';
import { nonceOf, swapNonce } from './nonce';

describe('nonces of a kept page', () => {
	it.each([
		[
			"script-src 'self' 'nonce-CvSZITLJ56CNKdgKyDZYZA=='; style-src 'self'",
			'CvSZITLJ56CNKdgKyDZYZA=='
		],
		["default-src 'self'", null],
		[null, null]
	])('finds the nonce of %s', (policy, nonce) => {
		expect(nonceOf(policy)).toBe(nonce);
	});

	it('swaps every occurrence, in body and header alike, and nothing else', () => {
		const body = '<script nonce="abc+/=">x</script><link nonce="abc+/="><p>abc</p>';
		expect(swapNonce(body, 'abc+/=', 'NEW')).toBe(
			'<script nonce="NEW">x</script><link nonce="NEW"><p>abc</p>'
		);
		expect(swapNonce(body, null, 'NEW')).toBe(body);
	});
});
