/**
 * Host settings read from the environment, each checked once in one small function so that a
 * wrong value stops the app at start with a message naming the variable.
 */

/** Who may start a society on this host: anyone signed in (open), or only its operator (closed). */
export type SocietySignup = 'open' | 'closed';

/** CB_SOCIETY_SIGNUP: 'open' or 'closed'; closed when unset or empty. Throws on any other value. */
export function societySignup(
	env: Record<string, string | undefined> = process.env
): SocietySignup {
	const value = env.CB_SOCIETY_SIGNUP ?? '';
	if (value === '' || value === 'closed') return 'closed';
	if (value === 'open') return 'open';
	throw new Error(
		`CB_SOCIETY_SIGNUP must be "open" or "closed" (unset means closed); it is "${value}".`
	);
}

/** Checks every host setting at start; throws the first problem found. */
export function checkHostSettings(env: Record<string, string | undefined> = process.env): void {
	societySignup(env);
}
