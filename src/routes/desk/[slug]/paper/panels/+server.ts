import { json } from '@sveltejs/kit';
import { requireShowRole } from '$lib/server/shows/policies';
import { panelClassListDocument } from '$lib/server/judging/paper-sheets-pdf';
import { pdfResponse, renderPdf } from '$lib/server/pdf/render';
import { isUuid } from '$lib/server/judging/judging';
import { loadPaperPanels } from '$lib/server/judging/paper-sheets';
import { loadSocietySettings } from '$lib/server/people/society-settings';
import type { RequestHandler } from './$types';

/** Class lists per panel as a PDF: every panel of the show, or ?panel=<id> for one. */
export const GET: RequestHandler = async (event) => {
	const { show } = await requireShowRole(event, event.params.slug, ['clerk', 'chair']);
	const panelId = event.url.searchParams.get('panel');
	if (panelId !== null && !isUuid(panelId)) {
		return json(
			{ message: 'Name the panel by its id, as the paper sheets page links it.' },
			{ status: 400 }
		);
	}
	const [panels, settings] = await Promise.all([
		loadPaperPanels(show.id, panelId ?? undefined),
		loadSocietySettings(show.societyId)
	]);
	if (panelId !== null && panels.length === 0) {
		return json({ message: 'That panel is not in this show.' }, { status: 404 });
	}
	const pdf = await renderPdf(panelClassListDocument(show, panels, settings.paperSize));
	return pdfResponse(pdf, `class-lists-${show.slug}.pdf`);
};
