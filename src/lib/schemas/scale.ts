import { z } from 'zod';
import { MAX_CRITERIA, validateScaleDraft, withKeys, type ScaleDraft } from '$lib/domain/scales';

const row = z.object({
	key: z.string().trim().max(60, 'A criterion key is too long.').optional(),
	label: z.string().max(400, 'Keep the criterion name shorter.'),
	maxPoints: z.string().max(20, 'Give the points as a number.')
});

/**
 * Form: a scale of points. Rows left wholly blank are dropped; the rest must each have a name
 * and points (see `validateScaleDraft` for the rules).
 */
export const scaleSchema = z
	.object({
		name: z.string().max(400, 'Keep the name under 120 characters.'),
		criteria: z
			.array(row)
			.max(MAX_CRITERIA + 10, `A scale may have at most ${MAX_CRITERIA} criteria.`)
	})
	.transform((v, ctx): ScaleDraft => {
		const rows = v.criteria.filter((c) => c.label.trim() || c.maxPoints.trim());
		const parsed = rows.map((c, i) => {
			const text = c.maxPoints.trim().replace(',', '.');
			const points = text === '' ? Number.NaN : Number(text);
			if (text !== '' && !Number.isFinite(points)) {
				ctx.addIssue({
					code: 'custom',
					path: ['criteria', i],
					message: `Criterion ${i + 1}: give the points as a number, like 25.`
				});
			}
			return { key: c.key, label: c.label, maxPoints: points };
		});
		const draft = { name: v.name.trim(), criteria: withKeys(parsed) };
		for (const problem of validateScaleDraft(draft)) {
			ctx.addIssue({
				code: 'custom',
				path: problem.field.split('.').map((p) => (/^\d+$/.test(p) ? Number(p) : p)),
				message: problem.message
			});
		}
		return draft;
	});

/** The criteria rows of a scale form, read from repeated fields `label`, `maxPoints`, `key`. */
export function scaleFormValues(form: FormData): z.input<typeof scaleSchema> {
	const texts = (name: string) => form.getAll(name).map((v) => (typeof v === 'string' ? v : ''));
	const labels = texts('label');
	const points = texts('maxPoints');
	const keys = texts('key');
	const name = form.get('name');
	return {
		name: typeof name === 'string' ? name : '',
		criteria: labels.map((label, i) => ({
			label,
			maxPoints: points[i] ?? '',
			key: keys[i] || undefined
		}))
	};
}
