import { fail } from '@sveltejs/kit';
import { z } from 'zod';
import { scaleFormValues, scaleSchema } from '$lib/schemas/scale';
import { sequelize } from '$lib/server/db';
import { fieldErrors } from '$lib/server/http/forms';
import { requireRole } from '$lib/server/policies';
import { chooseSociety } from '$lib/server/people/society-choice';
import { copyScale, createScale, listSocietyScales, updateScale } from '$lib/server/shows/scales';
import type { Actions, PageServerLoad } from './$types';
import { refusedForm } from '$lib/server/http/refusals';

/** The society's chair or admin keeps its scales of points. */
const ROLES = ['chair', 'admin'] as const;
const societyIdOf = (form: FormData) => z.uuid().safeParse(form.get('societyId'));
const optionalId = z.uuid().nullable().catch(null);

export const load: PageServerLoad = async (event) => {
	const user = requireRole(event, ROLES);
	const society = chooseSociety(user, ROLES, event.url.searchParams.get('society'));
	const scales = await listSocietyScales(society.societyId);
	const editId = event.url.searchParams.get('edit');
	const editing = scales.find((s) => s.own && s.id === editId) ?? null;
	return { society, scales, editing };
};

export const actions: Actions = {
	save: async (event) => {
		const form = await event.request.formData();
		const societyId = societyIdOf(form);
		if (!societyId.success) return fail(400, { message: 'Say which society’s scales.' });
		requireRole(event, ROLES, societyId.data);
		const values = scaleFormValues(form);
		const parsed = scaleSchema.safeParse(values);
		if (!parsed.success) {
			return fail(400, {
				message: `${parsed.error.issues[0].message} The scale was not saved.`,
				errors: fieldErrors(parsed.error),
				values
			});
		}
		const id = optionalId.parse(form.get('id') || null);
		try {
			const saved = await sequelize.transaction(async (transaction) => {
				if (!id) {
					const scale = await createScale(societyId.data, parsed.data, { transaction });
					return `The scale “${scale.name}” is saved.`;
				}
				const result = await updateScale(societyId.data, id, parsed.data, { transaction });
				if (!result.newVersion) return `The scale “${result.scale.name}” is saved.`;
				return `Sheets were already scored on “${result.scale.name}”, so this is saved as version ${result.scale.version}: ${result.movedClasses} class(es) not yet judged now use it, ${result.keptClasses} judged class(es) keep the earlier version.`;
			});
			return { saved };
		} catch (e) {
			return refusedForm(e, (r) => ({ errors: { [r.field ?? 'form']: r.message }, values }));
		}
	},
	copy: async (event) => {
		const form = await event.request.formData();
		const societyId = societyIdOf(form);
		if (!societyId.success) return fail(400, { message: 'Say which society’s scales.' });
		requireRole(event, ROLES, societyId.data);
		const id = optionalId.parse(form.get('id') || null);
		if (!id) return fail(400, { message: 'Say which scale to copy.' });
		try {
			const copy = await sequelize.transaction((transaction) =>
				copyScale(societyId.data, id, { transaction })
			);
			return { saved: `The copy “${copy.name}” is made; edit it below.`, copiedId: copy.id };
		} catch (e) {
			return refusedForm(e);
		}
	}
};
