import { describe, expect, it } from 'vitest';
import { signInSchema } from './sign-in';

const messageFor = (email: string) => {
	const parsed = signInSchema.safeParse({ email });
	return parsed.success ? null : parsed.error.issues[0]?.message;
};

describe('the sign-in form', () => {
	it('takes a complete address, trimmed', () => {
		const parsed = signInSchema.parse({ email: '  grower@example.org ' });
		expect(parsed.email).toBe('grower@example.org');
		expect(parsed.redirectTo).toBe('/home');
	});

	it.each([
		['', 'Enter your e-mail address.'],
		['grower', 'Enter a complete e-mail address, like name@example.org.'],
		// RFC 6761 reserves .invalid: no mail is ever delivered there (the stand-in of a walk-in).
		['0b6f@walk-in.invalid', 'That address cannot receive mail.'],
		['someone@EXAMPLE.INVALID', 'That address cannot receive mail.']
	])('refuses %j: %s', (email, message) => {
		expect(messageFor(email)).toBe(message);
	});

	it('never follows a sign-in to another site', () => {
		expect(
			signInSchema.parse({ email: 'a@example.org', redirectTo: '//evil.example' }).redirectTo
		).toBe('/home');
	});
});
