import type { NotJudgedReason } from '$lib/domain/scoring';

/** Plain words for the reasons a plant is left unjudged. */
export const NOT_JUDGED_LABELS: Record<NotJudgedReason, string> = {
	wrong_class: 'Wrong class',
	suckers: 'Suckers on a single-crown plant',
	pests: 'Pests',
	not_in_bloom: 'Not in bloom',
	other: 'Other reason'
};
