import type { z } from 'zod';

/** The first message for each field of a failed zod parse, keyed by field name. */
export function fieldErrors(error: z.ZodError): Record<string, string> {
	const out: Record<string, string> = {};
	for (const issue of error.issues) {
		const key = issue.path.length ? String(issue.path[0]) : 'form';
		if (!(key in out)) out[key] = issue.message;
	}
	return out;
}

/** The text fields of a form as a plain object (files and repeated fields left out). */
export function textFields(form: FormData, names: readonly string[]): Record<string, string> {
	const out: Record<string, string> = {};
	for (const name of names) {
		const value = form.get(name);
		out[name] = typeof value === 'string' ? value : '';
	}
	return out;
}
