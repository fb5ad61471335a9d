import { redirect } from '@sveltejs/kit';
import { ROLE_HOMES, ROLE_LABELS, ROLES } from '$lib/roles';
import { societySignup } from '$lib/server/config';
import { requireUser } from '$lib/server/policies';
import { listOwnEntries } from '$lib/server/entries/desk-entries';
import type { PageServerLoad } from './$types';

/** After sign-in: one role goes straight to its page; several get a choice; none get an explanation. */
export const load: PageServerLoad = async (event) => {
	const user = requireUser(event);
	const held = ROLES.filter((r) => user.memberships.some((m) => m.roles.includes(r)));
	if (held.length === 1) redirect(303, ROLE_HOMES[held[0]]);
	return {
		name: user.name,
		societySignupOpen: societySignup() === 'open',
		// Plants entered for them at a show's desk before they had an account (walk-ins).
		entries: held.length === 0 ? await listOwnEntries(user.id) : [],
		areas: held.map((r) => ({ role: r, label: ROLE_LABELS[r], href: ROLE_HOMES[r] })),
		societies: user.memberships.map((m) => ({
			name: m.societyName,
			roles: m.roles.map((r) => ROLE_LABELS[r])
		}))
	};
};
