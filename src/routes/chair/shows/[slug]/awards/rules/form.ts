import type { AwardRules } from '$lib/domain/awards';
import { awardRulesSchema } from '$lib/schemas/award-rules';
import { z } from 'zod';

/** Reads the award rules form (flat field names) into rules, or the first problem found. */
export function readRulesForm(
	form: FormData
):
	| { ok: true; rules: AwardRules; method: 'mean' | 'consensus' }
	| { ok: false; message: string; field: string } {
	const text = (name: string) => String(form.get(name) ?? '').trim();
	const num = (name: string) => (text(name) === '' ? Number.NaN : Number(text(name)));
	const topAwards: unknown[] = [];
	const indexes = new Set(
		[...form.keys()].map((k) => /^top\.([^.]+)\.name$/.exec(k)?.[1]).filter((x) => x !== undefined)
	);
	// Keep the listed order (it is the order of precedence for one top award per plant).
	const order = (i: string) => (i === 'new' ? Number.POSITIVE_INFINITY : Number(i));
	for (const i of [...indexes].sort((a, b) => order(a) - order(b) || (a < b ? -1 : 1))) {
		const name = text(`top.${i}.name`);
		if (form.get(`top.${i}.remove`) === 'on' || (i === 'new' && name === '')) continue;
		topAwards.push({
			id:
				text(`top.${i}.id`) ||
				`${name
					.toLowerCase()
					.replace(/[^a-z0-9]+/g, '-')
					.slice(0, 40)}-${Date.now().toString(36)}`,
			name,
			classIds: form.getAll(`top.${i}.classIds`).map(String),
			minScore: num(`top.${i}.minScore`)
		});
	}
	const method = z.enum(['mean', 'consensus']).safeParse(text('method'));
	if (!method.success)
		return { ok: false, message: 'Choose how a panel’s score is found.', field: 'method' };
	const parsed = awardRulesSchema.safeParse({
		system: text('system'),
		merit: { blue: num('merit.blue'), red: num('merit.red'), white: num('merit.white') },
		placement: {
			first: num('placement.first'),
			second: num('placement.second'),
			third: num('placement.third'),
			honourable: num('placement.honourable')
		},
		bestInClassMin: text('bestInClassMin') === '' ? null : num('bestInClassMin'),
		tieBreak: {
			criterionKey: text('tieBreak.criterionKey') || null,
			useJudgesChoice: form.get('tieBreak.useJudgesChoice') === 'on'
		},
		sweepstakesTieBreak: text('sweepstakesTieBreak'),
		topAwards,
		honorableMentions: {
			rule: text('honorableMentions.rule'),
			// The count is read only for "up to a number"; otherwise a blank keeps the form valid.
			count:
				text('honorableMentions.count') === '' && text('honorableMentions.rule') !== 'number'
					? 1
					: num('honorableMentions.count')
		},
		meanRounding: text('meanRounding'),
		topAwardsPerPlant: text('topAwardsPerPlant')
	});
	if (!parsed.success) {
		const issue = parsed.error.issues[0];
		return { ok: false, message: issue.message, field: issue.path.join('.') };
	}
	return { ok: true, rules: parsed.data, method: method.data };
}
