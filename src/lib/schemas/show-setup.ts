import { z } from 'zod';
import { isIsoDate } from '$lib/domain/dates';
import { CONTROL_CHARS_MESSAGE, hasNoControlChars } from './text';

const date = (label: string) =>
	z
		.string({ error: `Give the ${label}.` })
		.trim()
		.refine((v) => isIsoDate(v), `Give the ${label} as a date (YYYY-MM-DD).`);

/** A date the chair may leave empty (a copy then moves the earlier show's date). */
const optionalDate = (label: string) =>
	z
		.string()
		.trim()
		.refine((v) => v === '' || isIsoDate(v), `Give the ${label} as a date (YYYY-MM-DD).`)
		.optional()
		.transform((v) => v || undefined);

/** Short names that are pages of their own and so cannot name a show. */
const RESERVED_SLUGS = ['new'];

/** The short name of a show in its addresses: lower-case words joined by single hyphens. */
export const showSlug = z
	.string({ error: 'Give a short name for the show’s addresses.' })
	.trim()
	.toLowerCase()
	.min(3, 'Make the short name at least 3 characters.')
	.max(80, 'Keep the short name under 80 characters.')
	.regex(
		/^[a-z0-9]+(?:-[a-z0-9]+)*$/,
		'Use lower-case letters, digits and single hyphens in the short name, like spring-2028.'
	)
	.refine(
		(v) => !RESERVED_SLUGS.includes(v),
		'That short name is kept for a page; choose another.'
	);

const common = {
	societyId: z.uuid('Choose the society.'),
	name: z
		.string()
		.trim()
		.min(3, 'Give the show a name.')
		.max(160, 'Keep the name short.')
		.refine(hasNoControlChars, CONTROL_CHARS_MESSAGE),
	slug: showSlug,
	venue: z
		.string()
		.trim()
		.max(240, 'Keep the venue under 240 characters.')
		.refine(hasNoControlChars, CONTROL_CHARS_MESSAGE)
		.default('')
};

/** Form: a new, empty show. */
export const newShowSchema = z.object({
	...common,
	entriesOpen: date('day entries open'),
	entriesClose: date('day entries close'),
	entryDay: date('entry day'),
	judgingDay: date('judging day'),
	awardSystem: z.enum(['merit', 'placement'], 'Choose merit or placement judging.'),
	panelScoreMethod: z.enum(
		['mean', 'consensus'],
		'Choose whether each judge keeps a sheet or the panel agrees one sheet.'
	)
});
export type NewShowInput = z.infer<typeof newShowSchema>;

/** Form: a show copied from an earlier show of the same society, on new dates. */
export const copyShowSchema = z.object({
	...common,
	sourceShowId: z.uuid('Choose the earlier show to copy.'),
	judgingDay: date('judging day'),
	entriesOpen: optionalDate('day entries open'),
	entriesClose: optionalDate('day entries close'),
	entryDay: optionalDate('entry day')
});
/** What copyShow reads: the parsed form (dates left empty may be left out). */
export type CopyShowInput = z.input<typeof copyShowSchema>;
