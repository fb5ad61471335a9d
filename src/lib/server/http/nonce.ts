/** Content security policy nonces in a kept copy of a page. */

/** The nonce of a content security policy header, or null. */
export function nonceOf(policy: string | null): string | null {
	return policy ? (/'nonce-([A-Za-z0-9+/=_-]+)'/.exec(policy)?.[1] ?? null) : null;
}

/** Replaces every occurrence of the old nonce with a new one. */
export function swapNonce(text: string, from: string | null, to: string): string {
	return from ? text.split(from).join(to) : text;
}
