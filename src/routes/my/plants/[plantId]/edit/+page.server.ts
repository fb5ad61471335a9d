import { error, fail, redirect } from '@sveltejs/kit';
import { sequelize } from '$lib/server/db';
import { readPlantForm } from '$lib/server/plants/plant-forms';
import { memberAndId } from '$lib/server/plants/plant-route';
import {
	getPlant,
	listPlants,
	listVarietyChoices,
	plantName,
	updatePlant
} from '$lib/server/plants/plants';
import { lengthInUnit } from '$lib/domain/units';
import { loadMemberSettings } from '$lib/server/people/society-today';
import type { Actions, PageServerLoad } from './$types';
import { refusedForm } from '$lib/server/http/refusals';
import { isRefusal } from '$lib/server/http/refusal';

export const load: PageServerLoad = async (event) => {
	const { user, societyIds, id } = memberAndId(event, event.params.plantId);
	const [plant, varieties, plants, settings] = await Promise.all([
		getPlant(user.id, id),
		listVarietyChoices(societyIds),
		listPlants(user.id),
		loadMemberSettings(user)
	]);
	if (!plant) error(404, 'This plant does not exist.');
	return {
		plant: { id: plant.id, name: plantName(plant.varietyName, plant.label) },
		values: {
			varietyId: plant.varietyId,
			label: plant.label ?? '',
			obtainedHow: plant.obtainedHow,
			obtainedOn: plant.obtainedOn,
			parentId: plant.parentId ?? '',
			// The stored size (inches), shown in the member's society's unit.
			potSize: plant.potSizeIn === null ? '' : lengthInUnit(plant.potSizeIn, settings.lengthUnit),
			potSizeUnit: settings.lengthUnit,
			notes: plant.notes ?? ''
		},
		varieties,
		lengthUnit: settings.lengthUnit,
		parents: plants
			.filter((p) => p.id !== id)
			.map((p) => ({ value: p.id, label: plantName(p.varietyName, p.label) }))
	};
};

export const actions: Actions = {
	default: async (event) => {
		const { user, societyIds, id } = memberAndId(event, event.params.plantId);
		const form = await event.request.formData();
		const read = readPlantForm(form);
		if (!read.ok) {
			return fail(400, {
				message: 'Check the highlighted fields.',
				errors: read.errors,
				values: read.values
			});
		}
		try {
			await sequelize.transaction((transaction) =>
				updatePlant(user.id, societyIds, id, read.data, { transaction })
			);
		} catch (err) {
			if (isRefusal(err) && err.field === 'plant' && !read.data.parentId) error(404, err.message);
			return refusedForm(err, (r) => ({
				errors: { [r.field === 'plant' ? 'parentId' : (r.field ?? 'form')]: r.message },
				values: Object.fromEntries([...form.entries()].map(([k, v]) => [k, String(v)]))
			}));
		}
		redirect(303, `/my/plants/${id}`);
	}
};
