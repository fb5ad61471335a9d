import { z } from 'zod';
import { text } from './text';
import { SIZE_CLASSES, wordList } from './show';
import {
	AFRICAN_VIOLET,
	GROWTH_FORMS,
	checkVarietyGroup,
	findPlantGroup
} from '$lib/domain/plant-groups';

const GROWTH_FORM_WORDS: Record<string, string> = {
	single: 'single_crown',
	singlecrown: 'single_crown',
	singlecrowned: 'single_crown'
};

/** A growth form as typed ("Single crown", "single-crown", "upright") as its key. */
function growthFormKey(typed: string): string {
	const plain = typed
		.trim()
		.toLowerCase()
		.replace(/[\s_-]+/g, '');
	const key = GROWTH_FORMS.find((f) => f.replace(/_/g, '') === plain);
	return key ?? GROWTH_FORM_WORDS[plain] ?? typed.trim().toLowerCase();
}

/** A variety of the registry, as a form or a CSV row gives it. */
export const varietySchema = z
	.object({
		name: text()
			.trim()
			.min(1, 'Give the variety name.')
			.max(120, 'Keep the name under 120 characters.'),
		plantGroup: text({ error: 'Give the group.' })
			.trim()
			.transform((v) => (v ? (findPlantGroup(v)?.key ?? v) : AFRICAN_VIOLET)),
		hybridizer: text().trim().max(120, 'Keep the hybridizer under 120 characters.'),
		growthForm: text({ error: 'Give the growth form.' })
			.trim()
			.min(1, 'Give the growth form, like single crown, trailer, rosette or upright.')
			.max(24, 'Keep the growth form under 24 characters.')
			.transform(growthFormKey),
		sizeClass: text({ error: 'Give the size class.' })
			.trim()
			.toLowerCase()
			.pipe(
				z.enum(SIZE_CLASSES, 'Give the size class as miniature, semiminiature, standard or large.')
			),
		blossomType: text({ error: 'Give the blossom type.' })
			.trim()
			.toLowerCase()
			.min(1, 'Give the blossom type, like single or double.')
			.max(24, 'Keep the blossom type under 24 characters.'),
		blossomColours: wordList,
		foliage: text()
			.trim()
			.toLowerCase()
			.transform((v) => v || 'plain')
			.pipe(z.enum(['plain', 'variegated'], 'Give the foliage as plain or variegated.')),
		isSpecies: z.boolean(),
		botanicalName: text()
			.trim()
			.max(160, 'Keep the botanical name under 160 characters.')
			.transform((v) => v.replace(/\s+/g, ' ')),
		description: text().trim().max(2000, 'Keep the description under 2000 characters.')
	})
	// A violet is a trailer, not "trailing": the violet word for the same form.
	.transform((v) =>
		v.plantGroup === AFRICAN_VIOLET && v.growthForm === 'trailing'
			? { ...v, growthForm: 'trailer' }
			: v
	)
	.superRefine((v, ctx) => {
		for (const problem of checkVarietyGroup({ ...v, botanicalName: v.botanicalName || null })) {
			ctx.addIssue({ code: 'custom', path: [problem.field], message: problem.message });
		}
	});
export type VarietyInput = z.infer<typeof varietySchema>;

/**
 * The columns of a registry CSV file, in the order we write them. An import needs name,
 * growth_form (or the older habit), size_class and blossom_type; group defaults to African
 * violet, and the older header blossom_colours is read as blossom_colors.
 */
export const VARIETY_CSV_COLUMNS = [
	'name',
	'group',
	'hybridizer',
	'species',
	'botanical_name',
	'growth_form',
	'size_class',
	'blossom_type',
	'blossom_colors',
	'foliage',
	'description'
] as const;

/** The CSV column of each field of `varietySchema`, for the reasons given on bad rows. */
export const VARIETY_CSV_COLUMN_OF: Readonly<Record<keyof VarietyInput, string>> = {
	name: 'name',
	plantGroup: 'group',
	hybridizer: 'hybridizer',
	growthForm: 'growth_form',
	sizeClass: 'size_class',
	blossomType: 'blossom_type',
	blossomColours: 'blossom_colors',
	foliage: 'foliage',
	isSpecies: 'species',
	botanicalName: 'botanical_name',
	description: 'description'
};
