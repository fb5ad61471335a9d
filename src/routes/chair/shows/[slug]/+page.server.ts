import { fail } from '@sveltejs/kit';
import { showSettingsSchema } from '$lib/schemas/show';
import { sequelize } from '$lib/server/db';
import { requireConfirmation } from '$lib/server/http/confirm';
import { fieldErrors, textFields } from '$lib/server/http/forms';
import { requireShowRole } from '$lib/server/shows/policies';
import { setSchedulePublished, settingsOf, updateShowSettings } from '$lib/server/shows/schedule';
import { setSharePointsLost } from '$lib/server/results/my-results';
import { setDeskEntriesUntil } from '$lib/server/entries/desk-entries';
import { deskEntriesUntilSchema } from '$lib/schemas/desk';
import { DESK_ENTRIES_UNTIL, DESK_ENTRIES_UNTIL_WORDS } from '$lib/domain/desk-window';
import type { Actions, PageServerLoad } from './$types';
import { refusedForm } from '$lib/server/http/refusals';
import type { Refusal } from '$lib/server/http/refusal';

const FIELDS = [
	'name',
	'venue',
	'publicHours',
	'entriesOpen',
	'entriesClose',
	'entryDay',
	'judgingDay',
	'possessionMonths',
	'maxEntriesPerClass',
	'maxEntriesPerVariety',
	'awardSystem',
	'blue',
	'red',
	'white',
	'first',
	'second',
	'third',
	'honourable'
] as const;

export const load: PageServerLoad = async (event) => {
	const { show } = await requireShowRole(event, event.params.slug, ['chair']);
	const started = event.url.searchParams.get('started');
	return {
		show: settingsOf(show),
		sharePointsLost: show.sharePointsLost,
		deskEntriesUntil: show.deskEntriesUntil,
		deskEntriesChoices: DESK_ENTRIES_UNTIL.map((value) => ({
			value,
			label: DESK_ENTRIES_UNTIL_WORDS[value]
		})),
		started: started === 'create' || started === 'copy' ? started : null
	};
};

export const actions: Actions = {
	save: async (event) => {
		const { show } = await requireShowRole(event, event.params.slug, ['chair']);
		const form = await event.request.formData();
		const values = textFields(form, FIELDS);
		const parsed = showSettingsSchema.safeParse({
			...values,
			requireGoodStanding: form.get('requireGoodStanding') === 'on'
		});
		if (!parsed.success) {
			return fail(400, {
				message: 'Check the highlighted fields; nothing was saved.',
				errors: fieldErrors(parsed.error),
				values
			});
		}
		try {
			await sequelize.transaction((transaction) =>
				updateShowSettings(show, parsed.data, { transaction })
			);
		} catch (e) {
			// The award rules' fields are nested (merit.red); this form's are flat (red).
			const field = (r: Refusal) => (r.field ?? 'form').split('.').pop() ?? 'form';
			return refusedForm(e, (r) => ({ errors: { [field(r)]: r.message }, values }));
		}
		return { saved: 'The show’s dates and rules are saved.' };
	},
	sharePoints: async (event) => {
		const { show } = await requireShowRole(event, event.params.slug, ['chair']);
		const choice = (await event.request.formData()).get('share');
		if (choice !== 'yes' && choice !== 'no') {
			return fail(400, { message: 'Choose whether exhibitors see the points lost.' });
		}
		await sequelize.transaction((transaction) =>
			setSharePointsLost(show.id, choice === 'yes', { transaction })
		);
		return {
			saved:
				choice === 'yes'
					? 'Exhibitors will see the points lost per criterion once results are published.'
					: 'Exhibitors will not see the points lost per criterion.'
		};
	},
	deskEntries: async (event) => {
		const { show } = await requireShowRole(event, event.params.slug, ['chair']);
		const parsed = deskEntriesUntilSchema.safeParse({
			until: (await event.request.formData()).get('until')
		});
		if (!parsed.success) {
			return fail(400, { message: parsed.error.issues[0]?.message ?? 'Check the choice.' });
		}
		try {
			await sequelize.transaction((transaction) =>
				setDeskEntriesUntil(show, parsed.data.until, { transaction })
			);
		} catch (e) {
			return refusedForm(e);
		}
		return { saved: `New entries at the desk: ${DESK_ENTRIES_UNTIL_WORDS[parsed.data.until]}.` };
	},
	publish: async (event) => {
		const { show, user } = await requireShowRole(event, event.params.slug, ['chair']);
		const form = await event.request.formData();
		const choice = form.get('published');
		if (choice !== 'yes' && choice !== 'no') {
			return fail(400, { message: 'Choose whether the schedule is public.' });
		}
		const published = choice === 'yes';
		if (!published && show.schedulePublishedAt) {
			const unconfirmed = requireConfirmation(event, form, 'Hide the schedule from the public?');
			if (unconfirmed) return unconfirmed;
		}
		try {
			await sequelize.transaction((transaction) =>
				setSchedulePublished(show, published, { transaction, actor: user })
			);
		} catch (e) {
			return refusedForm(e);
		}
		return {
			saved: published
				? 'The schedule is public now.'
				: 'The schedule is hidden from the public again.'
		};
	}
};
