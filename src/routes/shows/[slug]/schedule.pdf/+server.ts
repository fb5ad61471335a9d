import { cachedSchedulePdf } from '$lib/server/cache/schedule-pdf';
import { pdfResponse, renderPdf } from '$lib/server/pdf/render';
import { scheduleDocument } from '$lib/server/pdf/schedule';
import { loadPublicSchedule } from '$lib/server/services/public-schedule';
import type { RequestHandler } from './$types';

/** The schedule as a PDF, made from the same data as the page (kept until that data changes). */
export const GET: RequestHandler = async ({ params, locals }) => {
	const { show, divisions } = await loadPublicSchedule(params.slug, locals.user);
	const pdf = await cachedSchedulePdf(show.slug, { show, divisions }, () =>
		renderPdf(scheduleDocument(show, divisions))
	);
	return pdfResponse(pdf, `schedule-${show.slug}.pdf`);
};
