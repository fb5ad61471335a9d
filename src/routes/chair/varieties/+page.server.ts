import { fail } from '@sveltejs/kit';
import { z } from 'zod';
import { PLANT_GROUPS } from '$lib/domain/plant-groups';
import { varietySchema } from '$lib/schemas/variety';
import { sequelize } from '$lib/server/db';
import { fieldErrors, textFields } from '$lib/server/http/forms';
import { requireRole } from '$lib/server/policies';
import { chooseSociety } from '$lib/server/people/society-choice';
import {
	MAX_IMPORT_CHARS,
	findVariety,
	importVarietiesCsv,
	saveVariety,
	toVarietyRow
} from '$lib/server/plants/varieties';
import type { Actions, PageServerLoad } from './$types';
import { fieldErrorOf, refusedForm } from '$lib/server/http/refusals';

const FIELDS = [
	'name',
	'plantGroup',
	'hybridizer',
	'botanicalName',
	'growthForm',
	'sizeClass',
	'blossomType',
	'blossomColours',
	'foliage',
	'description'
] as const;

export const load: PageServerLoad = async (event) => {
	const user = requireRole(event, ['chair']);
	const society = chooseSociety(user, ['chair'], event.url.searchParams.get('society'));
	const editId = z.uuid().safeParse(event.url.searchParams.get('edit'));
	const editing = editId.success ? await findVariety(society.societyId, editId.data) : null;
	return { society, editing: editing ? toVarietyRow(editing) : null, groups: PLANT_GROUPS };
};

export const actions: Actions = {
	save: async (event) => {
		const form = await event.request.formData();
		const societyId = z.uuid().safeParse(form.get('societyId'));
		if (!societyId.success) return fail(400, { message: 'Say which society’s registry.' });
		requireRole(event, ['chair'], societyId.data);
		const values = textFields(form, FIELDS);
		const parsed = varietySchema.safeParse({
			...values,
			isSpecies: form.get('isSpecies') === 'on'
		});
		if (!parsed.success) {
			return fail(400, {
				message: 'Check the highlighted fields; the variety was not saved.',
				errors: fieldErrors(parsed.error),
				values
			});
		}
		const id = z
			.uuid()
			.nullable()
			.catch(null)
			.parse(form.get('id') || null);
		try {
			const saved = await sequelize.transaction((transaction) =>
				saveVariety(societyId.data, id, parsed.data, { transaction })
			);
			return { saved: `“${saved.name}” is saved in the registry.` };
		} catch (e) {
			return refusedForm(e, (r) => ({ errors: fieldErrorOf(r), values }));
		}
	},
	import: async (event) => {
		const form = await event.request.formData();
		const societyId = z.uuid().safeParse(form.get('societyId'));
		if (!societyId.success) return fail(400, { importMessage: 'Say which society’s registry.' });
		requireRole(event, ['chair'], societyId.data);
		const file = form.get('file');
		if (!(file instanceof File) || file.size === 0) {
			return fail(400, { importMessage: 'Choose a CSV file to import.' });
		}
		if (file.size > MAX_IMPORT_CHARS) {
			return fail(400, { importMessage: 'The file is over 2 MB; split it into smaller files.' });
		}
		const goodRowsOnly = form.get('goodRowsOnly') === 'on';
		const report = await sequelize.transaction(async (transaction) =>
			importVarietiesCsv(societyId.data, await file.text(), { goodRowsOnly, transaction })
		);
		if (report.problems.length && report.imported === 0) {
			return fail(400, {
				importMessage: `Nothing was imported: ${report.problems.length} of the lines have problems. Fix them, or tick “import the good rows only”.`,
				report
			});
		}
		return {
			imported: `${report.imported} ${report.imported === 1 ? 'variety was' : 'varieties were'} added to the registry.`,
			report
		};
	}
};
