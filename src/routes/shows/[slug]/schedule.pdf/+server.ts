import { cachedSchedulePdf } from '$lib/server/shows/schedule-pdf-cache';
import { pdfResponse, renderPdf } from '$lib/server/pdf/render';
import { scheduleDocument } from '$lib/server/shows/schedule-pdf';
import { loadPublicSchedule } from '$lib/server/shows/public-schedule';
import type { RequestHandler } from './$types';

/**
 * The schedule as a PDF, made from the same data as the page, on the society's paper (kept until
 * that data or the society's settings change).
 */
export const GET: RequestHandler = async ({ params, locals }) => {
	const { show, divisions, settings } = await loadPublicSchedule(params.slug, locals.user);
	const pdf = await cachedSchedulePdf(show.slug, { show, divisions, settings }, () =>
		renderPdf(scheduleDocument(show, divisions, settings))
	);
	return pdfResponse(pdf, `schedule-${show.slug}.pdf`);
};
