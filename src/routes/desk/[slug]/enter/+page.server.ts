import { fail, redirect } from '@sveltejs/kit';
import { deskEntrySchema } from '$lib/schemas/desk';
import { sequelize } from '$lib/server/db';
import { fieldErrors, textFields } from '$lib/server/http/forms';
import { requireShowRole } from '$lib/server/shows/policies';
import {
	DeskEntryRefused,
	deskWindowOf,
	enterAtDesk,
	findDeskExhibitors,
	listDeskClasses
} from '$lib/server/entries/desk-entries';
import { loadSocietySettings } from '$lib/server/people/society-settings';
import type { Actions, PageServerLoad } from './$types';
import { refusedForm } from '$lib/server/http/refusals';

const ROLES = ['clerk', 'chair'] as const;
const FIELDS = [
	'memberId',
	'walkInName',
	'walkInEmail',
	'walkInHousehold',
	'classId',
	'varietyId',
	'acquiredOn',
	'diameter',
	'leaf',
	'crowns',
	'potSize',
	'unit'
] as const;

export const load: PageServerLoad = async (event) => {
	const { show } = await requireShowRole(event, event.params.slug, ROLES);
	const q = (event.url.searchParams.get('who') ?? '').slice(0, 80);
	const [window, settings, classes, people] = await Promise.all([
		deskWindowOf(show),
		loadSocietySettings(show.societyId),
		listDeskClasses(show.id),
		findDeskExhibitors(show, q)
	]);
	return {
		show: { name: show.name, slug: show.slug, societyId: show.societyId },
		closed: window.open ? null : window.reason,
		lengthUnit: settings.lengthUnit,
		classes,
		q,
		people
	};
};

export const actions: Actions = {
	enter: async (event) => {
		const { show, user } = await requireShowRole(event, event.params.slug, ROLES);
		const values = textFields(await event.request.formData(), FIELDS);
		// A member chosen from the list, else the walk-in's fields.
		values.who = values.memberId ? 'member' : 'walk_in';
		const parsed = deskEntrySchema.safeParse(values);
		if (!parsed.success) {
			return fail(400, {
				message: 'Check the marked fields; nothing was entered.',
				errors: fieldErrors(parsed.error),
				values
			});
		}
		let entered: { number: number };
		try {
			entered = await sequelize.transaction((transaction) =>
				enterAtDesk(show.id, user, parsed.data, { transaction })
			);
		} catch (e) {
			return refusedForm(e, (r) =>
				r instanceof DeskEntryRefused
					? {
							message: 'The plant does not fit the class; nothing was entered.',
							failures: r.failures,
							values
						}
					: { values }
			);
		}
		redirect(303, `/desk/${show.slug}/entries/${entered.number}?entered=1`);
	}
};
