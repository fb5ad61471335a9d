import { z } from 'zod';
import { CONTROL_CHARS_MESSAGE, hasNoControlChars, text } from './text';
import { NOT_JUDGED_REASONS } from '$lib/domain/scoring';

/**
 * One change to a score sheet, as a tablet sends it: the whole sheet as the judge left it, the
 * version it was made on, and an id that makes a replay harmless. Deductions are checked against
 * the class's scale by the service (validateDeductions), so any value is accepted here.
 */
export const sheetChangeSchema = z.object({
	changeId: z.uuid('Each change needs an id.'),
	entryId: z.uuid('Unknown entry.'),
	baseVersion: z.int('The sheet version must be a whole number.').min(0).max(1_000_000),
	deductions: z.record(text().max(60), z.unknown(), 'Deductions must be a list of points.'),
	comment: text().max(1000, 'Keep the comment under 1,000 characters.').default(''),
	notJudged: z
		.object({
			reason: z.enum(NOT_JUDGED_REASONS, 'Choose why the entry is not judged.'),
			note: text().trim().max(200, 'Keep the note under 200 characters.').default('')
		})
		.nullable()
		.default(null),
	judgesChoiceRank: z
		.int('The judges’ choice is a whole number.')
		.min(1, 'The judges’ choice starts at 1.')
		.max(99)
		.nullable()
		.default(null)
});

export type SheetChange = z.infer<typeof sheetChangeSchema>;

/** Form: a new panel. */
export const panelNameSchema = z.object({
	name: text()
		.trim()
		.min(1, 'Name the panel.')
		.max(80, 'Keep the name under 80 characters.')
		.refine(hasNoControlChars, CONTROL_CHARS_MESSAGE)
});

/** Form: a person added to (or removed from) a panel. */
export const panelPersonSchema = z.object({
	panelId: z.uuid('Choose a panel.'),
	userId: z.uuid('Choose a person.')
});

/** Form: a panel's clerk (empty for none). */
export const panelClerkSchema = z.object({
	panelId: z.uuid('Choose a panel.'),
	userId: z.union([z.literal(''), z.uuid('Choose a person.')])
});

/** Form: a class assigned to a panel (empty panel: taken off every panel). */
export const panelClassSchema = z.object({
	classId: z.uuid('Choose a class.'),
	panelId: z.union([z.literal(''), z.uuid('Choose a panel.')])
});
