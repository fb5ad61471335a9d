import { z } from 'zod';
import { text } from './text';
import { MAX_HONORABLE_MENTIONS } from '$lib/domain/awards';

const points = (what: string) =>
	z.coerce
		.number({ error: `${what}: enter a number.` })
		.refine(Number.isFinite, `${what}: enter a number.`)
		.min(0, `${what}: cannot be below 0.`)
		.max(1000, `${what}: too large.`);

/** A show's award rules as stored in shows.award_rules (missing parts take the defaults). */
export const awardRulesSchema = z.object({
	system: z.enum(['merit', 'placement'], 'Choose merit or placement judging.'),
	merit: z.object({
		blue: points('Blue ribbon'),
		red: points('Red ribbon'),
		white: points('White ribbon')
	}),
	placement: z.object({
		first: points('First place'),
		second: points('Second place'),
		third: points('Third place'),
		honourable: points('Honorable mention')
	}),
	bestInClassMin: points('Best in class minimum').nullable(),
	tieBreak: z.object({
		criterionKey: text().trim().min(1).max(60).nullable(),
		useJudgesChoice: z.boolean()
	}),
	sweepstakesTieBreak: z.enum(['none', 'most_red', 'highest_total'], 'Choose a tie-break.'),
	topAwards: z
		.array(
			z.object({
				id: text().trim().min(1).max(80),
				name: text().trim().min(1, 'Name the top award.').max(160),
				classIds: z.array(z.uuid()).min(1, 'Choose at least one class.'),
				minScore: points('Top award minimum')
			})
		)
		.max(40),
	honorableMentions: z.object({
		rule: z.enum(['one', 'number', 'all'], 'Choose how many honorable mentions a class may give.'),
		count: z.coerce
			.number({ error: 'Honorable mentions: enter a whole number.' })
			.int(`Honorable mentions: enter a whole number from 1 to ${MAX_HONORABLE_MENTIONS}.`)
			.min(1, `Honorable mentions: enter a whole number from 1 to ${MAX_HONORABLE_MENTIONS}.`)
			.max(
				MAX_HONORABLE_MENTIONS,
				`Honorable mentions: enter a whole number from 1 to ${MAX_HONORABLE_MENTIONS}.`
			)
	}),
	meanRounding: z.enum(['tenth', 'whole'], 'Choose how a panel’s mean is rounded.'),
	topAwardsPerPlant: z.enum(
		['several', 'one'],
		'Choose whether a plant may take several top awards.'
	)
});
