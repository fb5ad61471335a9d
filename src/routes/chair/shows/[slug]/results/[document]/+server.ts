import { error } from '@sveltejs/kit';
import { pdfResponse } from '$lib/server/pdf/render';
import { renderAwardCards } from '$lib/server/pdf/award-cards';
import { renderAwardSheets } from '$lib/server/pdf/award-sheets';
import { renderRibbonLabels } from '$lib/server/pdf/ribbon-labels';
import { requireChairShow } from '$lib/server/results/chair-access';
import { buildResultsCsv, csvResponse } from '$lib/server/results/csv';
import { loadShowResults } from '$lib/server/services/show-results';
import { loadSocietySettings } from '$lib/server/services/society-settings';
import type { RequestHandler } from './$types';

const PDFS = {
	'award-sheets.pdf': renderAwardSheets,
	'award-cards.pdf': renderAwardCards,
	'ribbon-labels.pdf': renderRibbonLabels
} as const;

/** The chair's printable documents (on the society's paper) and the full CSV (with comments). */
export const GET: RequestHandler = async (event) => {
	const { document, slug } = event.params;
	if (!(document in PDFS) && document !== 'results.csv') error(404, 'This page does not exist.');
	const { show } = await requireChairShow(event, slug);
	if (!show.publishedAt)
		error(409, 'Publish the results first; the documents print what was published.');
	const [results, settings] = await Promise.all([
		loadShowResults(show.id),
		loadSocietySettings(show.societyId)
	]);
	if (!results) error(404, 'This page does not exist.');
	if (document === 'results.csv') {
		return csvResponse(
			buildResultsCsv(results, { includeComments: true }),
			`${slug}-results-with-comments.csv`
		);
	}
	const render = PDFS[document as keyof typeof PDFS];
	return pdfResponse(await render(results, settings.paperSize), `${slug}-${document}`);
};
