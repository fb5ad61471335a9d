import { fail, type ActionFailure } from '@sveltejs/kit';
import type { z } from 'zod';
import { refusedForm } from './refusals';

/**
 * Runs a form action: parses the form with a zod schema, runs the work, and turns bad input or a
 * refusal into fail(status, { message, field }) so the page shows it and nothing changes.
 */
export async function runFormAction<S extends z.ZodType>(
	form: FormData,
	schema: S,
	work: (input: z.infer<S>) => Promise<string>
): Promise<{ ok: true; message: string } | ActionFailure<{ message: string; field?: string }>> {
	const parsed = schema.safeParse(Object.fromEntries(form));
	if (!parsed.success) {
		const issue = parsed.error.issues[0];
		return fail(400, { message: issue.message, field: String(issue.path[0] ?? '') });
	}
	try {
		return { ok: true, message: await work(parsed.data) };
	} catch (err) {
		return refusedForm(err);
	}
}
