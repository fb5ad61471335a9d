import { fail } from '@sveltejs/kit';
import { z } from 'zod';
import { classSchema, divisionSchema, moveSchema, scheduleTextSchema } from '$lib/schemas/show';
import { sequelize } from '$lib/server/db';
import { requireConfirmation } from '$lib/server/http/confirm';
import { fieldErrors, textFields } from '$lib/server/http/forms';
import { requireShowRole } from '$lib/server/shows/policies';
import {
	deleteClass,
	deleteDivision,
	listScales,
	loadSchedule,
	moveClass,
	moveDivision,
	saveClass,
	saveDivision,
	saveScheduleText
} from '$lib/server/shows/schedule';
import { loadSocietySettings } from '$lib/server/people/society-settings';
import type { Actions, PageServerLoad } from './$types';
import { refusedForm } from '$lib/server/http/refusals';

const CLASS_FIELDS = [
	'divisionId',
	'code',
	'name',
	'description',
	'habit',
	'blossomTypes',
	'blossomColours',
	'foliage',
	'minCrowns',
	'maxCrowns',
	'collectionSize',
	'maxDiameterIn',
	'possessionMonths',
	'maxEntriesPerExhibitor',
	'maxEntriesPerVariety',
	'maxPotIn',
	'plantKind',
	'scaleId'
] as const;
const optionalId = z.uuid().nullable().catch(null);

export const load: PageServerLoad = async (event) => {
	const { show } = await requireShowRole(event, event.params.slug, ['chair']);
	const [divisions, scales, settings] = await Promise.all([
		loadSchedule(show.id),
		listScales(show.societyId),
		loadSocietySettings(show.societyId)
	]);
	return {
		show: {
			name: show.name,
			slug: show.slug,
			generalRules: show.generalRules ?? '',
			committee: show.committee ?? ''
		},
		divisions,
		scales,
		lengthUnit: settings.lengthUnit
	};
};

/** Runs a schedule change in one transaction; a refusal becomes a 400 with its field. */
async function attempt(
	change: (transaction: import('sequelize').Transaction) => Promise<unknown>,
	extra: Record<string, unknown> = {}
) {
	try {
		await sequelize.transaction(change);
		return null;
	} catch (e) {
		return refusedForm(e, (r) => ({ errors: { [r.field ?? 'form']: r.message }, ...extra }));
	}
}

export const actions: Actions = {
	saveDivision: async (event) => {
		const { show } = await requireShowRole(event, event.params.slug, ['chair']);
		const form = await event.request.formData();
		const values = textFields(form, ['code', 'name', 'kind']);
		const parsed = divisionSchema.safeParse(values);
		if (!parsed.success) {
			return fail(400, {
				message: 'Check the division’s fields.',
				errors: fieldErrors(parsed.error),
				division: values
			});
		}
		const id = optionalId.parse(form.get('id') || null);
		const failed = await attempt(
			(t) => saveDivision(show.id, id, parsed.data, { transaction: t }),
			{
				division: values
			}
		);
		return failed ?? { saved: `Division ${parsed.data.code} is saved.` };
	},
	deleteDivision: async (event) => {
		const { show, user } = await requireShowRole(event, event.params.slug, ['chair']);
		const form = await event.request.formData();
		const id = optionalId.parse(form.get('id'));
		if (!id) return fail(400, { message: 'Say which division to remove.' });
		const unconfirmed = requireConfirmation(event, form, 'Remove this division and its classes?');
		if (unconfirmed) return unconfirmed;
		const failed = await attempt((t) => deleteDivision(show, id, { transaction: t, actor: user }));
		return failed ?? { saved: 'The division is removed.' };
	},
	saveClass: async (event) => {
		const { show } = await requireShowRole(event, event.params.slug, ['chair']);
		const form = await event.request.formData();
		const values = textFields(form, CLASS_FIELDS);
		const parsed = classSchema.safeParse({
			...values,
			sizeClasses: form.getAll('sizeClasses'),
			genera: form.getAll('genera'),
			growthForms: form.getAll('growthForms'),
			rootTypes: form.getAll('rootTypes'),
			speciesOnly: form.get('speciesOnly') === 'on'
		});
		if (!parsed.success) {
			return fail(400, {
				message: 'Check the highlighted fields; the class was not saved.',
				errors: fieldErrors(parsed.error),
				classValues: values
			});
		}
		const id = optionalId.parse(form.get('id') || null);
		const failed = await attempt((t) => saveClass(show, id, parsed.data, { transaction: t }), {
			classValues: values
		});
		return failed ?? { saved: `Class ${parsed.data.code} is saved.` };
	},
	deleteClass: async (event) => {
		const { show, user } = await requireShowRole(event, event.params.slug, ['chair']);
		const form = await event.request.formData();
		const id = optionalId.parse(form.get('id'));
		if (!id) return fail(400, { message: 'Say which class to remove.' });
		const unconfirmed = requireConfirmation(event, form, 'Remove this class from the schedule?');
		if (unconfirmed) return unconfirmed;
		const failed = await attempt((t) => deleteClass(show, id, { transaction: t, actor: user }));
		return failed ?? { saved: 'The class is removed.' };
	},
	moveDivision: async (event) => move(event, moveDivision),
	moveClass: async (event) => move(event, moveClass),
	saveText: async (event) => {
		const { show } = await requireShowRole(event, event.params.slug, ['chair']);
		const form = await event.request.formData();
		const values = textFields(form, ['part', 'text']);
		const parsed = scheduleTextSchema.safeParse(values);
		if (!parsed.success) {
			const errors = fieldErrors(parsed.error);
			return fail(400, {
				message: errors.part ?? 'Check the text; it was not saved.',
				errors: { [values.part === 'committee' ? 'committee' : 'generalRules']: errors.text ?? '' },
				textValues: { [values.part]: values.text }
			});
		}
		const failed = await attempt((t) => saveScheduleText(show, parsed.data, { transaction: t }));
		return (
			failed ?? {
				saved:
					parsed.data.part === 'committee'
						? 'The committee is saved.'
						: 'The general rules are saved.'
			}
		);
	}
};

/** Moves a division or class one place up or down. */
async function move(
	event: Parameters<Actions[string]>[0],
	change: typeof moveDivision | typeof moveClass
) {
	const { show } = await requireShowRole(event, event.params.slug ?? '', ['chair']);
	const form = await event.request.formData();
	const parsed = moveSchema.safeParse(textFields(form, ['id', 'direction']));
	if (!parsed.success) {
		return fail(400, {
			message: parsed.error.issues[0].message,
			errors: fieldErrors(parsed.error)
		});
	}
	const failed = await attempt((t) => change(show, parsed.data, { transaction: t }));
	return failed ?? { saved: 'The schedule’s order is saved.' };
}
