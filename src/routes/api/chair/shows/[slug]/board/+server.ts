import { json } from '@sveltejs/kit';
import { loadBoard } from '$lib/server/results/results';
import { requireShowRole } from '$lib/server/shows/policies';
import type { RequestHandler } from './$types';

/** The progress board as JSON, polled by the chair's board page while judges work. */
export const GET: RequestHandler = async (event) => {
	const { show } = await requireShowRole(event, event.params.slug, ['chair']);
	return json(await loadBoard(show.id), { headers: { 'cache-control': 'no-store' } });
};
