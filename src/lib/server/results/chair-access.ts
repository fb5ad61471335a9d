import { error, type RequestEvent } from '@sveltejs/kit';
import { requireRole } from '../policies';
import { findResultsShow, type ResultsShow } from './show-results';

/** The show at this address, for a chair of its society: 404 unknown, 401/403 otherwise. */
export async function requireChairShow(
	event: Pick<RequestEvent, 'url' | 'locals'>,
	slug: string
): Promise<{ show: ResultsShow; user: App.SignedInUser }> {
	const show = await findResultsShow({ slug });
	if (!show) error(404, 'This page does not exist.');
	const user = requireRole(event, ['chair'], show.societyId);
	return { show, user };
}
