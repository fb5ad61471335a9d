import { requireConfirmation } from '$lib/server/http/confirm';
import { sequelize } from '$lib/server/db';
import {
	awardsOf,
	describeAwards,
	loadPublishedAwards,
	loadShowJudging
} from '$lib/server/results/results';
import { publishResultsAndTell } from '$lib/server/results/show-results';
import { requireShowRole } from '$lib/server/shows/policies';
import { loadSocietySettings } from '$lib/server/people/society-settings';
import { formatDateTime } from '$lib/format';
import type { Actions, PageServerLoad } from './$types';
import { refusedForm } from '$lib/server/http/refusals';

export const load: PageServerLoad = async (event) => {
	const { show } = await requireShowRole(event, event.params.slug, ['chair']);
	const [judging, settings] = await Promise.all([
		loadShowJudging(show.id),
		loadSocietySettings(show.societyId)
	]);
	const waiting = judging.entries.filter((e) => e.state === 'waiting' || e.state === 'in_progress');
	const lines = judging.show.published
		? await loadPublishedAwards(show.id)
		: describeAwards(judging, awardsOf(judging));
	return {
		show: {
			name: show.name,
			slug: show.slug,
			published: judging.show.published,
			publishedAt: show.resultsPublishedAt
				? formatDateTime(show.resultsPublishedAt, settings.timeZone)
				: null,
			system: judging.rules.system
		},
		waiting: waiting.length,
		...lines
	};
};

export const actions: Actions = {
	/** Computes and stores the awards and locks scores, all in one transaction. */
	publish: async (event) => {
		const { show, user } = await requireShowRole(event, event.params.slug, ['chair']);
		const form = await event.request.formData();
		const allowIncomplete = form.get('allowIncomplete') === 'on';
		const unconfirmed = requireConfirmation(
			event,
			form,
			'Publish the results? Scores lock and every exhibitor is told.'
		);
		if (unconfirmed) return unconfirmed;
		try {
			const outcome = await sequelize.transaction((transaction) =>
				publishResultsAndTell(user, show.id, {
					transaction,
					allowIncomplete,
					origin: event.url.origin
				})
			);
			return {
				ok: true,
				message: `Results published: ${outcome.awards} awards stored${outcome.ties ? `, ${outcome.ties} ties left for the judges` : ''}. Scores are locked. ${outcome.queued} placements ${outcome.queued === 1 ? 'e-mail is' : 'e-mails are'} on their way.`
			};
		} catch (err) {
			return refusedForm(err);
		}
	}
};
