'use strict';

/**
 * Demo seed: an invented society with a published spring show that is open for entries, and a
 * second invented society (with a draft show of its own) for isolation tests.
 *
 * Everything here is made up for the demo: the societies, the people, the varieties, the
 * hybridizers, the venue. Only the species names (Saintpaulia ...) are real, as they are taxa.
 *
 * Show dates are computed from the day the seed runs, so the demo always has entries open:
 * entries open 14 days ago, close in 30 days, entry day in 40 days, judging day in 41 days.
 *
 * Demo sign-in addresses (all @crownbench.test):
 *   admin, chair, clerk, judge1, judge2, judge3, member, lapsed, exhibitor1..exhibitor7
 *   (Larkspur Valley Violet Circle) and other-admin (Cedar Ridge Gesneriad Guild).
 */

const { randomUUID } = require('node:crypto');

const SOCIETY_A = { name: 'Larkspur Valley Violet Circle', slug: 'larkspur-valley' };
const SOCIETY_B = { name: 'Cedar Ridge Gesneriad Guild', slug: 'cedar-ridge' };

const BUILT_IN_SCALE_NAME = 'Single-crowned standard, semiminiature and miniature plants';

/** Every address the seed creates; down() deletes exactly these. */
const DEMO_EMAILS = [
	'admin@crownbench.test',
	'chair@crownbench.test',
	'clerk@crownbench.test',
	'judge1@crownbench.test',
	'judge2@crownbench.test',
	'judge3@crownbench.test',
	'member@crownbench.test',
	'lapsed@crownbench.test',
	'exhibitor1@crownbench.test',
	'exhibitor2@crownbench.test',
	'exhibitor3@crownbench.test',
	'exhibitor4@crownbench.test',
	'exhibitor5@crownbench.test',
	'exhibitor6@crownbench.test',
	'exhibitor7@crownbench.test',
	'other-admin@crownbench.test'
];

// ---------------------------------------------------------------------------------------------
// Calendar dates (YYYY-MM-DD, local calendar of the machine that runs the seed)
// ---------------------------------------------------------------------------------------------

function today() {
	const now = new Date();
	return new Date(now.getFullYear(), now.getMonth(), now.getDate());
}

function addDays(day, n) {
	return new Date(day.getFullYear(), day.getMonth(), day.getDate() + n);
}

/** Adds calendar months; a day that does not exist in the target month becomes its last day. */
function addMonths(day, n) {
	const first = new Date(day.getFullYear(), day.getMonth() + n, 1);
	const lastDay = new Date(first.getFullYear(), first.getMonth() + 1, 0).getDate();
	return new Date(first.getFullYear(), first.getMonth(), Math.min(day.getDate(), lastDay));
}

function iso(day) {
	const pad = (n) => String(n).padStart(2, '0');
	return `${day.getFullYear()}-${pad(day.getMonth() + 1)}-${pad(day.getDate())}`;
}

// ---------------------------------------------------------------------------------------------
// Data
// ---------------------------------------------------------------------------------------------

/** People. `key` is only used inside this file to wire rows together. */
const PEOPLE = [
	{ key: 'admin', email: 'admin@crownbench.test', name: 'Rosalind Achterberg' },
	{ key: 'chair', email: 'chair@crownbench.test', name: 'Tobias Wendell-Marsh' },
	{ key: 'clerk', email: 'clerk@crownbench.test', name: 'Priya Castellane' },
	{ key: 'judge1', email: 'judge1@crownbench.test', name: 'Eleanor Fairweather-Quinn' },
	{ key: 'judge2', email: 'judge2@crownbench.test', name: 'Desmond Oyelaran-Hart' },
	{ key: 'judge3', email: 'judge3@crownbench.test', name: 'Harriet Birchwood' },
	{ key: 'member', email: 'member@crownbench.test', name: 'Wren Halloway' },
	{ key: 'lapsed', email: 'lapsed@crownbench.test', name: 'Gordon Pellicane' },
	{ key: 'ex1', email: 'exhibitor1@crownbench.test', name: 'Imogen Tallis' },
	{ key: 'ex2', email: 'exhibitor2@crownbench.test', name: 'Ravi Sundaresan-Pike' },
	{ key: 'ex3', email: 'exhibitor3@crownbench.test', name: 'Beatrix Coldharbour' },
	{ key: 'ex4', email: 'exhibitor4@crownbench.test', name: 'Lucien Ashdown-Reyes' },
	{ key: 'ex5', email: 'exhibitor5@crownbench.test', name: 'Milo Birchwood' },
	{ key: 'ex6', email: 'exhibitor6@crownbench.test', name: 'Fenella Drummond-Kay' },
	{ key: 'ex7', email: 'exhibitor7@crownbench.test', name: 'Oksana Veretenko-Bly' },
	{ key: 'otherAdmin', email: 'other-admin@crownbench.test', name: 'Cordelia Hartigan' }
];

/**
 * Memberships. dues: 'current' (about a year ahead), 'lapsed' (in the past) or null (not a
 * dues-paying member, e.g. a visiting judge).
 */
const MEMBERSHIPS = [
	{
		society: 'A',
		person: 'admin',
		roles: ['admin', 'member'],
		household: 'Achterberg',
		dues: 'current'
	},
	{
		society: 'A',
		person: 'chair',
		roles: ['chair', 'member'],
		household: 'Wendell-Marsh',
		dues: 'current'
	},
	{
		society: 'A',
		person: 'clerk',
		roles: ['clerk', 'member'],
		household: 'Castellane',
		dues: 'current'
	},
	{ society: 'A', person: 'judge1', roles: ['judge'], household: null, dues: null },
	{ society: 'A', person: 'judge2', roles: ['judge'], household: null, dues: null },
	{
		society: 'A',
		person: 'judge3',
		roles: ['judge', 'member'],
		household: 'Birchwood',
		dues: 'current'
	},
	{ society: 'A', person: 'member', roles: ['member'], household: 'Halloway', dues: 'current' },
	{ society: 'A', person: 'lapsed', roles: ['member'], household: 'Pellicane', dues: 'lapsed' },
	{ society: 'A', person: 'ex1', roles: ['member'], household: 'Tallis', dues: 'current' },
	{ society: 'A', person: 'ex2', roles: ['member'], household: 'Sundaresan-Pike', dues: 'current' },
	{ society: 'A', person: 'ex3', roles: ['member'], household: 'Coldharbour', dues: 'current' },
	{ society: 'A', person: 'ex4', roles: ['member'], household: 'Ashdown-Reyes', dues: 'current' },
	// Same household as judge3: a judge must not judge her own household's plants.
	{ society: 'A', person: 'ex5', roles: ['member'], household: 'Birchwood', dues: 'current' },
	{ society: 'A', person: 'ex6', roles: ['member'], household: 'Drummond-Kay', dues: 'current' },
	{ society: 'A', person: 'ex7', roles: ['member'], household: 'Veretenko-Bly', dues: 'current' },
	{
		society: 'B',
		person: 'otherAdmin',
		roles: ['admin', 'chair', 'member'],
		household: 'Hartigan',
		dues: 'current'
	}
];

/**
 * Scale of points for single-crowned standard, semiminiature and miniature plants (total 100).
 * Published in "A Beginner's Guide to Judging", African Violet Magazine, May/June 1993,
 * rev. 2020. Keys match DEFAULT_STANDARD_SCALE in src/lib/domain/scoring.ts.
 */
const BUILT_IN_CRITERIA = [
	{ key: 'symmetry', label: 'Symmetry or leaf pattern', maxPoints: 25 },
	{ key: 'condition', label: 'Condition', maxPoints: 25 },
	{ key: 'quantity_of_bloom', label: 'Quantity of bloom', maxPoints: 25 },
	{ key: 'size_and_type_of_blossom', label: 'Size and type of blossom', maxPoints: 15 },
	{ key: 'color_of_blossom', label: 'Color of blossom', maxPoints: 10 }
];

/**
 * The society's own scales. These are DEMO SETTINGS invented for the demo society (each sums to
 * 100), not published values: they show that a society sets its own scales as data.
 */
const SOCIETY_SCALES = {
	trailer: {
		name: 'Trailers (Larkspur Valley setting)',
		criteria: [
			{ key: 'growth_habit', label: 'Trailing habit and symmetry of growth', maxPoints: 30 },
			{ key: 'condition', label: 'Condition', maxPoints: 25 },
			{ key: 'quantity_of_bloom', label: 'Quantity of bloom', maxPoints: 25 },
			{ key: 'blossom', label: 'Size, type and color of blossom', maxPoints: 20 }
		]
	},
	species: {
		name: 'Species (Larkspur Valley setting)',
		criteria: [
			{ key: 'growth', label: 'Growth and symmetry typical of the species', maxPoints: 30 },
			{ key: 'condition', label: 'Condition', maxPoints: 30 },
			{ key: 'quantity_of_bloom', label: 'Quantity of bloom', maxPoints: 25 },
			{ key: 'blossom', label: 'Blossom typical of the species', maxPoints: 15 }
		]
	},
	collection: {
		name: 'Collections (Larkspur Valley setting)',
		criteria: [
			{ key: 'uniformity', label: 'Uniformity of the three plants', maxPoints: 20 },
			{ key: 'symmetry', label: 'Symmetry or leaf pattern', maxPoints: 20 },
			{ key: 'condition', label: 'Condition', maxPoints: 25 },
			{ key: 'quantity_of_bloom', label: 'Quantity of bloom', maxPoints: 25 },
			{ key: 'blossom', label: 'Size, type and color of blossom', maxPoints: 10 }
		]
	},
	design: {
		name: 'Design (Larkspur Valley setting)',
		criteria: [
			{ key: 'conformance', label: 'Conformance to the class', maxPoints: 20 },
			{ key: 'design', label: 'Design', maxPoints: 30 },
			{ key: 'distinction', label: 'Distinction and originality', maxPoints: 20 },
			{ key: 'plant_condition', label: 'Condition of plant material', maxPoints: 15 },
			{ key: 'violet_use', label: 'Use of violets and other gesneriads', maxPoints: 15 }
		]
	}
};

// Invented hybridizers.
const H = {
	penwarden: 'H. Penwarden',
	marchetti: 'O. Marchetti-Lowe',
	brennick: 'T. Brennick',
	tarrant: 'J. Tarrant-Vos',
	quillby: 'A. Quillby',
	demczuk: 'R. Demczuk-Ashe'
};

const SPECIES_NOTE = 'A species, kept in the registry for the species class.';

/**
 * Registry of Larkspur Valley. [name, hybridizer, habit, size, blossom type, colours, foliage,
 * description]. Habit: 'sc' single crown, 'tr' trailer.
 */
// prettier-ignore
const VARIETIES_A = [
	// miniatures
	['Thimble Harbor', H.penwarden, 'sc', 'miniature', 'single', ['blue'], 'plain', 'Small sky-blue single blossoms over a neat dark rosette.'],
	['Pocket Sleet', H.penwarden, 'sc', 'miniature', 'double', ['white'], 'plain', 'Tight white doubles on a flat, pale green rosette.'],
	['Wicker Robin', H.quillby, 'sc', 'miniature', 'semidouble', ['pink'], 'plain', 'Rose-pink semidoubles held well above the leaves.'],
	['Ladle of Plums', H.quillby, 'sc', 'miniature', 'double', ['purple'], 'variegated', 'Plum doubles over cream and green variegated leaves.'],
	['Crumb of Coral', H.tarrant, 'sc', 'miniature', 'star', ['coral'], 'plain', 'Coral star blossoms on a compact, quilted rosette.'],
	['Tidepool Ember', H.tarrant, 'sc', 'miniature', 'single', ['red'], 'variegated', 'Dark red singles against pink-edged variegation.'],
	['Moth Lantern', H.demczuk, 'sc', 'miniature', 'fringed', ['lavender', 'two-tone'], 'plain', 'Fringed lavender blossoms with a darker upper lobe.'],
	['Hazel Thistle', H.demczuk, 'sc', 'miniature', 'bell', ['fuchsia'], 'plain', 'Fuchsia bells that stay half closed.'],
	// semiminiatures
	['Quiet Meadow Frost', H.marchetti, 'sc', 'semiminiature', 'semidouble', ['white', 'green edge'], 'plain', 'White semidoubles with a thin green edge.'],
	['Weathervane Blue', H.marchetti, 'sc', 'semiminiature', 'single', ['blue'], 'plain', 'Clear blue singles on a flat, symmetrical rosette.'],
	['Pinfold Rosette', H.quillby, 'sc', 'semiminiature', 'double', ['pink'], 'variegated', 'Soft pink doubles over crown-variegated foliage.'],
	["Cobbler's Dusk", H.brennick, 'sc', 'semiminiature', 'double', ['purple'], 'plain', 'Deep purple doubles on glossy, spooned leaves.'],
	['Saltmarsh Wren', H.brennick, 'sc', 'semiminiature', 'star', ['two-tone'], 'plain', 'Two-tone blue stars, pale at the centre.'],
	['Kiln Spark', H.tarrant, 'sc', 'semiminiature', 'single', ['red'], 'variegated', 'Brick-red singles over white-edged leaves.'],
	['Bramblegate Lilac', H.penwarden, 'sc', 'semiminiature', 'semidouble', ['lavender'], 'plain', 'Lilac semidoubles in generous clusters.'],
	['Sorrel Kite', H.demczuk, 'sc', 'semiminiature', 'wasp', ['multicolor'], 'variegated', 'Wasp blossoms streaked in pink, blue and white.'],
	// standards
	['Harbor Dusk', H.brennick, 'sc', 'standard', 'double', ['purple'], 'plain', 'Large purple doubles on a dark, wavy rosette.'],
	['Lantern Cove', H.marchetti, 'sc', 'standard', 'single', ['blue'], 'plain', 'Mid-blue singles with a golden eye.'],
	['Chapel Slate', H.marchetti, 'sc', 'standard', 'semidouble', ['blue'], 'plain', 'Slate-blue semidoubles on a heavy, flat rosette.'],
	['Orchard Lane Blush', H.penwarden, 'sc', 'standard', 'double', ['pink'], 'plain', 'Pale blush-pink doubles that deepen with age.'],
	['Copper Bell Chapel', H.tarrant, 'sc', 'standard', 'bell', ['coral'], 'plain', 'Coral bells hanging just above the leaves.'],
	['Foxglove Parlour', H.quillby, 'sc', 'standard', 'semidouble', ['fuchsia'], 'plain', 'Fuchsia semidoubles with a white throat.'],
	['Millpond Ink', H.brennick, 'sc', 'standard', 'double', ['blue'], 'variegated', 'Ink-blue doubles over mosaic variegation.'],
	['Granary Snow', H.penwarden, 'sc', 'standard', 'double', ['white'], 'plain', 'Pure white doubles on bright green leaves.'],
	['Heron at Evening', H.demczuk, 'sc', 'standard', 'star', ['two-tone'], 'plain', 'Two-tone stars, violet over pale lilac.'],
	["Wheelwright's Ruby", H.tarrant, 'sc', 'standard', 'double', ['red'], 'plain', 'Ruby-red doubles on a dark, quilted rosette.'],
	['Threshing Moon', H.marchetti, 'sc', 'standard', 'fringed', ['white', 'green edge'], 'plain', 'Fringed white blossoms with a ruffled green edge.'],
	['Carrow Fen Confetti', H.quillby, 'sc', 'standard', 'semidouble', ['multicolor'], 'variegated', 'Speckled semidoubles over white-edged leaves.'],
	['Stillwater Chime', H.demczuk, 'sc', 'standard', 'wasp', ['lavender'], 'plain', 'Narrow lavender wasp petals on long stems.'],
	['Brickyard Poppy', H.brennick, 'sc', 'standard', 'single', ['red'], 'plain', 'Bright red singles, very free-flowering.'],
	['Dovecote Posy', H.penwarden, 'sc', 'standard', 'single', ['pink'], 'plain', 'Candy-pink singles in a tight bouquet.'],
	// large
	['Broad Acre Cathedral', H.brennick, 'sc', 'large', 'double', ['purple'], 'plain', 'A very wide rosette with heavy purple doubles.'],
	['Wide Meadow Sovereign', H.marchetti, 'sc', 'large', 'semidouble', ['two-tone'], 'plain', 'Blue and white two-tone semidoubles on a broad rosette.'],
	// trailers
	['Wandering Larkspur', H.tarrant, 'tr', 'standard', 'semidouble', ['lavender'], 'plain', 'A vigorous trailer with lavender semidoubles.'],
	['Creeping Ember Lane', H.tarrant, 'tr', 'standard', 'double', ['pink'], 'variegated', 'Pink doubles along variegated trailing stems.'],
	['Footbridge Lace', H.quillby, 'tr', 'semiminiature', 'single', ['white'], 'plain', 'Small white singles on a spreading trailer.'],
	['Hedgerow Tumble', H.quillby, 'tr', 'semiminiature', 'star', ['blue'], 'variegated', 'Blue stars on a variegated, branching trailer.'],
	['Pebble Ramble', H.demczuk, 'tr', 'miniature', 'single', ['purple'], 'plain', 'A tiny purple trailer with short internodes.'],
	["Wren's Ladder", H.demczuk, 'tr', 'miniature', 'double', ['pink'], 'plain', 'Pink doubles on a compact miniature trailer.']
];

/** Species (real taxa, no hybridizer): [name, habit, size, blossom type, colours]. */
// prettier-ignore
const SPECIES_A = [
	['Saintpaulia ionantha', 'sc', 'standard', 'single', ['purple']],
	['Saintpaulia shumensis', 'sc', 'miniature', 'single', ['lavender']],
	['Saintpaulia goetzeana', 'tr', 'miniature', 'single', ['two-tone']],
	['Saintpaulia rupicola', 'tr', 'standard', 'single', ['blue']]
];

/** A small registry for the second society; one name is shared on purpose (registries are per society). */
// prettier-ignore
const VARIETIES_B = [
	['Harbor Dusk', H.brennick, 'sc', 'standard', 'double', ['purple'], 'plain', 'Large purple doubles on a dark, wavy rosette.'],
	['Cedar Smoke Lace', H.penwarden, 'sc', 'semiminiature', 'fringed', ['lavender'], 'plain', 'Smoky lavender fringed blossoms.'],
	['Ridgeback Lilac', H.marchetti, 'sc', 'standard', 'single', ['lavender'], 'variegated', 'Lilac singles over variegated leaves.']
];

// Schedule of the spring show. `scale`: 'builtIn' or a key of SOCIETY_SCALES.
const SC = 'single_crown';
const DIVISIONS_A = [
	{
		code: 'I',
		name: 'Single-crown standards',
		kind: 'horticulture',
		classes: [
			{
				code: '1',
				name: 'Blue or purple, single, semidouble or star blossoms',
				habit: SC,
				sizes: ['standard'],
				types: ['single', 'semidouble', 'star'],
				colours: ['blue', 'purple'],
				foliage: 'plain'
			},
			{
				code: '2',
				name: 'Blue or purple, double blossoms',
				habit: SC,
				sizes: ['standard'],
				types: ['double'],
				colours: ['blue', 'purple'],
				foliage: 'plain'
			},
			{
				code: '3',
				name: 'Pink or red, single, semidouble or star blossoms',
				habit: SC,
				sizes: ['standard'],
				types: ['single', 'semidouble', 'star'],
				colours: ['pink', 'red'],
				foliage: 'plain'
			},
			{
				code: '4',
				name: 'Pink or red, double blossoms',
				habit: SC,
				sizes: ['standard'],
				types: ['double'],
				colours: ['pink', 'red'],
				foliage: 'plain'
			},
			{
				code: '5',
				name: 'White, any blossom type',
				habit: SC,
				sizes: ['standard'],
				types: [],
				colours: ['white'],
				foliage: 'plain'
			},
			{
				code: '6',
				name: 'Coral, lavender or fuchsia, any blossom type',
				habit: SC,
				sizes: ['standard'],
				types: [],
				colours: ['coral', 'lavender', 'fuchsia'],
				foliage: 'plain'
			},
			{
				code: '7',
				name: 'Two-tone or multicolor blossoms',
				habit: SC,
				sizes: ['standard'],
				types: [],
				colours: ['two-tone', 'multicolor'],
				foliage: 'plain'
			},
			{
				code: '8',
				name: 'Blossoms with a green edge',
				habit: SC,
				sizes: ['standard'],
				types: [],
				colours: ['green edge'],
				foliage: 'plain'
			},
			{
				code: '9',
				name: 'Fringed, bell or wasp blossoms, any color',
				habit: SC,
				sizes: ['standard'],
				types: ['fringed', 'bell', 'wasp'],
				colours: [],
				foliage: 'plain'
			},
			{
				code: '10',
				name: 'Variegated foliage, any blossom',
				habit: SC,
				sizes: ['standard'],
				types: [],
				colours: [],
				foliage: 'variegated'
			},
			{
				code: '11',
				name: 'Large standards (16 in and over), any blossom or foliage',
				habit: SC,
				sizes: ['large'],
				types: [],
				colours: [],
				foliage: 'any'
			}
		].map((c) => ({ ...c, maxCrowns: 1, scale: 'builtIn' }))
	},
	{
		code: 'II',
		name: 'Semiminiatures and miniatures',
		kind: 'horticulture',
		classes: [
			{
				code: '12',
				name: 'Semiminiatures, plain foliage, single, semidouble, star, bell or wasp blossoms',
				sizes: ['semiminiature'],
				types: ['single', 'semidouble', 'star', 'bell', 'wasp'],
				foliage: 'plain'
			},
			{
				code: '13',
				name: 'Semiminiatures, plain foliage, double or fringed blossoms',
				sizes: ['semiminiature'],
				types: ['double', 'fringed'],
				foliage: 'plain'
			},
			{
				code: '14',
				name: 'Semiminiatures, variegated foliage',
				sizes: ['semiminiature'],
				types: [],
				foliage: 'variegated'
			},
			{
				code: '15',
				name: 'Miniatures, plain foliage, single, semidouble, star, bell or wasp blossoms',
				sizes: ['miniature'],
				types: ['single', 'semidouble', 'star', 'bell', 'wasp'],
				foliage: 'plain'
			},
			{
				code: '16',
				name: 'Miniatures, plain foliage, double or fringed blossoms',
				sizes: ['miniature'],
				types: ['double', 'fringed'],
				foliage: 'plain'
			},
			{
				code: '17',
				name: 'Miniatures, variegated foliage',
				sizes: ['miniature'],
				types: [],
				foliage: 'variegated'
			}
		].map((c) => ({ ...c, habit: SC, colours: [], maxCrowns: 1, scale: 'builtIn' }))
	},
	{
		code: 'III',
		name: 'Trailers',
		kind: 'horticulture',
		// At least 3 crowns to be shown as a trailer (provincial society show schedule 2014).
		classes: [
			{
				code: '18',
				name: 'Standard trailers, plain foliage',
				sizes: ['standard'],
				foliage: 'plain'
			},
			{
				code: '19',
				name: 'Semiminiature trailers, plain foliage',
				sizes: ['semiminiature'],
				foliage: 'plain'
			},
			{
				code: '20',
				name: 'Miniature trailers, plain foliage',
				sizes: ['miniature'],
				foliage: 'plain'
			},
			{
				code: '21',
				name: 'Trailers with variegated foliage, any size',
				sizes: [],
				foliage: 'variegated'
			}
		].map((c) => ({
			...c,
			habit: 'trailer',
			types: [],
			colours: [],
			minCrowns: 3,
			scale: 'trailer'
		}))
	},
	{
		code: 'IV',
		name: 'Species and collections',
		kind: 'horticulture',
		classes: [
			{
				code: '22',
				name: 'Species',
				description:
					'Any Saintpaulia species, grown as it grows in nature; single crown or several crowns.',
				habit: 'any',
				sizes: [],
				types: [],
				colours: [],
				foliage: 'any',
				speciesOnly: true,
				scale: 'species'
			},
			// "Three different named varieties of the same type" (national convention schedule 2020).
			{
				code: '23',
				name: 'Collection of three miniatures or three semiminiatures',
				description:
					'Three different named varieties of the same type: all three miniatures or all three semiminiatures, each single-crowned.',
				habit: SC,
				sizes: ['miniature', 'semiminiature'],
				types: [],
				colours: [],
				foliage: 'any',
				maxCrowns: 1,
				collectionSize: 3,
				scale: 'collection'
			}
		]
	},
	{
		code: 'V',
		name: 'Design',
		kind: 'design',
		classes: [
			{
				code: '24',
				name: 'Grange Morning: an arrangement of fresh violet blossoms and foliage',
				description:
					'Not to exceed 12 in in any direction. Fresh African violet blossoms must predominate.'
			},
			{
				code: '25',
				name: 'Pocket Garden: a miniature arrangement',
				description: 'Not to exceed 5 in in any direction. Fresh African violet blossoms required.'
			},
			{
				code: '26',
				name: 'Windowsill Country: a planted container',
				description:
					'At least three growing gesneriads in one container, African violets predominating.'
			},
			{
				code: '27',
				name: 'Lark Song: an artistic design',
				description:
					'Interpret the title; dried material permitted, fresh African violet blossoms required.'
			}
		].map((c) => ({
			...c,
			habit: 'any',
			sizes: [],
			types: [],
			colours: [],
			foliage: 'any',
			scale: 'design'
		}))
	}
];

/**
 * Entries: [exhibitor, class code, variety name | { collection: [names] } | { title }, months
 * held before judging day, check-in measurements or null]. Numbers are assigned below in a fixed
 * shuffled order so that the anonymous numbers do not give away the exhibitor.
 */
const ENTRIES_A = [
	// member@crownbench.test: entries in all five divisions, two in class 15 (the class limit)
	['member', '2', 'Harbor Dusk', 14],
	['member', '12', 'Quiet Meadow Frost', 9, { diameter: '7.25', crowns: 1, pot: '3.00' }],
	['member', '15', 'Thimble Harbor', 7],
	['member', '15', 'Crumb of Coral', 11],
	['member', '20', 'Pebble Ramble', 16],
	['member', '22', 'Saintpaulia shumensis', 20],
	['member', '24', { title: 'First Light at the Grange Door' }],
	// exhibitor1
	['ex1', '1', 'Lantern Cove', 12],
	['ex1', '4', 'Orchard Lane Blush', 8],
	['ex1', '10', 'Millpond Ink', 18],
	['ex1', '13', "Cobbler's Dusk", 6],
	['ex1', '23', { collection: ['Wicker Robin', 'Pocket Sleet', 'Hazel Thistle'] }, 10],
	['ex1', '25', { title: 'Thimbleful of Spring' }],
	// exhibitor2
	['ex2', '2', 'Harbor Dusk', 10],
	['ex2', '6', 'Foxglove Parlour', 7],
	['ex2', '11', 'Broad Acre Cathedral', 24, { diameter: '17.50', crowns: 1, pot: '6.00' }],
	['ex2', '18', 'Wandering Larkspur', 15, { diameter: '15.00', crowns: 5, pot: '5.00' }],
	['ex2', '21', 'Creeping Ember Lane', 9],
	// exhibitor3: two in class 12
	['ex3', '5', 'Granary Snow', 13, { diameter: '13.50', crowns: 1, pot: '5.00' }],
	['ex3', '8', 'Threshing Moon', 9],
	['ex3', '12', 'Weathervane Blue', 6],
	['ex3', '12', 'Bramblegate Lilac', 8],
	['ex3', '17', 'Ladle of Plums', 5],
	['ex3', '22', 'Saintpaulia ionantha', 30],
	// exhibitor4
	['ex4', '3', 'Brickyard Poppy', 7],
	['ex4', '7', 'Heron at Evening', 12],
	['ex4', '9', 'Stillwater Chime', 10],
	['ex4', '19', 'Footbridge Lace', 14],
	['ex4', '26', { title: 'Three Sills and a Lark' }],
	// exhibitor5 (household Birchwood, with judge3)
	['ex5', '4', "Wheelwright's Ruby", 11],
	['ex5', '14', 'Pinfold Rosette', 6],
	['ex5', '16', 'Pocket Sleet', 8],
	['ex5', '20', "Wren's Ladder", 13],
	// exhibitor6
	['ex6', '6', 'Copper Bell Chapel', 9],
	['ex6', '10', 'Carrow Fen Confetti', 17],
	['ex6', '11', 'Wide Meadow Sovereign', 22],
	['ex6', '21', 'Hedgerow Tumble', 8],
	['ex6', '22', 'Saintpaulia goetzeana', 19],
	// exhibitor7
	['ex7', '1', 'Chapel Slate', 9],
	['ex7', '12', 'Saltmarsh Wren', 7],
	['ex7', '16', 'Moth Lantern', 6, { diameter: '5.50', crowns: 1, pot: '2.25' }],
	['ex7', '27', { title: 'The Lark Leaves the Hedge' }],
	// officers: admin, chair, clerk, and judge3 (one entry)
	['admin', '14', 'Sorrel Kite', 10],
	['admin', '22', 'Saintpaulia rupicola', 26],
	['chair', '3', 'Dovecote Posy', 12],
	['clerk', '15', 'Hazel Thistle', 9],
	['judge3', '10', 'Millpond Ink', 15]
];

/** A fixed permutation (seeded Fisher-Yates) so the numbers are stable from run to run. */
function shuffled(list, seed) {
	const out = list.slice();
	let s = seed >>> 0;
	const next = () => {
		s = (Math.imul(s, 1664525) + 1013904223) >>> 0;
		return s / 4294967296;
	};
	for (let i = out.length - 1; i > 0; i--) {
		const j = Math.floor(next() * (i + 1));
		[out[i], out[j]] = [out[j], out[i]];
	}
	return out;
}

// ---------------------------------------------------------------------------------------------
// Seeder
// ---------------------------------------------------------------------------------------------

module.exports = {
	async up(queryInterface, Sequelize) {
		const texts = { type: Sequelize.ARRAY(Sequelize.STRING(40)) };
		const types = {
			memberships: { roles: { type: Sequelize.ARRAY(Sequelize.STRING(16)) } },
			varieties: { blossom_colours: texts },
			scales: { criteria: { type: new Sequelize.JSONB() } },
			shows: { award_rules: { type: new Sequelize.JSONB() } },
			classes: { size_classes: texts, blossom_types: texts, blossom_colours: texts },
			entries: { collection_variety_ids: { type: Sequelize.ARRAY(Sequelize.UUID) } }
		};

		const day0 = today();
		const now = new Date();
		const duesCurrent = iso(addMonths(day0, 12));
		const duesLapsed = iso(addMonths(day0, -4));

		await queryInterface.sequelize.transaction(async (transaction) => {
			const insert = (table, rows) =>
				queryInterface.bulkInsert(table, rows, { transaction }, types[table] || {});

			// Societies
			const society = { A: randomUUID(), B: randomUUID() };
			await insert('societies', [
				{ id: society.A, name: SOCIETY_A.name, slug: SOCIETY_A.slug },
				{ id: society.B, name: SOCIETY_B.name, slug: SOCIETY_B.slug }
			]);

			// Users and memberships
			const userId = {};
			await insert(
				'users',
				PEOPLE.map((p) => {
					userId[p.key] = randomUUID();
					return { id: userId[p.key], name: p.name, email: p.email, email_verified: null };
				})
			);
			await insert(
				'memberships',
				MEMBERSHIPS.map((m) => ({
					id: randomUUID(),
					society_id: society[m.society],
					user_id: userId[m.person],
					roles: m.roles,
					household: m.household,
					dues_paid_through:
						m.dues === 'current' ? duesCurrent : m.dues === 'lapsed' ? duesLapsed : null
				}))
			);

			// Scales: the built-in one (society_id null) is shared; reuse it if it is already there.
			const [existing] = await queryInterface.sequelize.query(
				'SELECT id FROM scales WHERE society_id IS NULL AND name = :name ORDER BY created_at LIMIT 1',
				{ replacements: { name: BUILT_IN_SCALE_NAME }, transaction }
			);
			const scaleId = { builtIn: existing.length ? existing[0].id : randomUUID() };
			const scaleRows = [];
			if (!existing.length) {
				scaleRows.push({
					id: scaleId.builtIn,
					society_id: null,
					name: BUILT_IN_SCALE_NAME,
					criteria: BUILT_IN_CRITERIA
				});
			}
			for (const [key, scale] of Object.entries(SOCIETY_SCALES)) {
				scaleId[key] = randomUUID();
				scaleRows.push({
					id: scaleId[key],
					society_id: society.A,
					name: scale.name,
					criteria: scale.criteria
				});
			}
			await insert('scales', scaleRows);

			// Variety registries
			const habitOf = (h) => (h === 'tr' ? 'trailer' : 'single_crown');
			const varietyId = {};
			const varietyRows = VARIETIES_A.map(
				([name, hybridizer, habit, size, type, colours, foliage, description]) => {
					varietyId[name] = randomUUID();
					return {
						id: varietyId[name],
						society_id: society.A,
						name,
						hybridizer,
						habit: habitOf(habit),
						size_class: size,
						blossom_type: type,
						blossom_colours: colours,
						foliage,
						is_species: false,
						description
					};
				}
			);
			for (const [name, habit, size, type, colours] of SPECIES_A) {
				varietyId[name] = randomUUID();
				varietyRows.push({
					id: varietyId[name],
					society_id: society.A,
					name,
					hybridizer: null,
					habit: habitOf(habit),
					size_class: size,
					blossom_type: type,
					blossom_colours: colours,
					foliage: 'plain',
					is_species: true,
					botanical_name: name,
					description: SPECIES_NOTE
				});
			}
			for (const [
				name,
				hybridizer,
				habit,
				size,
				type,
				colours,
				foliage,
				description
			] of VARIETIES_B) {
				varietyRows.push({
					id: randomUUID(),
					society_id: society.B,
					name,
					hybridizer,
					habit: habitOf(habit),
					size_class: size,
					blossom_type: type,
					blossom_colours: colours,
					foliage,
					is_species: false,
					description
				});
			}
			await insert('varieties', varietyRows);

			// The spring show of society A, open for entries today.
			const judgingDay = addDays(day0, 41);
			const year = judgingDay.getFullYear();
			const showA = randomUUID();
			const divisionRows = [];
			const classRows = [];
			const classId = {};
			DIVISIONS_A.forEach((division, d) => {
				const divisionId = randomUUID();
				divisionRows.push({
					id: divisionId,
					show_id: showA,
					code: division.code,
					name: division.name,
					kind: division.kind,
					position: d + 1
				});
				division.classes.forEach((c) => {
					classId[c.code] = randomUUID();
					classRows.push({
						id: classId[c.code],
						show_id: showA,
						division_id: divisionId,
						code: c.code,
						name: c.name,
						description: c.description || null,
						position: classRows.length + 1,
						habit: c.habit,
						size_classes: c.sizes,
						blossom_types: c.types,
						blossom_colours: c.colours,
						foliage: c.foliage,
						min_crowns: c.minCrowns || null,
						max_crowns: c.maxCrowns || null,
						collection_size: c.collectionSize || null,
						species_only: Boolean(c.speciesOnly),
						max_diameter_in: null,
						scale_id: scaleId[c.scale]
					});
				});
			});
			const classIdsOf = (divisionCode) =>
				DIVISIONS_A.find((d) => d.code === divisionCode).classes.map((c) => classId[c.code]);

			const entryRows = shuffled(ENTRIES_A, 20261201).map(
				([person, code, what, monthsHeld, checkIn], i) => {
					const isTitle = what && typeof what === 'object' && 'title' in what;
					const isCollection = what && typeof what === 'object' && 'collection' in what;
					return {
						id: randomUUID(),
						show_id: showA,
						class_id: classId[code],
						exhibitor_id: userId[person],
						variety_id: typeof what === 'string' ? varietyId[what] : null,
						collection_variety_ids: isCollection ? what.collection.map((n) => varietyId[n]) : [],
						title: isTitle ? what.title : null,
						number: i + 1,
						acquired_on: monthsHeld ? iso(addMonths(judgingDay, -monthsHeld)) : null,
						status: checkIn ? 'checked_in' : 'entered',
						measured_diameter_in: checkIn ? checkIn.diameter : null,
						measured_crowns: checkIn ? checkIn.crowns : null,
						pot_size_in: checkIn ? checkIn.pot : null,
						checked_in_at: checkIn ? now : null,
						checked_in_by: checkIn ? userId.clerk : null
					};
				}
			);
			for (const row of entryRows) {
				if (
					!row.class_id ||
					!row.exhibitor_id ||
					row.variety_id === undefined ||
					row.collection_variety_ids.includes(undefined)
				) {
					throw new Error(
						`demo seed: an entry refers to an unknown class, person or variety (#${row.number})`
					);
				}
			}

			await insert('shows', [
				{
					id: showA,
					society_id: society.A,
					name: `Spring Show ${year}`,
					slug: `larkspur-spring-${year}`,
					venue: 'Larkspur Valley Grange Hall, 12 Orchard Lane',
					entries_open: iso(addDays(day0, -14)),
					entries_close: iso(addDays(day0, 30)),
					entry_day: iso(addDays(day0, 40)),
					judging_day: iso(judgingDay),
					public_hours:
						'Open to the public on judging day 2 pm to 5 pm and the next day 10 am to 4 pm; admission free.',
					possession_months: 3,
					max_entries_per_class: 2,
					max_entries_per_variety: 1,
					require_good_standing: true,
					panel_score_method: 'mean',
					next_entry_number: entryRows.length + 1,
					schedule_published_at: now,
					results_published_at: null,
					award_rules: {
						system: 'merit',
						merit: { blue: 90, red: 80, white: 70 },
						placement: { first: 90, second: 85, third: 80, honourable: 75 },
						bestInClassMin: 90,
						tieBreak: { criterionKey: 'condition', useJudgesChoice: true },
						sweepstakesTieBreak: 'none',
						topAwards: [
							{
								id: 'best-standard',
								name: 'Best standard in show',
								classIds: classIdsOf('I'),
								minScore: 90
							},
							{
								id: 'best-small',
								name: 'Best semiminiature or miniature in show',
								classIds: classIdsOf('II'),
								minScore: 90
							},
							{
								id: 'best-trailer',
								name: 'Best trailer in show',
								classIds: classIdsOf('III'),
								minScore: 90
							},
							{
								id: 'best-design',
								name: 'Best design in show',
								classIds: classIdsOf('V'),
								minScore: 90
							}
						]
					}
				}
			]);
			await insert('divisions', divisionRows);
			await insert('classes', classRows);
			await insert('entries', entryRows);

			// Society B: a draft show (schedule not published), no entries.
			const judgingDayB = addDays(day0, 131);
			const yearB = judgingDayB.getFullYear();
			const showB = randomUUID();
			const divisionB = randomUUID();
			await insert('shows', [
				{
					id: showB,
					society_id: society.B,
					name: `Autumn Show ${yearB}`,
					slug: `cedar-ridge-autumn-${yearB}`,
					venue: 'Cedar Ridge Library Community Room, 400 Sawmill Road',
					entries_open: iso(addDays(day0, 90)),
					entries_close: iso(addDays(day0, 120)),
					entry_day: iso(addDays(day0, 130)),
					judging_day: iso(judgingDayB),
					public_hours: 'Judging day 1 pm to 4 pm.',
					possession_months: 3,
					max_entries_per_class: 2,
					max_entries_per_variety: 1,
					require_good_standing: true,
					panel_score_method: 'consensus',
					next_entry_number: 1,
					schedule_published_at: null,
					results_published_at: null,
					award_rules: {
						system: 'placement',
						merit: { blue: 90, red: 80, white: 70 },
						placement: { first: 90, second: 85, third: 80, honourable: 75 },
						bestInClassMin: null,
						tieBreak: { criterionKey: null, useJudgesChoice: true },
						sweepstakesTieBreak: 'none',
						topAwards: []
					}
				}
			]);
			await insert('divisions', [
				{
					id: divisionB,
					show_id: showB,
					code: 'I',
					name: 'Horticulture',
					kind: 'horticulture',
					position: 1
				}
			]);
			const classB = (code, name, sizes, position) => ({
				id: randomUUID(),
				show_id: showB,
				division_id: divisionB,
				code,
				name,
				description: null,
				position,
				habit: SC,
				size_classes: sizes,
				blossom_types: [],
				blossom_colours: [],
				foliage: 'any',
				min_crowns: null,
				max_crowns: 1,
				collection_size: null,
				species_only: false,
				max_diameter_in: null,
				scale_id: scaleId.builtIn
			});
			await insert('classes', [
				classB('1', 'Standards, any blossom', ['standard'], 1),
				classB('2', 'Semiminiatures and miniatures, any blossom', ['semiminiature', 'miniature'], 2)
			]);
		});
	},

	async down(queryInterface) {
		await queryInterface.sequelize.transaction(async (transaction) => {
			const run = (sql) =>
				queryInterface.sequelize.query(sql, {
					replacements: {
						slugs: [SOCIETY_A.slug, SOCIETY_B.slug],
						emails: DEMO_EMAILS,
						scale: BUILT_IN_SCALE_NAME
					},
					transaction
				});
			const demoShows =
				'SELECT s.id FROM shows s JOIN societies so ON so.id = s.society_id WHERE so.slug IN (:slugs)';
			const demoUsers = 'SELECT id FROM users WHERE email IN (:emails)';
			// entries.class_id, exhibitor_id, variety_id and checked_in_by do not cascade: clear them first.
			await run(
				`DELETE FROM entries WHERE show_id IN (${demoShows}) OR exhibitor_id IN (${demoUsers})`
			);
			await run(`UPDATE entries SET checked_in_by = NULL WHERE checked_in_by IN (${demoUsers})`);
			// Cascades to memberships, varieties, society scales, shows, divisions and classes.
			await run('DELETE FROM societies WHERE slug IN (:slugs)');
			// Cascades to memberships, accounts and sessions.
			await run('DELETE FROM users WHERE email IN (:emails)');
			// The built-in scale goes too, unless a class elsewhere still uses it.
			await run(
				'DELETE FROM scales sc WHERE sc.society_id IS NULL AND sc.name = :scale AND NOT EXISTS (SELECT 1 FROM classes c WHERE c.scale_id = sc.id)'
			);
		});
	}
};
