/**
 * Scales of points a society starts with. A minimal version for starting a society: the schedule
 * work keeps the society's scales (with versions) and replaces this file with the full one.
 */

/** A scale of points as a society edits it: its name and criteria with their maximum points. */
export interface ScaleDraft {
	name: string;
	criteria: { key: string; label: string; maxPoints: number }[];
}

/**
 * The scales a new society gets as its own editable copies. The one default is the scale for
 * single-crowned standard, semiminiature and miniature plants, total 100, published in "A
 * Beginner's Guide to Judging", African Violet Magazine, May/June 1993, rev. 2020. Fresh objects
 * on every call, so a caller may change them.
 */
export function defaultScales(): ScaleDraft[] {
	return [
		{
			name: 'Single-crowned standard, semiminiature and miniature plants',
			criteria: [
				{ key: 'symmetry', label: 'Symmetry or leaf pattern', maxPoints: 25 },
				{ key: 'condition', label: 'Condition', maxPoints: 25 },
				{ key: 'quantity_of_bloom', label: 'Quantity of bloom', maxPoints: 25 },
				{ key: 'size_and_type_of_blossom', label: 'Size and type of blossom', maxPoints: 15 },
				{ key: 'color_of_blossom', label: 'Color of blossom', maxPoints: 10 }
			]
		}
	];
}
