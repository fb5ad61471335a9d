import { hasRole } from '$lib/server/policies';
import { loadPublicSchedule } from '$lib/server/shows/public-schedule';
import { todayIn } from '$lib/domain/dates';
import { entriesStillOpen } from '$lib/server/entries/entries';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ params, locals }) => {
	const { show, divisions, settings } = await loadPublicSchedule(params.slug, locals.user);
	const { awardRules, ...rest } = show;
	const today = todayIn(settings.timeZone);
	return {
		show: {
			...rest,
			awardRules: {
				system: awardRules.system,
				merit: awardRules.merit,
				placement: awardRules.placement
			}
		},
		divisions,
		lengthUnit: settings.lengthUnit,
		currency: settings.currency,
		entriesOpenNow:
			today >= show.entriesOpen && entriesStillOpen({ entriesClose: show.entriesClose }, today),
		canEnter: hasRole(locals.user, ['member'])
	};
};
