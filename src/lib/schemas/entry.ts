import { z } from 'zod';
import { text } from './text';
import { isIsoDate } from '$lib/domain/dates';

/** An entry the exhibitor asks for (form and API): a class, a variety and the day they got it. */
export const entryRequestSchema = z.object({
	showSlug: text().trim().min(1, 'Say which show.').max(80),
	classId: z.uuid('Choose a class from the schedule.'),
	varietyId: z.uuid('Choose a variety from the registry.'),
	acquiredOn: text({ error: 'Give the day you got the plant.' })
		.trim()
		.refine((v) => isIsoDate(v), {
			error: 'Give the day you got the plant as a date (YYYY-MM-DD).',
			abort: true
		})
		// Dates far off (9999-12-31) are no one's plant; the possession period is counted from it.
		.refine(
			(v) => v >= '1900-01-01' && v <= '2100-12-31',
			'Give the day you got the plant as a real date (1900 to 2100).'
		)
});
export type EntryRequest = z.infer<typeof entryRequestSchema>;
