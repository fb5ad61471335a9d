import { error } from '@sveltejs/kit';
import { z } from 'zod';
import { memberAndId } from '$lib/server/plants/plant-route';
import { potLabelsDocument } from '$lib/server/plants/pot-labels-pdf';
import { pdfResponse, renderPdf } from '$lib/server/pdf/render';
import { listPlants } from '$lib/server/plants/plants';
import { loadMemberSettings } from '$lib/server/people/society-today';
import type { RequestHandler } from './$types';

const idsSchema = z.array(z.uuid()).min(1).max(500);

/**
 * The label sheet of the chosen plants of the member's own collection, on the paper of their
 * society (the first where they are a member, or ?society=slug).
 */
export const GET: RequestHandler = async (event) => {
	const { user } = memberAndId(event);
	const parsed = idsSchema.safeParse(event.url.searchParams.getAll('plant'));
	if (!parsed.success) error(400, 'Tick at least one plant to label.');
	const wanted = new Set(parsed.data);
	const [all, settings] = await Promise.all([
		listPlants(user.id),
		loadMemberSettings(user, event.url.searchParams.get('society'))
	]);
	const plants = all.filter((p) => wanted.has(p.id));
	if (plants.length === 0) error(400, 'Tick at least one plant to label.');
	const pdf = await renderPdf(
		potLabelsDocument(
			plants.map((p) => ({
				varietyName: p.varietyName,
				label: p.label,
				obtainedHow: p.obtainedHow,
				obtainedOn: p.obtainedOn
			})),
			settings.paperSize
		)
	);
	return pdfResponse(pdf, 'pot-labels.pdf');
};
