import { z } from 'zod';
import { text } from './text';
import { AUDIT_ACTIONS, type AuditAction } from '$lib/audit';
import { isIsoDate } from '$lib/domain/dates';

const day = text().refine(
	(v) => isIsoDate(v) && v >= '2000-01-01' && v <= '2999-12-31',
	'Give a real date.'
);

/** The audit log page's filters, each checked on its own (a bad one is dropped, not fatal). */
export const auditQueryFields = {
	action: z.enum(Object.keys(AUDIT_ACTIONS) as [AuditAction, ...AuditAction[]]),
	person: z.uuid(),
	from: day,
	to: day,
	page: z.coerce.number().int().min(1).max(10_000)
};

/** The filters of a log page; dates are whole days (YYYY-MM-DD), inclusive. */
export interface AuditQuery {
	action?: AuditAction;
	person?: string;
	from?: string;
	to?: string;
	page: number;
}

/**
 * Reads the filters from the address. Empty values mean "any"; values that are not understood
 * are left out and named in `ignored`, so the page says so instead of failing.
 */
export function readAuditQuery(params: URLSearchParams): { query: AuditQuery; ignored: string[] } {
	const query: AuditQuery = { page: 1 };
	const ignored: string[] = [];
	for (const name of ['action', 'person', 'from', 'to', 'page'] as const) {
		const values = params.getAll(name);
		if (values.length === 0 || (values.length === 1 && values[0] === '')) continue;
		const parsed = values.length === 1 ? auditQueryFields[name].safeParse(values[0]) : null;
		if (!parsed?.success) {
			ignored.push(name);
			continue;
		}
		if (name === 'page') query.page = parsed.data as number;
		else if (name === 'action') query.action = parsed.data as AuditAction;
		else if (name === 'person') query.person = parsed.data as string;
		else query[name] = parsed.data as string;
	}
	if (query.from && query.to && query.from > query.to) {
		ignored.push('to');
		delete query.to;
	}
	return { query, ignored };
}
