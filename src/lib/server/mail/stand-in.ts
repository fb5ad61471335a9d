/**
 * Addresses given to walk-in exhibitors who left none: under `.invalid`, a name reserved never to
 * exist (RFC 2606), so nobody can sign in with it and no mail is ever queued for it.
 */
export const NO_ADDRESS_DOMAIN = 'walk-in.invalid';

/** True for the stand-in address of a walk-in exhibitor who gave none. */
export function isStandInAddress(email: string): boolean {
	return email.toLowerCase().endsWith(`@${NO_ADDRESS_DOMAIN}`);
}
