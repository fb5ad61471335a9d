import { toInches } from '$lib/domain/units';
import type { CheckInInput } from '$lib/schemas/desk';
import { DeskProblem } from './desk-problem';

/** What the clerk measured, in inches (the unit the trade's limits are stated in). */
export interface DeskInches {
	diameter: number;
	pot: number;
	/** The longest leaf blade; null when it was not measured. */
	leaf: number | null;
}

/**
 * Converts the clerk's measurements (inches or centimeters) to inches, refusing any the entry's
 * columns cannot hold (the form's limits keep well below them).
 */
export function inchesOf(
	input: Pick<CheckInInput, 'diameter' | 'potSize' | 'leaf' | 'unit'>
): DeskInches {
	const diameter = toInches(input.diameter, input.unit);
	const pot = toInches(input.potSize, input.unit);
	const leaf = input.leaf === undefined ? null : toInches(input.leaf, input.unit);
	if (diameter >= 1000 || pot >= 100 || (leaf !== null && leaf >= 100)) {
		throw new DeskProblem('Those measurements are too large.');
	}
	return { diameter, pot, leaf };
}
