import { error, json } from '@sveltejs/kit';
import { text } from '$lib/schemas/text';
import { z } from 'zod';
import { requireUser } from '$lib/server/policies';
import { searchVarieties } from '$lib/server/plants/varieties';
import type { RequestHandler } from './$types';

const query = z.object({
	society: z.uuid('Say which society’s registry to search.'),
	q: text().max(80, 'Search with fewer than 80 characters.').default('')
});

/** Search-as-you-type in a society's variety registry, for anyone who belongs to the society. */
export const GET: RequestHandler = async (event) => {
	const user = requireUser(event);
	const parsed = query.safeParse({
		society: event.url.searchParams.get('society') ?? '',
		q: event.url.searchParams.get('q') ?? ''
	});
	if (!parsed.success) {
		return json({ message: parsed.error.issues[0].message }, { status: 400 });
	}
	if (!user.memberships.some((m) => m.societyId === parsed.data.society)) {
		error(403, 'You do not belong to that society.');
	}
	const varieties = await searchVarieties(parsed.data.society, parsed.data.q, 20);
	return json({ varieties });
};
