import type { AwardRules } from './domain/awards';
import type { ClassRules } from './domain/eligibility';
import { formatMoney } from './domain/money';
import {
	AFRICAN_VIOLET,
	GROWTH_FORM_LABELS,
	ROOT_TYPE_LABELS,
	describeGroupSize,
	groupSizeClass,
	isPlantGroup,
	plantGroupOf
} from './domain/plant-groups';
import { formatLengthBoth, type LengthUnit } from './domain/units';
import { formatDate } from './format';

/** The class fields that the schedule describes in words: the class's rules and its scale. */
export interface ClassDescribed extends Required<ClassRules> {
	scaleName?: string | null;
}

function list(items: string[], joiner = 'or'): string {
	if (items.length <= 1) return items.join('');
	return `${items.slice(0, -1).join(', ')} ${joiner} ${items[items.length - 1]}`;
}

/**
 * A class's eligibility as short plain phrases, for the schedule page and PDF; lengths first in
 * the society's unit.
 */
export function describeClass(c: ClassDescribed, unit: LengthUnit): string[] {
	const parts: string[] = describeGroupRules(c);
	if (c.speciesOnly) parts.push('species only');
	if (c.habit !== 'any') parts.push(c.habit === 'trailer' ? 'trailers' : 'single crown');
	if (c.sizeClasses.length) parts.push(`size: ${list(sizesOfClass(c, unit))}`);
	if (c.blossomTypes.length) parts.push(`blossoms: ${list(c.blossomTypes)}`);
	if (c.blossomColours.length) parts.push(`color: ${list(c.blossomColours)}`);
	if (c.foliage !== 'any') parts.push(`${c.foliage} foliage`);
	if (c.minCrowns !== null && c.maxCrowns !== null && c.minCrowns === c.maxCrowns) {
		parts.push(`${c.minCrowns} crown${c.minCrowns === 1 ? '' : 's'}`);
	} else {
		if (c.minCrowns !== null) parts.push(`at least ${c.minCrowns} crowns`);
		if (c.maxCrowns !== null)
			parts.push(`at most ${c.maxCrowns} crown${c.maxCrowns === 1 ? '' : 's'}`);
	}
	if (c.collectionSize !== null)
		parts.push(`collection of ${c.collectionSize} different named varieties`);
	if (c.maxDiameterIn !== null)
		parts.push(`up to ${formatLengthBoth(c.maxDiameterIn, unit)} across`);
	if (c.maxPotIn !== null) parts.push(`largest pot ${formatLengthBoth(c.maxPotIn, unit)}`);
	if (c.possessionMonths !== null) {
		parts.push(
			c.possessionMonths === 0
				? 'no possession period'
				: `grown by the exhibitor at least ${c.possessionMonths} month${c.possessionMonths === 1 ? '' : 's'}`
		);
	}
	if (c.maxEntriesPerExhibitor !== null) {
		parts.push(
			`at most ${c.maxEntriesPerExhibitor} ${c.maxEntriesPerExhibitor === 1 ? 'entry' : 'entries'} per exhibitor`
		);
	}
	if (c.maxEntriesPerVariety !== null) {
		parts.push(`at most ${c.maxEntriesPerVariety} of each variety per exhibitor`);
	}
	if (c.scaleName) parts.push(`judged on: ${c.scaleName}`);
	return parts.length ? parts : ['open to any plant'];
}

/** The group, genera, growth forms and root types a class asks for, as phrases. */
function describeGroupRules(c: ClassDescribed): string[] {
	const parts: string[] = [];
	if (c.plantKind === 'african_violet') parts.push('African violets');
	if (c.plantKind === 'other_gesneriad') parts.push('gesneriads other than African violets');
	const name = (key: string) => (isPlantGroup(key) ? plantGroupOf(key).name : key);
	if (c.genera.length) parts.push(`genus: ${list(c.genera.map(name))}`);
	if (c.growthForms.length) {
		parts.push(`growth: ${list(c.growthForms.map((f) => GROWTH_FORM_LABELS[f] ?? f))}`);
	}
	if (c.rootTypes.length) {
		parts.push(list(c.rootTypes.map((r) => ROOT_TYPE_LABELS[r])));
	}
	return parts;
}

/**
 * The size classes of a class in words; for a class of one genus, with that genus's own limits
 * ("miniature (leaf blade up to 2.5 in)").
 */
function sizesOfClass(c: ClassDescribed, unit: LengthUnit): string[] {
	const only = c.genera.length === 1 && isPlantGroup(c.genera[0]) ? c.genera[0] : null;
	const group = only
		? plantGroupOf(only)
		: c.plantKind === 'african_violet'
			? plantGroupOf(AFRICAN_VIOLET)
			: null;
	return c.sizeClasses.map((s) => {
		const size = group ? groupSizeClass(group, s) : null;
		return size ? describeGroupSize(size, (inches) => formatLengthBoth(inches, unit)) : s;
	});
}

/** The show fields that the schedule states as dates and rules. */
export interface ShowDescribed {
	venue: string;
	publicHours: string;
	entriesOpen: string;
	entriesClose: string;
	entryDay: string;
	judgingDay: string;
	possessionMonths: number;
	maxEntriesPerClass: number;
	maxEntriesPerVariety: number;
	requireGoodStanding: boolean;
	awardRules: Pick<AwardRules, 'system' | 'merit' | 'placement'>;
	/** The fee for each entry in cents, when the schedule states it. */
	entryFeeCents?: number;
}

/** The show's dates and rules as sentences, with money in the society's currency. */
export function describeShowRules(
	s: ShowDescribed,
	currency: string
): { dates: string[]; rules: string[] } {
	const dates = [
		`Entries taken ${formatDate(s.entriesOpen)} to ${formatDate(s.entriesClose)}.`,
		`Entry day (plants checked in): ${formatDate(s.entryDay)}.`,
		`Judging: ${formatDate(s.judgingDay)}.`
	];
	if (s.venue) dates.push(`Where: ${s.venue}.`);
	if (s.publicHours) dates.push(`Open to visitors: ${s.publicHours}`);
	const rules: string[] = [];
	if (s.requireGoodStanding)
		rules.push('Exhibitors must be members in good standing on judging day.');
	if (s.possessionMonths > 0) {
		rules.push(
			`Every plant must have been grown by the exhibitor for at least ${s.possessionMonths} month${s.possessionMonths === 1 ? '' : 's'} by judging day.`
		);
	}
	rules.push(
		`At most ${s.maxEntriesPerClass} ${s.maxEntriesPerClass === 1 ? 'entry' : 'entries'} per exhibitor in a class, and ${s.maxEntriesPerVariety} of each variety in the show.`
	);
	if (s.entryFeeCents !== undefined) {
		rules.push(
			s.entryFeeCents > 0
				? `Entry fee: ${formatMoney(s.entryFeeCents, currency)} per entry.`
				: 'No entry fee.'
		);
	}
	const a = s.awardRules;
	rules.push(
		a.system === 'merit'
			? `Merit judging: blue ribbon ${a.merit.blue} points and over, red ${a.merit.red} and over, white ${a.merit.white} and over.`
			: `Placement judging: first place needs ${a.placement.first} points, second ${a.placement.second}, third ${a.placement.third}, honorable mention ${a.placement.honourable}.`
	);
	return { dates, rules };
}

/** Text typed with blank lines between paragraphs (general rules, committee), as paragraphs. */
export function paragraphsOf(typed: string): string[] {
	return typed
		.trim()
		.split(/\n\s*\n/)
		.map((p) => p.trim())
		.filter(Boolean);
}
