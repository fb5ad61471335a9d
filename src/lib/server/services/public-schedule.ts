import { error } from '@sveltejs/kit';
import { hasRole } from '../policies';
import { findShowOr404 } from '../policies/show';
import { Society } from '../db';
import { loadSchedule, settingsOf, type ScheduleDivision, type ShowSettings } from './schedule';

/**
 * A show's schedule for its public page and PDF: anyone once it is published, before that only
 * the society's officers (admin, chair, clerk). 404 otherwise, so drafts stay unseen.
 */
export async function loadPublicSchedule(
	slug: string,
	viewer: App.SignedInUser | null
): Promise<{ show: ShowSettings & { societyName: string }; divisions: ScheduleDivision[] }> {
	const show = await findShowOr404(slug);
	const published = show.schedulePublishedAt !== null;
	if (!published && !hasRole(viewer, ['admin', 'chair', 'clerk'], show.societyId)) {
		error(404, 'There is no show at this address.');
	}
	const [society, divisions] = await Promise.all([
		Society.findByPk(show.societyId, { attributes: ['name'] }),
		loadSchedule(show.id)
	]);
	return { show: { ...settingsOf(show), societyName: society?.name ?? '' }, divisions };
}
