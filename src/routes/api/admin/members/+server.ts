import { error, json } from '@sveltejs/kit';
import { z } from 'zod';
import { memberQuerySchema } from '$lib/schemas/members';
import { requireRole } from '$lib/server/policies';
import { listMembers } from '$lib/server/services/members';
import type { RequestHandler } from './$types';

/** The admin's members table: sorted, filtered and paged in the database. */
export const GET: RequestHandler = async (event) => {
	const params = Object.fromEntries(event.url.searchParams);
	const society = z.uuid().safeParse(params.society);
	if (!society.success) error(400, 'Name the society (society=<id>).');
	requireRole(event, ['admin'], society.data);
	const parsed = memberQuerySchema.safeParse({
		...params,
		role: params.role || undefined,
		standing: params.standing || undefined
	});
	if (!parsed.success) {
		return json(
			{ message: 'Check the filters.', errors: z.flattenError(parsed.error).fieldErrors },
			{ status: 400 }
		);
	}
	return json(await listMembers(society.data, parsed.data));
};
