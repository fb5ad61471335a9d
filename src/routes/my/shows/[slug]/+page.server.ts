import { error, fail } from '@sveltejs/kit';
import { z } from 'zod';
import { entryRequestSchema } from '$lib/schemas/entry';
import { sequelize } from '$lib/server/db';
import { requireConfirmation } from '$lib/server/http/confirm';
import { fieldErrors, textFields } from '$lib/server/http/forms';
import { requireShowRole } from '$lib/server/shows/policies';
import {
	EntryRefused,
	enterPlant,
	entriesStillOpen,
	listMyEntriesInShow,
	withdrawEntry
} from '$lib/server/entries/entries';
import { loadSchedule } from '$lib/server/shows/schedule';
import { societyToday } from '$lib/server/people/society-today';
import type { Actions, PageServerLoad } from './$types';
import { fieldErrorOf, refusedForm } from '$lib/server/http/refusals';

export const load: PageServerLoad = async (event) => {
	const { show, user } = await requireShowRole(event, event.params.slug, ['member']);
	// A show whose schedule is not published is not there yet, for members as for the public.
	if (!show.schedulePublishedAt) error(404, 'There is no show at this address.');
	const [divisions, entries, today] = await Promise.all([
		loadSchedule(show.id),
		listMyEntriesInShow(show.id, user.id),
		societyToday(show.societyId)
	]);
	return {
		show: {
			slug: show.slug,
			name: show.name,
			societyId: show.societyId,
			entriesOpen: show.entriesOpen,
			entriesClose: show.entriesClose,
			judgingDay: show.judgingDay
		},
		open: today >= show.entriesOpen && entriesStillOpen(show, today),
		classes: divisions
			.filter((d) => d.kind === 'horticulture')
			.flatMap((d) =>
				d.classes
					.filter((c) => c.collectionSize === null)
					.map((c) => ({ value: c.id, label: `${d.code} · ${c.code}. ${c.name}` }))
			),
		entries
	};
};

export const actions: Actions = {
	enter: async (event) => {
		const { show, user } = await requireShowRole(event, event.params.slug, ['member']);
		const form = await event.request.formData();
		const values = textFields(form, ['classId', 'varietyId', 'acquiredOn']);
		const parsed = entryRequestSchema.safeParse({ ...values, showSlug: show.slug });
		if (!parsed.success) {
			return fail(400, {
				message: 'Check the highlighted fields; nothing was entered.',
				errors: fieldErrors(parsed.error),
				values
			});
		}
		try {
			const entry = await enterPlant(show.id, user.id, parsed.data);
			return { entered: `Entered as number ${entry.number}.`, number: entry.number };
		} catch (e) {
			return refusedForm(e, (r) =>
				r instanceof EntryRefused
					? {
							message: 'This entry was refused; nothing was entered.',
							failures: r.failures,
							values
						}
					: { errors: fieldErrorOf(r), values }
			);
		}
	},
	withdraw: async (event) => {
		const { user } = await requireShowRole(event, event.params.slug, ['member']);
		const form = await event.request.formData();
		const id = z.uuid().safeParse(form.get('entryId'));
		if (!id.success) return fail(400, { message: 'Say which entry to withdraw.' });
		const unconfirmed = requireConfirmation(event, form, 'Withdraw this entry from the show?');
		if (unconfirmed) return unconfirmed;
		const problem = await sequelize.transaction((transaction) =>
			withdrawEntry(user.id, id.data, { transaction })
		);
		if (problem) return fail(400, { message: problem });
		return { withdrawn: 'The entry is withdrawn.' };
	}
};
