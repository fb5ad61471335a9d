import { error } from '@sveltejs/kit';
import { isShowDocument, keptShowPdf } from '$lib/server/results/documents/show-pdf';
import { pdfResponse } from '$lib/server/pdf/render';
import { requireChairShow } from '$lib/server/results/chair-access';
import { buildResultsCsv, csvResponse } from '$lib/server/results/csv';
import { loadShowResults } from '$lib/server/results/show-results';
import type { RequestHandler } from './$types';

/**
 * The chair's printable documents and the full CSV (with comments). The PDFs are the ones kept
 * for this publication and paper (built by the worker, see results/documents/show-pdf.ts): served unchanged,
 * or 503 with Retry-After while one is being built.
 */
export const GET: RequestHandler = async (event) => {
	const { document, slug } = event.params;
	if (!isShowDocument(document) && document !== 'results.csv') {
		error(404, 'This page does not exist.');
	}
	const { show } = await requireChairShow(event, slug);
	if (!show.publishedAt)
		error(409, 'Publish the results first; the documents print what was published.');
	if (document === 'results.csv') {
		const results = await loadShowResults(show.id);
		if (!results) error(404, 'This page does not exist.');
		return csvResponse(
			buildResultsCsv(results, { includeComments: true }),
			`${slug}-results-with-comments.csv`
		);
	}
	const pdf = await keptShowPdf(show.id, document);
	if (!pdf) {
		return new Response(
			'This document is not built yet; the results page shows its progress and can build it.',
			{ status: 503, headers: { 'Retry-After': '5', 'Content-Type': 'text/plain; charset=utf-8' } }
		);
	}
	return pdfResponse(pdf, `${slug}-${document}`);
};
