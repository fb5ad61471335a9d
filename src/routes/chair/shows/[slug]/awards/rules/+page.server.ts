import { fail } from '@sveltejs/kit';
import { sequelize } from '$lib/server/db';
import { loadAwardRulesPage, saveAwardRules } from '$lib/server/results/results';
import { requireShowRole } from '$lib/server/shows/policies';
import { readRulesForm } from './form';
import type { Actions, PageServerLoad } from './$types';
import { refusedForm } from '$lib/server/http/refusals';

export const load: PageServerLoad = async (event) => {
	const { show } = await requireShowRole(event, event.params.slug, ['chair']);
	return { show: { name: show.name, slug: show.slug }, ...(await loadAwardRulesPage(show.id)) };
};

export const actions: Actions = {
	default: async (event) => {
		const { show } = await requireShowRole(event, event.params.slug, ['chair']);
		const read = readRulesForm(await event.request.formData());
		if (!read.ok) return fail(400, { message: read.message, field: read.field });
		try {
			await sequelize.transaction((transaction) =>
				saveAwardRules(show, read.rules, read.method, { transaction })
			);
		} catch (err) {
			return refusedForm(err);
		}
		return { ok: true, message: 'Award rules saved.' };
	}
};
