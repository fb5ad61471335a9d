/**
 * Scales of points as a society keeps them: the default scales a new society starts with, and
 * the checks a scale must pass before it is saved. Scoring itself is in `scoring.ts`.
 */

import { DEFAULT_STANDARD_SCALE, scaleTotal } from './scoring';

/** One criterion of a scale as the chair edits it. */
export interface ScaleCriterionDraft {
	key: string;
	label: string;
	maxPoints: number;
}

/** A scale of points before it is saved: its name and criteria, in the order judged. */
export interface ScaleDraft {
	name: string;
	criteria: ScaleCriterionDraft[];
}

/** A default scale with where its values come from. */
export interface DefaultScale extends ScaleDraft {
	source: string;
}

/** The most points one criterion may give. */
export const MAX_CRITERION_POINTS = 100;
/** The most criteria one scale may have. */
export const MAX_CRITERIA = 20;
/** Longest name of a scale or of a criterion. */
export const MAX_SCALE_NAME = 120;

const OWN_SETTING =
	'Crownbench’s own setting, invented for the demo society; not a published scale';

/**
 * The scales of points a society starts with. The first is published; the others are the
 * settings the demo society has always used, kept with the same words and values.
 */
export const DEFAULT_SCALES: readonly DefaultScale[] = Object.freeze([
	{
		name: DEFAULT_STANDARD_SCALE.name,
		source:
			'“A Beginner’s Guide to Judging”, African Violet Magazine, May/June 1993, rev. 2020 (national society’s website)',
		criteria: DEFAULT_STANDARD_SCALE.criteria.map((c) => ({ ...c }))
	},
	{
		name: 'Trailers',
		source: OWN_SETTING,
		criteria: [
			{ key: 'growth_habit', label: 'Trailing habit and symmetry of growth', maxPoints: 30 },
			{ key: 'condition', label: 'Condition', maxPoints: 25 },
			{ key: 'quantity_of_bloom', label: 'Quantity of bloom', maxPoints: 25 },
			{ key: 'blossom', label: 'Size, type and color of blossom', maxPoints: 20 }
		]
	},
	{
		name: 'Species',
		source: OWN_SETTING,
		criteria: [
			{ key: 'growth', label: 'Growth and symmetry typical of the species', maxPoints: 30 },
			{ key: 'condition', label: 'Condition', maxPoints: 30 },
			{ key: 'quantity_of_bloom', label: 'Quantity of bloom', maxPoints: 25 },
			{ key: 'blossom', label: 'Blossom typical of the species', maxPoints: 15 }
		]
	},
	{
		name: 'Collections',
		source: OWN_SETTING,
		criteria: [
			{ key: 'uniformity', label: 'Uniformity of the three plants', maxPoints: 20 },
			{ key: 'symmetry', label: 'Symmetry or leaf pattern', maxPoints: 20 },
			{ key: 'condition', label: 'Condition', maxPoints: 25 },
			{ key: 'quantity_of_bloom', label: 'Quantity of bloom', maxPoints: 25 },
			{ key: 'blossom', label: 'Size, type and color of blossom', maxPoints: 10 }
		]
	},
	{
		name: 'Design',
		source: OWN_SETTING,
		criteria: [
			{ key: 'conformance', label: 'Conformance to the class', maxPoints: 20 },
			{ key: 'design', label: 'Design', maxPoints: 30 },
			{ key: 'distinction', label: 'Distinction and originality', maxPoints: 20 },
			{ key: 'plant_condition', label: 'Condition of plant material', maxPoints: 15 },
			{ key: 'violet_use', label: 'Use of violets and other gesneriads', maxPoints: 15 }
		]
	}
]);

/**
 * Fresh, editable copies of the default scales, for a society that is starting: each society
 * gets rows of its own, so editing them changes no other society's scales.
 */
export function defaultScales(): ScaleDraft[] {
	return DEFAULT_SCALES.map((s) => ({
		name: s.name,
		criteria: s.criteria.map((c) => ({ key: c.key, label: c.label, maxPoints: c.maxPoints }))
	}));
}

/** A stable key for a criterion from its name (lower case words joined by underscores). */
export function criterionKey(label: string): string {
	return label
		.normalize('NFKD')
		.replace(/[\u0300-\u036f]/g, '')
		.toLowerCase()
		.replace(/[^a-z0-9]+/g, '_')
		.replace(/^_+|_+$/g, '')
		.slice(0, 60);
}

/** The total of the criteria's maximum points (exact in half points). */
export function totalPoints(criteria: readonly Pick<ScaleCriterionDraft, 'maxPoints'>[]): number {
	return scaleTotal({
		id: '',
		name: '',
		criteria: criteria.map((c, i) => ({ key: String(i), label: '', maxPoints: c.maxPoints }))
	});
}

/** One problem with a scale, with the field it belongs to ('name', 'criteria' or 'criteria.N'). */
export interface ScaleDraftProblem {
	field: string;
	message: string;
}

/**
 * Checks a scale before it is saved and returns every problem: a blank name, no criteria,
 * more than `MAX_CRITERIA`, a blank or repeated criterion name, or a maximum that is not more
 * than 0, over 100, or not a multiple of half a point (judges deduct in half points).
 */
export function validateScaleDraft(draft: ScaleDraft): ScaleDraftProblem[] {
	const problems: ScaleDraftProblem[] = [];
	const add = (field: string, message: string) => problems.push({ field, message });
	const name = draft.name.trim();
	if (!name) add('name', 'Give the scale a name.');
	else if (name.length > MAX_SCALE_NAME)
		add('name', `Keep the name under ${MAX_SCALE_NAME} characters.`);
	if (draft.criteria.length === 0) {
		add('criteria', 'A scale of points needs at least one criterion.');
	}
	if (draft.criteria.length > MAX_CRITERIA) {
		add('criteria', `A scale of points may have at most ${MAX_CRITERIA} criteria.`);
	}
	const seen = new Map<string, number>();
	draft.criteria.forEach((c, i) => {
		const field = `criteria.${i}`;
		const label = c.label.trim();
		const row = `Criterion ${i + 1}`;
		if (!label) {
			add(field, `${row} needs a name.`);
		} else if (label.length > MAX_SCALE_NAME) {
			add(field, `${row}: keep the name under ${MAX_SCALE_NAME} characters.`);
		} else {
			const key = criterionKey(label) || label.toLowerCase();
			const first = seen.get(key);
			if (first !== undefined) {
				add(
					field,
					`“${label}” is already criterion ${first + 1}; give each criterion its own name.`
				);
			} else seen.set(key, i);
		}
		const points = c.maxPoints;
		if (!Number.isFinite(points) || points <= 0) {
			add(field, `${row} must give more than 0 points.`);
		} else if (points > MAX_CRITERION_POINTS) {
			add(field, `${row} may give at most ${MAX_CRITERION_POINTS} points.`);
		} else if (!Number.isInteger(points * 2)) {
			add(field, `${row}: give the points in whole or half points, like 15 or 12.5.`);
		}
	});
	return problems;
}

/** True when two scales judge the same way: the same criteria, names and maxima, in order. */
export function sameCriteria(
	a: readonly ScaleCriterionDraft[],
	b: readonly ScaleCriterionDraft[]
): boolean {
	return (
		a.length === b.length &&
		a.every(
			(c, i) => c.key === b[i].key && c.label === b[i].label && c.maxPoints === b[i].maxPoints
		)
	);
}

/**
 * Keys for edited criteria: a criterion keeps the key it was loaded with (so a renamed criterion
 * is still the same line of the sheet); a new one gets a key from its name, never one in use.
 */
export function withKeys(
	criteria: readonly { key?: string; label: string; maxPoints: number }[]
): ScaleCriterionDraft[] {
	const used = new Set<string>();
	const kept = criteria.map((c) => {
		const key = c.key?.trim() ?? '';
		if (key && !used.has(key)) {
			used.add(key);
			return key;
		}
		return '';
	});
	return criteria.map((c, i) => {
		let key = kept[i];
		if (!key) {
			const base = criterionKey(c.label) || 'criterion';
			key = base;
			for (let n = 2; used.has(key); n++) key = `${base}_${n}`;
			used.add(key);
		}
		return { key, label: c.label.trim(), maxPoints: c.maxPoints };
	});
}
