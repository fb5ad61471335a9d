import { json } from '@sveltejs/kit';
import { z } from 'zod';
import { parseMemberQuery } from '$lib/schemas/members';
import { requireRole } from '$lib/server/policies';
import { listMembers } from '$lib/server/people/members';
import { chooseSociety } from '$lib/server/people/society-choice';
import type { RequestHandler } from './$types';

/**
 * The admin's members table (?society=<slug>): sorted, filtered and paged in the database.
 * 403 for a society the person is not an admin of; 400 with the problems for bad filters.
 */
export const GET: RequestHandler = async (event) => {
	const user = requireRole(event, ['admin']);
	const society = chooseSociety(user, ['admin'], event.url.searchParams.get('society'));
	const parsed = parseMemberQuery(event.url.searchParams);
	if (!parsed.success) {
		return json(
			{ message: 'Check the filters.', errors: z.flattenError(parsed.error).fieldErrors },
			{ status: 400 }
		);
	}
	return json(await listMembers(society.societyId, parsed.data));
};
