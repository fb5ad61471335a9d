import { z } from 'zod';
import { text } from './text';
import { markOrderProblems } from '$lib/domain/awards';
import { GENUS_KEYS, GROWTH_FORMS } from '$lib/domain/plant-groups';
import { isIsoDate } from '$lib/domain/dates';
import { CONTROL_CHARS_MESSAGE, hasNoControlChars } from './text';

const isoDate = (label: string) =>
	text({ error: `Give the ${label}.` })
		.trim()
		.refine((v) => isIsoDate(v), `Give the ${label} as a date (YYYY-MM-DD).`);

const wholeNumber = (label: string, min: number, max: number) =>
	z.coerce
		.number({ error: `Give ${label} as a number.` })
		.int(`Give ${label} as a whole number.`)
		.min(min, `${label[0].toUpperCase()}${label.slice(1)} must be at least ${min}.`)
		.max(max, `${label[0].toUpperCase()}${label.slice(1)} must be at most ${max}.`);

const score = (label: string) => wholeNumber(label, 0, 100);

/** Form: a show's dates, venue and rules, as the show chair sets them. */
export const showSettingsSchema = z
	.object({
		name: text().trim().min(3, 'Give the show a name.').max(160, 'Keep the name short.'),
		venue: text().trim().max(240, 'Keep the venue under 240 characters.'),
		publicHours: text().trim().max(240, 'Keep the public hours under 240 characters.'),
		entriesOpen: isoDate('day entries open'),
		entriesClose: isoDate('day entries close'),
		entryDay: isoDate('entry day'),
		judgingDay: isoDate('judging day'),
		possessionMonths: wholeNumber('the possession period', 0, 24),
		maxEntriesPerClass: wholeNumber('the entries per class', 1, 20),
		maxEntriesPerVariety: wholeNumber('the entries per variety', 1, 20),
		requireGoodStanding: z.boolean(),
		awardSystem: z.enum(['merit', 'placement'], 'Choose merit or placement judging.'),
		blue: score('the blue ribbon mark'),
		red: score('the red ribbon mark'),
		white: score('the white ribbon mark'),
		first: score('the first place minimum'),
		second: score('the second place minimum'),
		third: score('the third place minimum'),
		honourable: score('the honorable mention minimum')
	})
	.superRefine((v, ctx) => {
		const order: [keyof typeof v, keyof typeof v, string][] = [
			['entriesOpen', 'entriesClose', 'Entries must close on or after the day they open.'],
			['entriesClose', 'entryDay', 'Entry day must be on or after the day entries close.'],
			['entryDay', 'judgingDay', 'Judging day must be on or after entry day.']
		];
		for (const [a, b, message] of order) {
			if (String(v[a]) > String(v[b])) ctx.addIssue({ code: 'custom', path: [b], message });
		}
		// The order of the marks is the domain's rule (markOrderProblems); its fields are flat here.
		const marks = {
			merit: { blue: v.blue, red: v.red, white: v.white },
			placement: { first: v.first, second: v.second, third: v.third, honourable: v.honourable }
		};
		for (const problem of markOrderProblems(marks)) {
			const field = problem.field.split('.')[1];
			ctx.addIssue({ code: 'custom', path: [field], message: problem.message });
		}
	});
export type ShowSettingsInput = z.infer<typeof showSettingsSchema>;

/** Form: a division of the schedule. */
export const divisionSchema = z.object({
	code: text().trim().min(1, 'Give the division a code, like IV.').max(8, 'Keep the code short.'),
	name: text().trim().min(2, 'Give the division a name.').max(160, 'Keep the name short.'),
	kind: z.enum(['horticulture', 'design', 'other'], 'Choose horticulture, design or other.')
});
export type DivisionInput = z.infer<typeof divisionSchema>;

export const SIZE_CLASSES = ['miniature', 'semiminiature', 'standard', 'large'] as const;

const optionalCount = (label: string, max: number) =>
	z.preprocess(
		(v) => (v === '' || v === null || v === undefined ? null : v),
		z.coerce
			.number({ error: `Give ${label} as a number.` })
			.int(`Give ${label} as a whole number.`)
			.min(1, `${label[0].toUpperCase()}${label.slice(1)} must be at least 1.`)
			.max(max, `${label[0].toUpperCase()}${label.slice(1)} must be at most ${max}.`)
			.nullable()
	);

const optionalWhole = (label: string, min: number, max: number) =>
	z.preprocess(
		(v) => (v === '' || v === null || v === undefined ? null : v),
		z.coerce
			.number({ error: `Give ${label} as a number.` })
			.int(`Give ${label} as a whole number.`)
			.min(min, `${label[0].toUpperCase()}${label.slice(1)} must be at least ${min}.`)
			.max(max, `${label[0].toUpperCase()}${label.slice(1)} must be at most ${max}.`)
			.nullable()
	);

/** Words typed as a comma-separated list: trimmed, lower case, no blanks or repeats. */
export const wordList = text()
	.max(400, 'Keep the list shorter.')
	.transform((v) => [
		...new Set(
			v
				.split(',')
				.map((w) => w.trim().toLowerCase())
				.filter(Boolean)
		)
	])
	.refine((list) => list.every((w) => w.length <= 40), 'Each word must be under 40 characters.');

/** Form: a class of the schedule with its structured eligibility. */
export const classSchema = z
	.object({
		divisionId: z.uuid('Choose a division.'),
		code: text().trim().min(1, 'Give the class a code, like 12.').max(8, 'Keep the code short.'),
		name: text().trim().min(2, 'Give the class a name.').max(160, 'Keep the name short.'),
		description: text().trim().max(2000, 'Keep the description shorter.'),
		habit: z.enum(['single_crown', 'trailer', 'any'], 'Choose single crown, trailer or either.'),
		sizeClasses: z.array(z.enum(SIZE_CLASSES, 'Unknown size class.')).max(4),
		blossomTypes: wordList,
		blossomColours: wordList,
		foliage: z.enum(['plain', 'variegated', 'any'], 'Choose plain, variegated or any foliage.'),
		minCrowns: optionalCount('the fewest crowns', 50),
		maxCrowns: optionalCount('the most crowns', 50),
		collectionSize: optionalCount('the collection size', 12),
		speciesOnly: z.boolean(),
		maxDiameterIn: z.preprocess(
			(v) => (v === '' || v === null || v === undefined ? null : v),
			z.coerce
				.number({ error: 'Give the largest diameter as a number of inches.' })
				.positive('The largest diameter must be more than 0.')
				.max(60, 'The largest diameter must be at most 60 in.')
				.nullable()
		),
		possessionMonths: optionalWhole('the class’s possession period', 0, 24),
		maxEntriesPerExhibitor: optionalCount('the entries per exhibitor', 20),
		maxEntriesPerVariety: optionalCount('the entries per variety', 20),
		maxPotIn: z.preprocess(
			(v) => (v === '' || v === null || v === undefined ? null : v),
			z.coerce
				.number({ error: 'Give the largest pot as a number of inches.' })
				.positive('The largest pot must be more than 0.')
				.max(24, 'The largest pot must be at most 24 in.')
				.nullable()
		),
		plantKind: z
			.enum(['any', 'african_violet', 'other_gesneriad'], 'Choose the group the class is for.')
			.optional(),
		genera: z
			.array(z.enum(GENUS_KEYS as [string, ...string[]], 'Unknown genus.'))
			.max(20)
			.optional(),
		growthForms: z
			.array(z.enum(GROWTH_FORMS as [string, ...string[]], 'Unknown growth form.'))
			.max(10)
			.optional(),
		rootTypes: z
			.array(z.enum(['tuberous', 'rhizomatous', 'fibrous'], 'Unknown root type.'))
			.max(3)
			.optional(),
		scaleId: z.preprocess(
			(v) => (v === '' ? null : v),
			z.uuid('Choose a scale of points.').nullable()
		)
	})
	.superRefine((v, ctx) => {
		if (v.minCrowns !== null && v.maxCrowns !== null && v.minCrowns > v.maxCrowns) {
			ctx.addIssue({
				code: 'custom',
				path: ['maxCrowns'],
				message: 'The most crowns must be at least the fewest crowns.'
			});
		}
		if (v.plantKind === 'african_violet' && (v.genera?.length ?? 0) > 0) {
			ctx.addIssue({
				code: 'custom',
				path: ['genera'],
				message:
					'A class for African violets takes no other genus; untick the genera, or make it a class for the other gesneriads.'
			});
		}
	});
export type ClassInput = z.infer<typeof classSchema>;

/** The texts of a schedule the chair writes: the general rules and the show committee. */
export const SCHEDULE_TEXTS = {
	generalRules: { label: 'general rules', max: 4000 },
	committee: { label: 'committee list', max: 2000 }
} as const;

/** Form: one of the schedule's own texts, printed in the PDF; empty clears it. */
export const scheduleTextSchema = z
	.object({
		part: z.enum(['generalRules', 'committee'], 'Say which text of the schedule to save.'),
		text: z.string().trim().refine(hasNoControlChars, CONTROL_CHARS_MESSAGE)
	})
	.superRefine((v, ctx) => {
		const { label, max } = SCHEDULE_TEXTS[v.part];
		if (v.text.length > max) {
			ctx.addIssue({
				code: 'custom',
				path: ['text'],
				message: `Keep the ${label} under ${max.toLocaleString('en-US')} characters.`
			});
		}
	});
export type ScheduleTextInput = z.infer<typeof scheduleTextSchema>;

/** Form: move a division or class one place up or down in the schedule. */
export const moveSchema = z.object({
	id: z.uuid('Say what to move.'),
	direction: z.enum(['up', 'down'], 'Move up or down.')
});
export type MoveInput = z.infer<typeof moveSchema>;
