import { hasRole } from '$lib/server/policies';
import { loadPublicSchedule } from '$lib/server/services/public-schedule';
import { entriesStillOpen, todayIso } from '$lib/server/services/entries';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ params, locals }) => {
	const { show, divisions } = await loadPublicSchedule(params.slug, locals.user);
	const { awardRules, ...rest } = show;
	const today = todayIso();
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
		entriesOpenNow:
			today >= show.entriesOpen && entriesStillOpen({ entriesClose: show.entriesClose }, today),
		canEnter: hasRole(locals.user, ['member'])
	};
};
