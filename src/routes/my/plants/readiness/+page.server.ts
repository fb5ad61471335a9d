import { error, fail } from '@sveltejs/kit';
import { z } from 'zod';
import { todayIn } from '$lib/domain/dates';
import { sequelize } from '$lib/server/db';
import { memberAndId } from '$lib/server/plants/plant-route';
import { createEntryFromPlant } from '$lib/server/plants/plant-entries';
import {
	assessCollections,
	listUpcomingShows,
	loadShowForReadiness
} from '$lib/server/plants/readiness';
import { loadLastTimes } from '$lib/server/results/my-results';
import { loadMemberSettings, societyToday } from '$lib/server/people/society-today';
import type { Actions, PageServerLoad } from './$types';
import { refusedForm } from '$lib/server/http/refusals';

const ORDER = { ready: 0, needs_work: 1, cannot_enter: 2, no_class: 3 } as const;

export const load: PageServerLoad = async (event) => {
	const { user, societyIds } = memberAndId(event);
	const settings = await loadMemberSettings(user);
	const shows = await listUpcomingShows(societyIds, todayIn(settings.timeZone));
	const asked = event.url.searchParams.get('show');
	const chosen = asked ? shows.find((s) => s.id === asked) : shows[0];
	if (asked && !chosen) error(404, 'This show is not one of your upcoming shows.');
	if (!chosen) return { shows, show: null, classes: [], plants: [] };
	// The show's own society decides its "today" (entry window, possession period).
	const show = await loadShowForReadiness(chosen.id, await societyToday(chosen.societyId));
	if (!show) error(404, 'This show is not one of your upcoming shows.');
	const plants = (await assessCollections(show, [user.id])).get(user.id) ?? [];
	plants.sort(
		(a, b) =>
			Number(a.entry !== null) - Number(b.entry !== null) ||
			ORDER[a.readiness.status] - ORDER[b.readiness.status]
	);
	const lastTimes = await loadLastTimes(
		user.id,
		plants.map((p) => p.plantId)
	);
	return {
		shows,
		show: { id: show.id, name: show.name, ...show.context },
		classes: show.classes.map((c) => ({ id: c.id, code: c.code, name: c.name })),
		plants: plants.map((p) => ({ ...p, lastTime: lastTimes.get(p.plantId) ?? null }))
	};
};

const enterSchema = z.object({ showId: z.uuid(), classId: z.uuid(), plantId: z.uuid() });

export const actions: Actions = {
	enter: async (event) => {
		const { user, societyIds } = memberAndId(event);
		const form = await event.request.formData();
		const parsed = enterSchema.safeParse(Object.fromEntries(form));
		if (!parsed.success) return fail(400, { message: 'Choose a plant and a class to enter.' });
		const settings = await loadMemberSettings(user);
		const upcoming = await listUpcomingShows(societyIds, todayIn(settings.timeZone));
		if (!upcoming.some((s) => s.id === parsed.data.showId)) {
			return fail(400, { message: 'This show is not one of your upcoming shows.' });
		}
		try {
			const entry = await sequelize.transaction((transaction) =>
				createEntryFromPlant(user.id, parsed.data, { transaction })
			);
			return { entered: entry.number, plantId: parsed.data.plantId };
		} catch (err) {
			return refusedForm(err, () => ({ plantId: parsed.data.plantId }));
		}
	}
};
