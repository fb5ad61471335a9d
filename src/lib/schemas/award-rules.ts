import { z } from 'zod';
import { text } from './text';
import { DEFAULT_AWARD_RULES, type AwardRules } from '$lib/domain/awards';

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
		honourable: points('Honourable mention')
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
		.max(40)
});

/** Reads stored award rules, filling what is missing from the defaults; throws on nonsense. */
export function readAwardRules(stored: unknown): AwardRules {
	const s = (stored && typeof stored === 'object' ? stored : {}) as Partial<AwardRules>;
	const d = DEFAULT_AWARD_RULES;
	return awardRulesSchema.parse({
		system: s.system ?? d.system,
		merit: { ...d.merit, ...s.merit },
		placement: { ...d.placement, ...s.placement },
		bestInClassMin: s.bestInClassMin === undefined ? d.bestInClassMin : s.bestInClassMin,
		tieBreak: { ...d.tieBreak, ...s.tieBreak },
		sweepstakesTieBreak: s.sweepstakesTieBreak ?? d.sweepstakesTieBreak,
		topAwards: s.topAwards ?? []
	});
}
