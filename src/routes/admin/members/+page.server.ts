import { fail } from '@sveltejs/kit';
import { z } from 'zod';
import { ROLE_LABELS, ROLES } from '$lib/roles';
import {
	changeRolesSchema,
	inviteSchema,
	memberQuerySchema,
	parseMemberQuery
} from '$lib/schemas/members';
import { sequelize } from '$lib/server/db';
import { requireRole } from '$lib/server/policies';
import { changeMemberRoles, inviteMember, listMembers } from '$lib/server/people/members';
import { chooseSociety } from '$lib/server/people/society-choice';
import type { Actions, PageServerLoad } from './$types';
import { refusedForm } from '$lib/server/http/refusals';

export const load: PageServerLoad = async (event) => {
	const user = requireRole(event, ['admin']);
	const society = chooseSociety(user, ['admin'], event.url.searchParams.get('society'));
	const parsed = parseMemberQuery(event.url.searchParams);
	const query = parsed.success ? parsed.data : memberQuerySchema.parse({});
	return {
		society,
		query,
		members: await listMembers(society.societyId, query),
		roleOptions: ROLES.map((r) => ({ value: r, label: ROLE_LABELS[r] }))
	};
};

export const actions: Actions = {
	invite: async (event) => {
		const form = await event.request.formData();
		const parsed = inviteSchema.safeParse({
			societyId: form.get('societyId'),
			email: form.get('email'),
			name: form.get('name') ?? '',
			roles: form.getAll('roles')
		});
		const email = String(form.get('email') ?? '');
		if (!parsed.success) {
			const errors = z.flattenError(parsed.error).fieldErrors;
			return fail(400, { invite: { message: 'Check the highlighted fields.', errors, email } });
		}
		const admin = requireRole(event, ['admin'], parsed.data.societyId);
		try {
			const invited = await sequelize.transaction((transaction) =>
				inviteMember(
					{ ...parsed.data, invitedBy: admin.name ?? admin.email, origin: event.url.origin },
					{ transaction }
				)
			);
			return { invite: { saved: `Invitation sent to ${invited.email}.` } };
		} catch (err) {
			return refusedForm(err, (r) => ({
				invite: { message: r.message, errors: { email: [r.message] }, email }
			}));
		}
	},

	changeRoles: async (event) => {
		const form = await event.request.formData();
		const parsed = changeRolesSchema.safeParse({
			societyId: form.get('societyId'),
			userId: form.get('userId'),
			roles: form.getAll('roles'),
			confirm: form.get('confirm') ?? ''
		});
		if (!parsed.success) {
			return fail(400, {
				roles: { message: 'Choose roles from the list and try again.', saved: null }
			});
		}
		const actor = requireRole(event, ['admin'], parsed.data.societyId);
		try {
			const result = await sequelize.transaction((transaction) =>
				changeMemberRoles(
					{ ...parsed.data, confirmed: parsed.data.confirm },
					{ transaction, actor }
				)
			);
			const label = (roles: typeof result.roles) =>
				roles.map((r) => ROLE_LABELS[r]).join(', ') || 'no role';
			return { roles: { saved: `Roles saved: ${label(result.roles)}.`, message: null } };
		} catch (err) {
			return refusedForm(err, (r) => ({ roles: { message: r.message, saved: null } }));
		}
	}
};
