import { requireConfirmation } from '$lib/server/http/confirm';
import { requireShowRole } from '$lib/server/shows/policies';
import { findDeskEntries } from '$lib/server/entries/desk';
import { deskWindowOf } from '$lib/server/entries/desk-entries';
import { fixEntryNumbersNow } from '$lib/server/entries/entry-numbers';
import type { Actions, PageServerLoad } from './$types';
import { refusedForm } from '$lib/server/http/refusals';

const ROLES = ['clerk', 'chair'] as const;

export const load: PageServerLoad = async (event) => {
	const { show } = await requireShowRole(event, event.params.slug, ROLES);
	const q = (event.url.searchParams.get('q') ?? '').slice(0, 80);
	const window = await deskWindowOf(show);
	return {
		show: {
			name: show.name,
			slug: show.slug,
			entryDay: show.entryDay,
			numbersFixed: show.entryNumbersFixedAt !== null
		},
		deskEntries: window.open ? null : window.reason,
		q,
		hits: await findDeskEntries(show.id, q)
	};
};

export const actions: Actions = {
	/** Fixes the show's entry numbers now, in shuffled order (else the first check-in does). */
	fixNumbers: async (event) => {
		const { show, user } = await requireShowRole(event, event.params.slug, ROLES);
		const form = await event.request.formData();
		const unconfirmed = requireConfirmation(event, form, 'Fix the entry numbers now?');
		if (unconfirmed) return unconfirmed;
		try {
			const fixed = await fixEntryNumbersNow(show.id, user);
			return {
				saved: fixed
					? 'The entry numbers are fixed in shuffled order. Print the tags now.'
					: 'The entry numbers were fixed already.'
			};
		} catch (e) {
			return refusedForm(e);
		}
	}
};
