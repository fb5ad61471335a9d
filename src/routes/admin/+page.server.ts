import { fail } from '@sveltejs/kit';
import { ROLE_LABELS, ROLES } from '$lib/roles';
import { setRolesSchema } from '$lib/schemas/people';
import { sequelize } from '$lib/server/db';
import { requireRole } from '$lib/server/policies';
import { listSocietyPeople, setSocietyRoles } from '$lib/server/services/people';
import { chooseSociety } from '$lib/server/society-choice';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	const user = requireRole(event, ['admin']);
	const society = chooseSociety(user, ['admin'], event.url.searchParams.get('society'));
	return {
		society,
		people: await listSocietyPeople(society.societyId),
		roleOptions: ROLES.map((r) => ({ value: r, label: ROLE_LABELS[r] }))
	};
};

export const actions: Actions = {
	setRoles: async (event) => {
		const form = await event.request.formData();
		const parsed = setRolesSchema.safeParse({
			societyId: form.get('societyId'),
			email: form.get('email'),
			name: form.get('name') ?? '',
			roles: form.getAll('roles')
		});
		if (!parsed.success) {
			const errors = parsed.error.flatten().fieldErrors;
			return fail(400, {
				message: 'Check the highlighted fields.',
				errors,
				email: String(form.get('email') ?? '')
			});
		}
		requireRole(event, ['admin'], parsed.data.societyId);
		const person = await sequelize.transaction((transaction) =>
			setSocietyRoles(parsed.data, { transaction })
		);
		return {
			saved: `${person.name ?? person.email} now has: ${person.roles.map((r) => ROLE_LABELS[r]).join(', ') || 'no role'}.`
		};
	}
};
