import { error } from '@sveltejs/kit';
import { buildRecordCsv } from '$lib/server/results/record-csv';
import { csvResponse } from '$lib/server/results/csv';
import { societyRecordFor } from '$lib/server/results/society-record';
import type { RequestHandler } from './$types';

/** The society's record of varieties as CSV, for its members (?society=slug picks one). */
export const GET: RequestHandler = async (event) => {
	const names = [...event.url.searchParams.keys()];
	if (names.some((n) => n !== 'society') || names.length > 1) {
		error(400, 'This download takes only the society (?society=…).');
	}
	const view = await societyRecordFor(event);
	return csvResponse(buildRecordCsv(view.entered, view.levels), `${view.society.slug}-record.csv`);
};
