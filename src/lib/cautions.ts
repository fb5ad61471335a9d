/**
 * The cautions that go with any growing advice the product gives (grooming, pest treatment),
 * as DOMAIN.md asks; no medical or legal advice.
 */
export const GROWING_CAUTIONS = [
	'For any pesticide, follow the product label and your local regulations.',
	'Keep sharp tools and chemicals away from children.'
] as const;

/** The cautions in one line, for e-mail and short notes. */
export const GROWING_CAUTION_LINE = GROWING_CAUTIONS.join(' ');
