import { error } from '@sveltejs/kit';
import type { Role } from '$lib/roles';

/**
 * The society a role page works on: the one named by ?society=slug, else the first
 * in which the person holds the role. 403 when they hold it in none of them.
 */
export function chooseSociety(
	user: App.SignedInUser,
	roles: readonly Role[],
	slug: string | null
): {
	societyId: string;
	societySlug: string;
	societyName: string;
	choices: { slug: string; name: string }[];
} {
	const allowed = user.memberships.filter((m) => m.roles.some((r) => roles.includes(r)));
	const chosen = slug ? allowed.find((m) => m.societySlug === slug) : allowed[0];
	if (!chosen) error(403, 'Your account does not have this role in that society.');
	return {
		societyId: chosen.societyId,
		societySlug: chosen.societySlug,
		societyName: chosen.societyName,
		choices: allowed.map((m) => ({ slug: m.societySlug, name: m.societyName }))
	};
}
