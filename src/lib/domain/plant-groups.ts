/**
 * The groups a variety belongs to: African violets, or a genus of the other gesneriads, each
 * with the growth forms and size classes that its shows use.
 *
 * Gesneriad shows sort plants first by group (violets, Sinningia, Streptocarpus, Episcia, …),
 * then by how they grow (rosette, upright, trailing; tuberous, rhizomatous or fibrous-rooted), and
 * only a few groups have size classes (violets by the diameter of the rosette, miniature Sinningia
 * by the length of the leaf blade). This module is that knowledge as data, so that the variety
 * form, the CSV import, the class rules and the eligibility check read the same table.
 * No framework code here.
 */

import type { SizeClass } from './eligibility';

/** The African violet group's key; every other group is a gesneriad genus. */
export const AFRICAN_VIOLET = 'african_violet';

/** The part of a plant under the soil, by which gesneriad schedules form their sections. */
export type RootType = 'fibrous' | 'tuberous' | 'rhizomatous';

/** Every root type, in the order schedules list their sections. */
export const ROOT_TYPES: readonly RootType[] = ['tuberous', 'rhizomatous', 'fibrous'];

/** Plain names of the root types. */
export const ROOT_TYPE_LABELS: Readonly<Record<RootType, string>> = {
	tuberous: 'tuberous',
	rhizomatous: 'rhizomatous',
	fibrous: 'fibrous-rooted'
};

/** Plain names of every growth form a group may use. */
export const GROWTH_FORM_LABELS: Readonly<Record<string, string>> = {
	single_crown: 'single crown',
	trailer: 'trailer',
	rosette: 'rosette',
	unifoliate: 'unifoliate',
	upright: 'upright',
	trailing: 'trailing'
};

/** The growth forms as a form's choices name them: sentence case, "unifoliate" explained. */
export const GROWTH_FORM_CHOICES: Readonly<Record<string, string>> = Object.fromEntries(
	Object.entries(GROWTH_FORM_LABELS).map(([form, words]) => [
		form,
		capitalized(words) + (form === 'unifoliate' ? ' (one leaf)' : '')
	])
);

/** What a size class is measured by: the span of the rosette, or the longest leaf blade. */
export type SizeMeasure = 'diameter' | 'leaf';

/** A size class of a group with its upper limit in inches (null: no upper limit). */
export interface GroupSizeClass {
	key: SizeClass;
	measure: SizeMeasure;
	maxIn: number | null;
}

/** A group of varieties: African violets, or one genus of the other gesneriads. */
export interface PlantGroup {
	key: string;
	/** The name people read: "African violet", "Sinningia". */
	name: string;
	/** The first word a species' botanical name may start with. */
	genera: readonly string[];
	rootType: RootType;
	/** The growth forms a variety of this group is given; the first is the default. */
	growthForms: readonly string[];
	/** The size classes of this group; the last without an upper limit is the default. */
	sizeClasses: readonly GroupSizeClass[];
}

const unsized: readonly GroupSizeClass[] = [{ key: 'standard', measure: 'diameter', maxIn: null }];

/**
 * The groups, African violets first, then the genera in alphabetical order.
 *
 * Sources: the sections and classes of the New England chapter of The Gesneriad Society's show
 * schedules (2014 and 2022) and of The Gesneriad Society's 2018 convention show schedule:
 * tuberous (Sinningia), rhizomatous (Achimenes, Kohleria, Smithiantha) and fibrous-rooted
 * (Columnea, Episcia, Nematanthus) New World gesneriads; Old World gesneriads (Aeschynanthus,
 * Petrocosmea, Primulina, Saintpaulia, Streptocarpus); Sinningia with rosette or upright growth;
 * miniature Sinningia with a leaf blade of at most 2.5 in; Saintpaulia miniatures up to 6 in and
 * semiminiatures up to 8 in across (2022). The Old World genera being fibrous-rooted, and the
 * Streptocarpus forms (rosette, unifoliate, upright), are from memory.
 */
export const PLANT_GROUPS: readonly PlantGroup[] = [
	{
		key: AFRICAN_VIOLET,
		name: 'African violet',
		genera: ['Saintpaulia', 'Streptocarpus'],
		rootType: 'fibrous',
		growthForms: ['single_crown', 'trailer'],
		sizeClasses: [
			{ key: 'miniature', measure: 'diameter', maxIn: 6 },
			{ key: 'semiminiature', measure: 'diameter', maxIn: 8 },
			{ key: 'standard', measure: 'diameter', maxIn: null },
			{ key: 'large', measure: 'diameter', maxIn: null }
		]
	},
	genus('Achimenes', 'rhizomatous', ['upright', 'trailing']),
	genus('Aeschynanthus', 'fibrous', ['trailing', 'upright']),
	genus('Columnea', 'fibrous', ['trailing', 'upright']),
	genus('Episcia', 'fibrous', ['trailing', 'rosette']),
	genus('Kohleria', 'rhizomatous', ['upright']),
	genus('Nematanthus', 'fibrous', ['upright', 'trailing']),
	genus('Petrocosmea', 'fibrous', ['rosette']),
	genus('Primulina', 'fibrous', ['rosette']),
	genus(
		'Sinningia',
		'tuberous',
		['rosette', 'upright'],
		[
			{ key: 'miniature', measure: 'leaf', maxIn: 2.5 },
			{ key: 'standard', measure: 'diameter', maxIn: null }
		]
	),
	genus('Smithiantha', 'rhizomatous', ['upright']),
	genus('Streptocarpus', 'fibrous', ['rosette', 'unifoliate', 'upright'])
];

function genus(
	name: string,
	rootType: RootType,
	growthForms: string[],
	sizeClasses: readonly GroupSizeClass[] = unsized
): PlantGroup {
	return { key: name.toLowerCase(), name, genera: [name], rootType, growthForms, sizeClasses };
}

const BY_KEY = new Map(PLANT_GROUPS.map((g) => [g.key, g]));

/** Every group key, African violets first. */
export const PLANT_GROUP_KEYS = PLANT_GROUPS.map((g) => g.key);

/** Every gesneriad genus group key (all groups but African violets). */
export const GENUS_KEYS = PLANT_GROUP_KEYS.filter((k) => k !== AFRICAN_VIOLET);

/** Every growth form any group uses. */
export const GROWTH_FORMS = Object.keys(GROWTH_FORM_LABELS);

/** The group of a key; unknown keys throw (no form should let one through). */
export function plantGroupOf(key: string): PlantGroup {
	const group = BY_KEY.get(key);
	if (!group) throw new RangeError(`Unknown plant group '${key}'.`);
	return group;
}

/** Whether a key names a group. */
export function isPlantGroup(key: string): boolean {
	return BY_KEY.has(key);
}

/** Finds a group by its key or its name as people type it ("African violet", "sinningia"). */
export function findPlantGroup(typed: string): PlantGroup | null {
	const plain = typed
		.trim()
		.toLowerCase()
		.replace(/[\s-]+/g, '_');
	if (!plain) return null;
	if (['african_violet', 'african_violets', 'saintpaulia', 'violet'].includes(plain)) {
		return plantGroupOf(AFRICAN_VIOLET);
	}
	return BY_KEY.get(plain) ?? null;
}

/** The size class of a group by key, or null when the group has no such size class. */
export function groupSizeClass(group: PlantGroup, sizeClass: string): GroupSizeClass | null {
	return group.sizeClasses.find((s) => s.key === sizeClass) ?? null;
}

/**
 * The old single-crown/trailer habit that matches a growth form, for code that knows only
 * violets: a violet's habit is its growth form; any other trailing plant counts as a trailer.
 */
export function habitOfGrowthForm(growthForm: string): 'single_crown' | 'trailer' {
	return growthForm === 'trailer' || growthForm === 'trailing' ? 'trailer' : 'single_crown';
}

/**
 * A size class in words, with its limit when it has one: "miniature (leaf blade up to 2.5 in)".
 * `length` writes a length in inches the way the reader wants it.
 */
export function describeGroupSize(
	size: GroupSizeClass,
	length: (inches: number) => string = (inches) => `${inches} in`
): string {
	if (size.maxIn === null) return size.key;
	return size.measure === 'leaf'
		? `${size.key} (leaf blade up to ${length(size.maxIn)})`
		: `${size.key} (up to ${length(size.maxIn)} across)`;
}

/** A problem with a variety's group, growth form, size class or botanical name. */
export interface VarietyGroupProblem {
	field: 'plantGroup' | 'growthForm' | 'sizeClass' | 'botanicalName';
	message: string;
}

/**
 * Checks that a variety's growth form and size class belong to its group and that a species
 * has a botanical name starting with a genus of the group; returns every problem found.
 */
export function checkVarietyGroup(v: {
	plantGroup: string;
	growthForm: string;
	sizeClass: string;
	isSpecies: boolean;
	botanicalName: string | null;
}): VarietyGroupProblem[] {
	const group = BY_KEY.get(v.plantGroup);
	if (!group) {
		return [
			{
				field: 'plantGroup',
				message: `Give the group as African violet or one of the genera: ${GENUS_KEYS.map((k) => plantGroupOf(k).name).join(', ')}.`
			}
		];
	}
	const problems: VarietyGroupProblem[] = [];
	if (!group.growthForms.includes(v.growthForm)) {
		problems.push({
			field: 'growthForm',
			message: `${capitalized(article(group.name))} is grown as ${wordsOf(group.growthForms.map((f) => GROWTH_FORM_LABELS[f]))}; give one of those.`
		});
	}
	if (!groupSizeClass(group, v.sizeClass)) {
		problems.push({
			field: 'sizeClass',
			message: `The size classes of ${group.name} are ${wordsOf(group.sizeClasses.map((s) => s.key))}.`
		});
	}
	const botanical = (v.botanicalName ?? '').trim();
	if (v.isSpecies && !botanical) {
		problems.push({
			field: 'botanicalName',
			message: `Give the botanical name of the species, like ${group.genera[0]} followed by the species.`
		});
	} else if (botanical) {
		const first = botanical.split(/\s+/)[0].replace(/^[×x](?=[A-Z])/, '');
		if (!group.genera.some((g) => g.toLowerCase() === first.toLowerCase())) {
			problems.push({
				field: 'botanicalName',
				message: `A botanical name in the ${group.name} group starts with ${wordsOf([...group.genera])}.`
			});
		}
	}
	return problems;
}

function article(words: string): string {
	return `${/^[aeiou]/i.test(words) ? 'an' : 'a'} ${words}`;
}

function capitalized(words: string): string {
	return `${words[0].toUpperCase()}${words.slice(1)}`;
}

function wordsOf(items: readonly string[]): string {
	if (items.length <= 1) return items.join('');
	return `${items.slice(0, -1).join(', ')} or ${items[items.length - 1]}`;
}
