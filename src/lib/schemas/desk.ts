import { z } from 'zod';
import { CONTROL_CHARS_MESSAGE, hasNoControlChars, text } from './text';
import { LENGTH_UNITS } from '$lib/domain/units';
import { DESK_ENTRIES_UNTIL } from '$lib/domain/desk-window';

const measure = (label: string, max: number) =>
	z.coerce
		.number({ error: `Give the ${label} as a number.` })
		.positive(`The ${label} must be more than 0.`)
		.max(max, `The ${label} must be at most ${max}.`);

/**
 * Form: what the clerk measured at check-in, in inches or centimeters. The longest leaf blade is
 * asked only of plants sized by the leaf (a miniature Sinningia); left empty it is not measured.
 */
export const checkInSchema = z.object({
	diameter: measure('diameter', 150),
	leaf: z.preprocess(
		(v) => (v === '' || v === null ? undefined : v),
		measure('longest leaf blade', 60).optional()
	),
	crowns: z.coerce
		.number({ error: 'Give the number of crowns.' })
		.int('Give the crowns as a whole number.')
		.min(1, 'A plant has at least one crown.')
		.max(50, 'Count at most 50 crowns.'),
	potSize: measure('pot size', 60),
	unit: z.enum(LENGTH_UNITS as ['in', 'cm'], 'Choose inches or centimeters.')
});
export type CheckInInput = z.infer<typeof checkInSchema>;

/** Form: move an entry to another class. */
export const moveSchema = z.object({ classId: z.uuid('Choose a class.') });

/** Form: scratch an entry, with a short reason for the record. */
export const scratchSchema = z.object({
	reason: text()
		.trim()
		.min(2, 'Say briefly why.')
		.max(240, 'Keep the reason short.')
		.refine(hasNoControlChars, CONTROL_CHARS_MESSAGE)
});

/** Query of the entries table: sorting, filters and paging, all done by the server. */
export const entriesQuerySchema = z.object({
	sort: z.enum(['number', 'class', 'variety', 'exhibitor', 'status', 'checkedIn']).catch('number'),
	dir: z.enum(['asc', 'desc']).catch('asc'),
	q: text().trim().max(80).catch(''),
	classId: z.uuid().or(z.literal('')).catch(''),
	status: z.enum(['', 'entered', 'checked_in', 'scratched', 'withdrawn']).catch(''),
	page: z.coerce.number().int().min(0).max(10_000).catch(0),
	size: z.coerce.number().int().min(5).max(100).catch(25)
});
export type EntriesQuery = z.infer<typeof entriesQuerySchema>;

/** One row of the entries table for the chair and clerks, as the entries API answers it. */
export interface EntryTableRow {
	id: string;
	number: number;
	classCode: string;
	className: string;
	variety: string;
	exhibitor: string;
	status: string;
	diameterIn: number | null;
	crowns: number | null;
	checkedInAt: string | null;
}

const optionalText = (max: number, tooLong: string) =>
	text()
		.trim()
		.max(max, tooLong)
		.refine(hasNoControlChars, CONTROL_CHARS_MESSAGE)
		.transform((v) => (v === '' ? null : v));

/** Form: a plant entered at the desk for a member (found by name) or for a walk-in exhibitor. */
export const deskEntrySchema = checkInSchema
	.extend({
		who: z.enum(['member', 'walk_in'], 'Choose a member or a walk-in exhibitor.'),
		memberId: z.uuid('Choose the member from the list.').or(z.literal('')),
		walkInName: optionalText(120, 'Keep the name under 120 characters.'),
		walkInEmail: text()
			.trim()
			.toLowerCase()
			.max(254, 'Keep the address under 254 characters.')
			.pipe(z.email('Enter a complete e-mail address, like name@example.org.').or(z.literal('')))
			.transform((v) => (v === '' ? null : v)),
		walkInHousehold: optionalText(120, 'Keep the household under 120 characters.'),
		classId: z.uuid('Choose a class.'),
		varietyId: z.uuid('Choose a variety from the registry.'),
		acquiredOn: z
			.union([z.iso.date('Give the date as a calendar date.'), z.literal('')])
			.transform((v) => (v === '' ? null : v))
	})
	.superRefine((v, ctx) => {
		if (v.who === 'member' && !v.memberId) {
			ctx.addIssue({
				code: 'custom',
				path: ['memberId'],
				message: 'Choose the member from the list.'
			});
		}
		if (v.who === 'walk_in' && !v.walkInName) {
			ctx.addIssue({
				code: 'custom',
				path: ['walkInName'],
				message: 'Write the walk-in exhibitor’s name.'
			});
		}
	});
export type DeskEntryInput = z.infer<typeof deskEntrySchema>;

/** The chair's choice of until when the desk takes new entries. */
export const deskEntriesUntilSchema = z.object({
	until: z.enum(DESK_ENTRIES_UNTIL, { error: 'Choose until when the desk takes new entries.' })
});
