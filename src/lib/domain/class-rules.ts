/**
 * Which parts of a class are its rules, and what may still change once plants are entered.
 *
 * A class's eligibility rules freeze once it has entries: an exhibitor entered under them, and
 * changing them afterwards would make some entries wrong without anyone noticing. Its division
 * freezes too (awards such as sweepstakes count per division). Its code, name, description and
 * place in the schedule stay editable (typing mistakes), and entries can still be moved between
 * classes. Its scale of points may change until the first sheet in the class is scored.
 */

import { OPEN_CLASS_RULES, type ClassRules } from './eligibility';

/** Every eligibility rule of a class, with the plain name used in refusals. */
export const CLASS_RULE_LABELS: Readonly<Record<keyof ClassRules, string>> = Object.freeze({
	habit: 'habit',
	sizeClasses: 'size classes',
	blossomTypes: 'blossom types',
	blossomColours: 'blossom colors',
	foliage: 'foliage',
	minCrowns: 'fewest crowns',
	maxCrowns: 'most crowns',
	collectionSize: 'collection size',
	speciesOnly: 'species only',
	maxDiameterIn: 'largest diameter',
	possessionMonths: 'possession period',
	maxEntriesPerExhibitor: 'entries per exhibitor',
	maxEntriesPerVariety: 'entries per variety',
	maxPotIn: 'largest pot',
	plantKind: 'group',
	genera: 'genera',
	growthForms: 'growth forms',
	rootTypes: 'root types'
});

/** The fields of a class that are eligibility rules, in the form's order. */
export const CLASS_RULE_FIELDS = Object.keys(CLASS_RULE_LABELS) as (keyof ClassRules)[];

/** What the freeze looks at: the rules, the division and the scale. */
export interface ClassFrozenParts {
	rules: ClassRules;
	divisionId: string;
	scaleId: string | null;
}

/** Where a class is in the show: has it entries, has any of its sheets been scored. */
export interface ClassProgress {
	entries: number;
	scoredSheets: number;
}

/** A refused change: the form field it belongs to and the reason in plain words. */
export interface FrozenRefusal {
	field: string;
	message: string;
}

function sameValue(a: unknown, b: unknown): boolean {
	if (Array.isArray(a) && Array.isArray(b)) {
		const norm = (list: unknown[]) => [...new Set(list.map(String))].sort();
		const [x, y] = [norm(a), norm(b)];
		return x.length === y.length && x.every((v, i) => v === y[i]);
	}
	if (typeof a === 'number' && typeof b === 'number') return Math.abs(a - b) < 1e-9;
	return a === b;
}

/** The rules that differ between two versions of a class (lists compared as sets). */
export function changedRuleFields(before: ClassRules, after: ClassRules): (keyof ClassRules)[] {
	// A rule left out (older callers) reads as the open class's value.
	const value = (rules: ClassRules, field: keyof ClassRules) =>
		rules[field] ?? OPEN_CLASS_RULES[field];
	return CLASS_RULE_FIELDS.filter((field) => !sameValue(value(before, field), value(after, field)));
}

function listOf(items: string[]): string {
	if (items.length <= 1) return items.join('');
	return `${items.slice(0, -1).join(', ')} and ${items[items.length - 1]}`;
}

/**
 * Decides whether a change to a class may be saved, given its entries and scored sheets.
 * Returns the refusal with its reason, or null when the change may be saved.
 */
export function refuseFrozenClassChange(
	before: ClassFrozenParts,
	after: ClassFrozenParts,
	progress: ClassProgress
): FrozenRefusal | null {
	if (progress.entries > 0) {
		const changed = changedRuleFields(before.rules, after.rules);
		const entries = `${progress.entries} ${progress.entries === 1 ? 'entry' : 'entries'}`;
		if (changed.length) {
			return {
				field: changed[0],
				message: `This class already has ${entries}, so its rules are fixed: the ${listOf(
					changed.map((f) => CLASS_RULE_LABELS[f])
				)} cannot change. Its code, name and description can; to take other plants, add a class and move entries there.`
			};
		}
		if (before.divisionId !== after.divisionId) {
			return {
				field: 'divisionId',
				message: `This class already has ${entries}, so it stays in its division.`
			};
		}
	}
	if (progress.scoredSheets > 0 && before.scaleId !== after.scaleId) {
		return {
			field: 'scaleId',
			message:
				'Judges have already scored plants in this class on its scale of points, so the class keeps that scale.'
		};
	}
	return null;
}
