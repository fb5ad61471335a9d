import { error, fail } from '@sveltejs/kit';
import { z } from 'zod';
import { editSocietySchema, societyFormOptions, societyFormValues } from '$lib/schemas/society';
import { sequelize } from '$lib/server/db';
import { requireRole } from '$lib/server/policies';
import { loadSocietyFields, updateSocietySettings } from '$lib/server/people/societies';
import { chooseSociety } from '$lib/server/people/society-choice';
import type { Actions, PageServerLoad } from './$types';
import { refusedForm } from '$lib/server/http/refusals';

export const load: PageServerLoad = async (event) => {
	const user = requireRole(event, ['admin']);
	const society = chooseSociety(user, ['admin'], event.url.searchParams.get('society'));
	const fields = await loadSocietyFields(society.societyId);
	if (!fields) error(404, 'This society does not exist.');
	return { society, fields, options: societyFormOptions() };
};

const text = (v: unknown) => (typeof v === 'string' ? v.slice(0, 200) : '');

export const actions: Actions = {
	save: async (event) => {
		const raw = societyFormValues(await event.request.formData());
		const values = Object.fromEntries(Object.entries(raw).map(([k, v]) => [k, text(v)]));
		const parsed = editSocietySchema.safeParse(raw);
		if (!parsed.success) {
			const errors = z.flattenError(parsed.error).fieldErrors;
			return fail(400, { message: 'Check the highlighted fields.', errors, values });
		}
		requireRole(event, ['admin'], parsed.data.societyId);
		try {
			const saved = await sequelize.transaction((transaction) =>
				updateSocietySettings(parsed.data, { transaction })
			);
			return { saved: `Settings saved for ${saved.name}.`, slug: saved.slug };
		} catch (err) {
			return refusedForm(err, (r) => ({
				errors: r.field ? { [r.field]: [r.message] } : {},
				values
			}));
		}
	}
};
