import { error } from '@sveltejs/kit';
import { hasRole } from '../policies';
import { findShowOr404 } from './policies';
import { Society } from '../db';
import type { SocietySettings } from '$lib/domain/society-settings';
import { loadSocietySettings } from '../people/society-settings';
import { loadSchedule, settingsOf, type ScheduleDivision, type ShowSettings } from './schedule';

/**
 * A show's schedule for its public page and PDF: anyone once it is published, before that only
 * the society's officers (admin, chair, clerk). 404 otherwise, so drafts stay unseen. Comes with
 * the society's settings (paper, unit, time zone, currency) that the page and PDF follow.
 */
export async function loadPublicSchedule(
	slug: string,
	viewer: App.SignedInUser | null
): Promise<{
	show: ShowSettings & { societyName: string; entryFeeCents: number };
	divisions: ScheduleDivision[];
	settings: SocietySettings;
}> {
	const show = await findShowOr404(slug);
	const published = show.schedulePublishedAt !== null;
	if (!published && !hasRole(viewer, ['admin', 'chair', 'clerk'], show.societyId)) {
		error(404, 'There is no show at this address.');
	}
	const [society, divisions, settings] = await Promise.all([
		Society.findByPk(show.societyId, { attributes: ['name'] }),
		loadSchedule(show.id),
		loadSocietySettings(show.societyId)
	]);
	return {
		show: {
			...settingsOf(show),
			societyName: society?.name ?? '',
			entryFeeCents: show.entryFeeCents
		},
		divisions,
		settings
	};
}
