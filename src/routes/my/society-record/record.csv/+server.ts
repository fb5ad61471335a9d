import { buildRecordCsv } from '$lib/server/results/record-csv';
import { csvResponse } from '$lib/server/results/csv';
import { societyRecordFor } from '$lib/server/society-record';
import type { RequestHandler } from './$types';

/** The society's record of varieties as CSV, for its members. */
export const GET: RequestHandler = async (event) => {
	const view = await societyRecordFor(event);
	return csvResponse(buildRecordCsv(view.entered, view.levels), `${view.society.slug}-record.csv`);
};
