import { ROLE_HOMES, ROLE_LABELS, ROLES } from '$lib/roles';
import type { LayoutServerLoad } from './$types';

/** Exactly what the browser gets of the signed-in person: name, e-mail and the areas they may open. */
export const load: LayoutServerLoad = ({ locals }) => {
	const user = locals.user;
	if (!user) return { viewer: null };
	const held = new Set(user.memberships.flatMap((m) => m.roles));
	return {
		viewer: {
			name: user.name,
			email: user.email,
			areas: ROLES.filter((r) => held.has(r)).map((r) => ({
				role: r,
				label: ROLE_LABELS[r],
				href: ROLE_HOMES[r]
			}))
		}
	};
};
