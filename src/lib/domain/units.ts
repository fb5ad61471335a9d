/** A unit of length that a grower may measure a plant or a pot in. */
export type LengthUnit = 'in' | 'cm';

/** Centimetres in one inch, exact by definition (NIST SP 811). */
export const CM_PER_INCH = 2.54;

/** The units in the order the forms list them. */
export const LENGTH_UNITS: readonly LengthUnit[] = ['in', 'cm'];

/**
 * Tells whether a value is one of our length units, so that untyped input
 * (a form field, a query string) can be narrowed before it is converted.
 */
export function isLengthUnit(value: unknown): value is LengthUnit {
	return value === 'in' || value === 'cm';
}

function assertLength(value: number): void {
	if (!Number.isFinite(value)) {
		throw new RangeError(`A length must be a finite number, not ${value}.`);
	}
	if (value < 0) {
		throw new RangeError(`A length cannot be negative, not ${value}.`);
	}
}

function assertUnit(unit: LengthUnit): void {
	if (!isLengthUnit(unit)) {
		throw new RangeError(`Unknown length unit '${String(unit)}'; use 'in' or 'cm'.`);
	}
}

/**
 * Converts a length to inches. The trade rules (size classes, show limits)
 * are stated in inches, so every measurement is compared in inches.
 * Throws a RangeError for a negative or non-finite length.
 */
export function toInches(value: number, unit: LengthUnit): number {
	assertLength(value);
	assertUnit(unit);
	return unit === 'in' ? value : value / CM_PER_INCH;
}

/**
 * Converts a length to centimeters, for growers who measure in metric.
 * Throws a RangeError for a negative or non-finite length.
 */
export function toCentimetres(value: number, unit: LengthUnit): number {
	assertLength(value);
	assertUnit(unit);
	return unit === 'cm' ? value : value * CM_PER_INCH;
}

/**
 * Formats a length held in inches for display in the reader's unit,
 * with a fixed number of decimals (default 1), e.g. `6.0 in` or `15.2 cm`.
 */
export function formatLength(inches: number, unit: LengthUnit, digits = 1): string {
	if (!Number.isInteger(digits) || digits < 0 || digits > 20) {
		throw new RangeError(`digits must be a whole number from 0 to 20, not ${digits}.`);
	}
	const value = unit === 'in' ? toInches(inches, 'in') : toCentimetres(inches, 'in');
	return `${value.toFixed(digits)} ${unit}`;
}

/** Decimals a length is shown with: inches to the hundredth (2 1/4 in pots), cm to the millimeter. */
const SHOWN_DECIMALS: Record<LengthUnit, number> = { in: 2, cm: 1 };

function shownNumber(value: number, unit: LengthUnit): string {
	const scale = 10 ** SHOWN_DECIMALS[unit];
	// The small nudge keeps halves that binary floating point stores just below .5 rounding up.
	const rounded = Math.round(value * scale + 1e-9) / scale;
	return String(rounded);
}

/**
 * Shows a length held in inches the way a society reads it: first in its own unit, then the
 * other in brackets, e.g. `6 in (15.2 cm)` or `15.2 cm (6 in)`. Inches keep up to two decimals
 * and centimeters one, without trailing zeros. Throws a RangeError for a negative or non-finite
 * length.
 */
export function formatLengthBoth(inches: number, first: LengthUnit): string {
	assertUnit(first);
	const inText = `${shownNumber(toInches(inches, 'in'), 'in')} in`;
	const cmText = `${shownNumber(toCentimetres(inches, 'in'), 'cm')} cm`;
	return first === 'in' ? `${inText} (${cmText})` : `${cmText} (${inText})`;
}

/** The units in the order a form offers them: the society's unit first. */
export function unitsFirst(first: LengthUnit): LengthUnit[] {
	return [first, ...LENGTH_UNITS.filter((u) => u !== first)];
}

/**
 * A length held in inches written as a plain number in a unit, for a form field that shows a
 * stored value (inches to the hundredth, centimeters to the millimeter), e.g. 2.25 in → "5.7".
 */
export function lengthInUnit(inches: number, unit: LengthUnit): string {
	assertUnit(unit);
	return shownNumber(unit === 'in' ? toInches(inches, 'in') : toCentimetres(inches, 'in'), unit);
}
