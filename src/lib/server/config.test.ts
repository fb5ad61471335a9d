import { describe, expect, it } from 'vitest';
import { checkHostSettings, societySignup } from './config';

describe('societySignup (CB_SOCIETY_SIGNUP)', () => {
	it.each([
		[undefined, 'closed'],
		['', 'closed'],
		['closed', 'closed'],
		['open', 'open']
	])('reads %j as %s', (value, expected) => {
		expect(societySignup({ CB_SOCIETY_SIGNUP: value })).toBe(expected);
	});

	it.each(['Open', 'yes', 'true', ' open', 'anyone'])(
		'refuses %j, naming the variable',
		(value) => {
			expect(() => societySignup({ CB_SOCIETY_SIGNUP: value })).toThrow(/CB_SOCIETY_SIGNUP/);
			expect(() => checkHostSettings({ CB_SOCIETY_SIGNUP: value })).toThrow(/CB_SOCIETY_SIGNUP/);
		}
	);
});
