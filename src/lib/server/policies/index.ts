import { error, redirect, type RequestEvent } from '@sveltejs/kit';
import type { Role } from '$lib/roles';

/** The societies in which the person holds any of the roles. */
export function societiesWithRole(user: App.SignedInUser | null, roles: readonly Role[]): string[] {
	if (!user) return [];
	return user.memberships
		.filter((m) => m.roles.some((r) => roles.includes(r)))
		.map((m) => m.societyId);
}

/** True when the person holds one of the roles (in the given society, or in any). */
export function hasRole(
	user: App.SignedInUser | null,
	roles: readonly Role[],
	societyId?: string
): boolean {
	if (!user) return false;
	return user.memberships.some(
		(m) =>
			(societyId === undefined || m.societyId === societyId) &&
			m.roles.some((r) => roles.includes(r))
	);
}

function isApi(event: Pick<RequestEvent, 'url'>): boolean {
	return event.url.pathname.startsWith('/api/');
}

/** Returns the signed-in person; a page redirects to sign-in, an API answers 401. */
export function requireUser(event: Pick<RequestEvent, 'url' | 'locals'>): App.SignedInUser {
	const user = event.locals.user;
	if (user) return user;
	if (isApi(event)) error(401, 'Sign in first.');
	const next = event.url.pathname + event.url.search;
	redirect(303, `/signin?next=${encodeURIComponent(next)}`);
}

/**
 * Returns the signed-in person when they hold one of the roles (in the society, when given);
 * otherwise 401/redirect for a signed-out visitor and 403 for everyone else.
 */
export function requireRole(
	event: Pick<RequestEvent, 'url' | 'locals'>,
	roles: readonly Role[],
	societyId?: string
): App.SignedInUser {
	const user = requireUser(event);
	if (!hasRole(user, roles, societyId)) {
		error(403, 'Your account does not have the role this page needs.');
	}
	return user;
}

/** A path as SvelteKit's routing reads it (decoded as its decode_pathname does: %25 and %2F kept). */
export function routedPath(pathname: string): string {
	try {
		return pathname.split('%25').map(decodeURI).join('%25');
	} catch {
		return pathname;
	}
}

/** Which roles each area of the app needs; the guard in hooks.server.ts applies it to pages and APIs. */
export const AREA_ROLES: Record<string, readonly Role[] | 'signed-in'> = {
	admin: ['admin'],
	chair: ['chair'],
	desk: ['clerk', 'chair'],
	judging: ['judge', 'clerk'],
	my: ['member'],
	home: 'signed-in',
	societies: 'signed-in'
};

/** The area a path belongs to (its first segment, after /api/), or null for public paths. */
export function areaOf(pathname: string): string | null {
	// Decided on the path as routing reads it: /api/%6Audging is /api/judging.
	const parts = routedPath(pathname).split('/').filter(Boolean);
	const first = parts[0] === 'api' ? parts[1] : parts[0];
	return first && first in AREA_ROLES ? first : null;
}
