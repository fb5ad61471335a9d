import { fail, redirect } from '@sveltejs/kit';
import { todayIn } from '$lib/domain/dates';
import { sequelize } from '$lib/server/db';
import { readPlantForm } from '$lib/server/plants/plant-forms';
import { memberAndId } from '$lib/server/plants/plant-route';
import { loadMemberSettings } from '$lib/server/people/society-today';
import { createPlant, listPlants, listVarietyChoices, plantName } from '$lib/server/plants/plants';
import type { Actions, PageServerLoad } from './$types';
import { refusedForm } from '$lib/server/http/refusals';

export const load: PageServerLoad = async (event) => {
	const { user, societyIds } = memberAndId(event);
	const [varieties, plants, settings] = await Promise.all([
		listVarietyChoices(societyIds),
		listPlants(user.id),
		loadMemberSettings(user)
	]);
	return {
		varieties,
		parents: plants.map((p) => ({ value: p.id, label: plantName(p.varietyName, p.label) })),
		today: todayIn(settings.timeZone),
		lengthUnit: settings.lengthUnit
	};
};

export const actions: Actions = {
	default: async (event) => {
		const { user, societyIds } = memberAndId(event);
		const form = await event.request.formData();
		const read = readPlantForm(form);
		if (!read.ok) {
			return fail(400, {
				message: 'Check the highlighted fields.',
				errors: read.errors,
				values: read.values
			});
		}
		let id: string;
		try {
			const plant = await sequelize.transaction((transaction) =>
				createPlant(user.id, societyIds, read.data, { transaction })
			);
			id = plant.id;
		} catch (error) {
			return refusedForm(error, (r) => ({
				errors: { [r.field === 'plant' ? 'parentId' : (r.field ?? 'form')]: r.message },
				values: Object.fromEntries([...form.entries()].map(([k, v]) => [k, String(v)]))
			}));
		}
		redirect(303, `/my/plants/${id}`);
	}
};
