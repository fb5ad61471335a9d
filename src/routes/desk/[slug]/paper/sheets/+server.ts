import { json } from '@sveltejs/kit';
import { requireShowRole } from '$lib/server/shows/policies';
import { paperSheetsDocument } from '$lib/server/judging/paper-sheets-pdf';
import { pdfResponse, renderPdf } from '$lib/server/pdf/render';
import { isUuid } from '$lib/server/judging/judging';
import { loadPaperClasses } from '$lib/server/judging/paper-sheets';
import { loadSocietySettings } from '$lib/server/people/society-settings';
import type { RequestHandler } from './$types';

/** Paper judging sheets as a PDF: every class of the show, or ?class=<id> for one. */
export const GET: RequestHandler = async (event) => {
	const { show } = await requireShowRole(event, event.params.slug, ['clerk', 'chair']);
	const classId = event.url.searchParams.get('class');
	if (classId !== null && !isUuid(classId)) {
		return json(
			{ message: 'Name the class by its id, as the paper sheets page links it.' },
			{ status: 400 }
		);
	}
	const [classes, settings] = await Promise.all([
		loadPaperClasses(show.id, classId ?? undefined),
		loadSocietySettings(show.societyId)
	]);
	if (classId !== null && classes.length === 0) {
		return json({ message: 'That class is not in this show.' }, { status: 404 });
	}
	const pdf = await renderPdf(paperSheetsDocument(show, classes, settings.paperSize));
	return pdfResponse(pdf, `judging-sheets-${show.slug}.pdf`);
};
