import { z } from 'zod';
import { text } from './text';
import { SIZE_CLASSES, wordList } from './show';

const HABIT_WORDS: Record<string, 'single_crown' | 'trailer'> = {
	single_crown: 'single_crown',
	'single crown': 'single_crown',
	single: 'single_crown',
	trailer: 'trailer'
};

/** A variety of the registry, as a form or a CSV row gives it. */
export const varietySchema = z.object({
	name: text()
		.trim()
		.min(1, 'Give the variety name.')
		.max(120, 'Keep the name under 120 characters.'),
	hybridizer: text().trim().max(120, 'Keep the hybridizer under 120 characters.'),
	habit: text({ error: 'Give the habit: single crown or trailer.' })
		.trim()
		.toLowerCase()
		.transform((v) => HABIT_WORDS[v.replace(/-/g, ' ')] ?? HABIT_WORDS[v])
		.refine((v) => v !== undefined, 'Give the habit as single crown or trailer.')
		.transform((v) => v as 'single_crown' | 'trailer'),
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
	description: text().trim().max(2000, 'Keep the description under 2000 characters.')
});
export type VarietyInput = z.infer<typeof varietySchema>;

/** The columns a registry CSV file must have (header row), in the order we write them. */
export const VARIETY_CSV_COLUMNS = [
	'name',
	'hybridizer',
	'habit',
	'size_class',
	'blossom_type',
	'blossom_colours',
	'foliage',
	'species',
	'description'
] as const;
