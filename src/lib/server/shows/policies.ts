import { error, type RequestEvent } from '@sveltejs/kit';
import type { Role } from '$lib/roles';
import { Show } from '../db';
import { requireRole } from '../policies/index';

/** The show with this slug, or a 404 page or answer. */
export async function findShowOr404(slug: string): Promise<Show> {
	const show = slug.length <= 80 ? await Show.findOne({ where: { slug } }) : null;
	if (!show) error(404, 'There is no show at this address.');
	return show;
}

/**
 * Loads a show by slug and checks that the signed-in person holds one of the roles in the
 * society that runs it (401/redirect, 403 or 404 otherwise).
 */
export async function requireShowRole(
	event: Pick<RequestEvent, 'url' | 'locals'>,
	slug: string,
	roles: readonly Role[]
): Promise<{ show: Show; user: App.SignedInUser }> {
	const show = await findShowOr404(slug);
	const user = requireRole(event, roles, show.societyId);
	return { show, user };
}
