import { fail } from '@sveltejs/kit';
import { sequelize } from '$lib/server/db';
import { isRefusal } from '$lib/server/services/refusal';
import { loadAwardRulesPage, saveAwardRules } from '$lib/server/services/results';
import { requireShowRole } from '$lib/server/policies/show';
import { readRulesForm } from './form';
import type { Actions, PageServerLoad } from './$types';

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
			if (isRefusal(err)) return fail(400, { message: err.message, field: err.field });
			throw err;
		}
		return { ok: true, message: 'Award rules saved.' };
	}
};
