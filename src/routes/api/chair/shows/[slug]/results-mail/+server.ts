import { json } from '@sveltejs/kit';
import { requireChairShow } from '$lib/server/results/chair-access';
import { mailProgress } from '$lib/server/mail/outbox';
import { RESULTS_MAIL_KIND } from '$lib/server/results/show-results';
import type { RequestHandler } from './$types';

/** Sending progress of the placements e-mails, polled by the chair's results page. */
export const GET: RequestHandler = async (event) => {
	const { show } = await requireChairShow(event, event.params.slug);
	const progress = await mailProgress(show.id, RESULTS_MAIL_KIND);
	return json(progress, { headers: { 'cache-control': 'no-store' } });
};
