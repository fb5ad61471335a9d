import { json } from '@sveltejs/kit';
import { requireShowRole } from '$lib/server/shows/policies';
import { pdfResponse, renderPdf } from '$lib/server/pdf/render';
import { entryTagsDocument } from '$lib/server/entries/tags-pdf';
import { listTagEntries } from '$lib/server/entries/desk';
import { loadSocietySettings } from '$lib/server/people/society-settings';
import type { RequestHandler } from './$types';

/** Entry tags as a PDF: ?numbers=3,17 for some entries, or every active entry of the show. */
export const GET: RequestHandler = async (event) => {
	const { show } = await requireShowRole(event, event.params.slug, ['clerk', 'chair']);
	const raw = event.url.searchParams.get('numbers');
	let numbers: number[] | null = null;
	if (raw !== null) {
		const parts = raw
			.split(',')
			.map((p) => p.trim())
			.filter(Boolean);
		if (!parts.length || parts.length > 500 || !parts.every((p) => /^\d{1,9}$/.test(p))) {
			return json(
				{ message: 'Give entry numbers separated by commas, like 3,17.' },
				{ status: 400 }
			);
		}
		numbers = parts.map(Number);
	}
	const [entries, settings] = await Promise.all([
		listTagEntries(show.id, numbers),
		loadSocietySettings(show.societyId)
	]);
	const pdf = await renderPdf(
		await entryTagsDocument(show, entries, event.url.origin, settings.paperSize)
	);
	return pdfResponse(pdf, `tags-${show.slug}.pdf`);
};
