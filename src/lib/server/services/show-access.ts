import { error, type RequestEvent } from '@sveltejs/kit';
import type { Role } from '$lib/roles';
import { Show } from '../db';
import { requireRole } from '../policies';

/**
 * Finds a show by its address and checks that the signed-in person holds one of the roles in the
 * show's society: 404 for an unknown show, 401/403 otherwise (see requireRole).
 */
export async function requireShowRole(
	event: Pick<RequestEvent, 'url' | 'locals'>,
	slug: string,
	roles: readonly Role[]
): Promise<{ show: Show; user: App.SignedInUser }> {
	const show = await Show.findOne({ where: { slug } });
	if (!show) error(404, 'This page does not exist.');
	const user = requireRole(event, roles, show.societyId);
	return { show, user };
}
