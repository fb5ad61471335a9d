import { error, type RequestEvent } from '@sveltejs/kit';
import { z } from 'zod';
import { requireRole, societiesWithRole } from '../policies';

const uuid = z.uuid();

/**
 * The signed-in member, the societies where they are a member (whose registries they grow from)
 * and, when the route has one, a well-formed id from the path (404 otherwise, never a 500).
 */
export function memberAndId(
	event: Pick<RequestEvent, 'url' | 'locals'>,
	id?: string
): { user: App.SignedInUser; societyIds: string[]; id: string } {
	const user = requireRole(event, ['member']);
	if (id !== undefined && !uuid.safeParse(id).success) error(404, 'This plant does not exist.');
	return { user, societyIds: societiesWithRole(user, ['member']), id: id ?? '' };
}

/** Turns zod issues into one message per field for fail(400, ...). */
export function fieldErrors(error: z.ZodError): Record<string, string> {
	const errors: Record<string, string> = {};
	for (const issue of error.issues) {
		const key = String(issue.path[0] ?? 'form');
		errors[key] ??= issue.message;
	}
	return errors;
}
