import { z } from 'zod';
import { text } from './text';
import { addCalendarDays, compareIsoDates, isIsoDate, todayIn } from '$lib/domain/dates';
import { OBTAINED_HOW, PLANT_EVENT_KINDS, PROPAGATED } from '$lib/domain/readiness';
import { toInches } from '$lib/domain/units';

/**
 * A past (or today's) calendar date. "Today" is UTC's, and tomorrow is let through, so a grower
 * in any time zone (up to UTC+14) can give their own today.
 */
const pastDate = (what: string) =>
	text(`Give the date ${what}.`)
		.trim()
		.refine((d) => isIsoDate(d) && d >= '1900-01-01', {
			error: `Give the date ${what} as a real date.`,
			abort: true
		})
		.refine(
			(d) => compareIsoDates(d, addCalendarDays(todayIn('UTC'), 1)) <= 0,
			`The date ${what} cannot be in the future.`
		);

const optionalText = (max: number, what: string) =>
	text()
		.trim()
		.max(max, `Keep the ${what} under ${max} characters.`)
		.optional()
		.transform((v) => (v ? v : null));

const optionalId = text()
	.trim()
	.optional()
	.transform((v) => (v ? v : null))
	.pipe(z.uuid('Choose a plant from the list.').nullable());

/** An optional length with its unit, stored in inches (1 in = 2.54 cm, NIST SP 811). */
function optionalLength(what: string, min: number, max: number) {
	return z
		.object({
			value: text()
				.trim()
				.optional()
				.transform((v) => (v ? v.replace(',', '.') : '')),
			unit: z.enum(['in', 'cm']).catch('in')
		})
		.transform((l, ctx) => {
			if (l.value === '') return null;
			const n = Number(l.value);
			const inches = Number.isFinite(n) && n > 0 ? toInches(n, l.unit) : NaN;
			if (!(inches >= min && inches <= max)) {
				ctx.addIssue({
					code: 'custom',
					message: `Give the ${what} as a number from ${min} to ${max} in (${(min * 2.54).toFixed(1)} to ${(max * 2.54).toFixed(0)} cm).`
				});
				return z.NEVER;
			}
			return Math.round(inches * 100) / 100;
		});
}

/** Form: a plant of the member's collection. */
export const plantSchema = z
	.object({
		varietyId: z.uuid('Choose the variety.'),
		label: optionalText(80, 'name tag'),
		obtainedHow: z.enum(OBTAINED_HOW, 'Choose how you got the plant.'),
		obtainedOn: pastDate('you got or potted the plant'),
		parentId: optionalId,
		potSize: optionalLength('pot size', 1, 12),
		notes: optionalText(2000, 'notes')
	})
	.superRefine((p, ctx) => {
		if (p.parentId && !PROPAGATED.includes(p.obtainedHow)) {
			ctx.addIssue({
				code: 'custom',
				path: ['parentId'],
				message: 'Only a plant rooted from a leaf or a sucker, or divided, has a parent plant.'
			});
		}
	});

export type PlantInput = z.infer<typeof plantSchema>;

/** Form: one event of a plant's log. */
export const plantEventSchema = z
	.object({
		kind: z.enum(PLANT_EVENT_KINDS, 'Choose what you did.'),
		happenedOn: pastDate('it happened'),
		diameter: optionalLength('diameter', 0.5, 40),
		crowns: text()
			.trim()
			.optional()
			.transform((v) => (v ? Number(v) : null))
			.pipe(
				z
					.number('Give the crowns as a whole number.')
					.int('Give the crowns as a whole number.')
					.min(1, 'A plant has at least 1 crown.')
					.max(99, 'Count at most 99 crowns.')
					.nullable()
			),
		potSize: optionalLength('pot size', 1, 12),
		note: optionalText(500, 'note')
	})
	.superRefine((e, ctx) => {
		if (e.kind === 'measured' && e.diameter === null && e.crowns === null) {
			ctx.addIssue({
				code: 'custom',
				path: ['diameter'],
				message: 'Give the diameter, the crowns, or both.'
			});
		}
		if (e.kind === 'sucker_potted') {
			ctx.addIssue({
				code: 'custom',
				path: ['kind'],
				message: 'Use "Pot up a sucker" to pot a sucker as a new plant.'
			});
		}
	});

export type PlantEventInput = z.infer<typeof plantEventSchema>;

/** Form: pot up a removed sucker as a new plant of the collection. */
export const potSuckerSchema = z.object({
	happenedOn: pastDate('you potted it'),
	potSize: optionalLength('pot size', 1, 12),
	label: optionalText(80, 'name tag')
});

export type PotSuckerInput = z.infer<typeof potSuckerSchema>;

/** Form: a photo caption. */
export const photoSchema = z.object({ caption: optionalText(160, 'caption') });

/** Reads a length field pair (name, name + 'Unit') from form data for the schemas above. */
export function lengthField(form: FormData, name: string): { value: string; unit: string } {
	return { value: String(form.get(name) ?? ''), unit: String(form.get(`${name}Unit`) ?? 'in') };
}

/** Form: which optional e-mails a person wants. */
export const mailPreferencesSchema = z.object({
	reminders: z.boolean(),
	results: z.boolean()
});
