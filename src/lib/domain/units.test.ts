import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import {
	CM_PER_INCH,
	formatLength,
	formatLengthBoth,
	lengthInUnit,
	unitsFirst,
	isLengthUnit,
	toCentimetres,
	toInches,
	type LengthUnit
} from './units';

describe('CM_PER_INCH', () => {
	it('is exactly 2.54', () => {
		expect(CM_PER_INCH).toBe(2.54); // 1 in = 2.54 cm: NIST SP 811
	});
});

describe('toInches', () => {
	it.each<[number, LengthUnit, number, string]>([
		[6, 'in', 6, 'inches pass through'],
		[0, 'cm', 0, 'zero stays zero'],
		[2.54, 'cm', 1, '1 in = 2.54 cm: NIST SP 811'],
		[15.24, 'cm', 6, 'miniature limit 6 in = 15.24 cm; 1 in = 2.54 cm: NIST SP 811'],
		[20.32, 'cm', 8, 'semiminiature limit 8 in = 20.32 cm; 1 in = 2.54 cm: NIST SP 811'],
		[40.64, 'cm', 16, 'large 16 in = 40.64 cm; 1 in = 2.54 cm: NIST SP 811']
	])('%s %s is %s in (%s)', (value, unit, expected) => {
		expect(toInches(value, unit)).toBeCloseTo(expected, 12);
	});
});

describe('toCentimetres', () => {
	it.each<[number, LengthUnit, number, string]>([
		[15, 'cm', 15, 'centimeters pass through'],
		[0, 'in', 0, 'zero stays zero'],
		[1, 'in', 2.54, '1 in = 2.54 cm: NIST SP 811'],
		[6, 'in', 15.24, '1 in = 2.54 cm: NIST SP 811'],
		[8, 'in', 20.32, '1 in = 2.54 cm: NIST SP 811'],
		[2.25, 'in', 5.715, 'a 2 1/4 in pot; 1 in = 2.54 cm: NIST SP 811']
	])('%s %s is %s cm (%s)', (value, unit, expected) => {
		expect(toCentimetres(value, unit)).toBeCloseTo(expected, 12);
	});
});

describe('formatLength', () => {
	it.each<[number, LengthUnit, number | undefined, string]>([
		[6, 'in', undefined, '6.0 in'],
		[6, 'cm', undefined, '15.2 cm'], // 1 in = 2.54 cm: NIST SP 811
		[6, 'cm', 2, '15.24 cm'], // 1 in = 2.54 cm: NIST SP 811
		[8, 'cm', 0, '20 cm'], // 1 in = 2.54 cm: NIST SP 811
		[6.125, 'in', 3, '6.125 in'],
		[0, 'in', 0, '0 in']
	])('formats %s in as %s with %s digits', (inches, unit, digits, expected) => {
		expect(formatLength(inches, unit, digits)).toBe(expected);
	});

	it.each([-1, 1.5, 21, Number.NaN])('rejects %s digits', (digits) => {
		expect(() => formatLength(6, 'in', digits)).toThrow(RangeError);
	});

	it('rejects a negative length', () => {
		expect(() => formatLength(-1, 'cm')).toThrow(RangeError);
	});
});

describe('bad input', () => {
	const bad = [-0.1, -6, Number.NaN, Number.POSITIVE_INFINITY, Number.NEGATIVE_INFINITY];
	it.each(bad)('toInches rejects %s', (value) => {
		expect(() => toInches(value, 'cm')).toThrow(RangeError);
		expect(() => toInches(value, 'in')).toThrow(RangeError);
	});
	it.each(bad)('toCentimetres rejects %s', (value) => {
		expect(() => toCentimetres(value, 'in')).toThrow(RangeError);
		expect(() => toCentimetres(value, 'cm')).toThrow(RangeError);
	});
	it('rejects an unknown unit from untyped input', () => {
		expect(() => toInches(1, 'mm' as LengthUnit)).toThrow(RangeError);
		expect(() => toCentimetres(1, 'ft' as LengthUnit)).toThrow(RangeError);
	});
});

describe('isLengthUnit', () => {
	it.each<[unknown, boolean]>([
		['in', true],
		['cm', true],
		['mm', false],
		['IN', false],
		[undefined, false],
		[2.54, false]
	])('%s -> %s', (value, expected) => {
		expect(isLengthUnit(value)).toBe(expected);
	});
});

describe('properties', () => {
	const length = fc.double({ min: 0, max: 1e6, noNaN: true });

	it('converting to centimeters and back returns the same length', () => {
		fc.assert(
			fc.property(length, (inches) => {
				const back = toInches(toCentimetres(inches, 'in'), 'cm');
				expect(back).toBeCloseTo(inches, 6);
			})
		);
	});

	it('a length in centimeters is never smaller than the same length in inches', () => {
		fc.assert(
			fc.property(length, (inches) => {
				expect(toCentimetres(inches, 'in')).toBeGreaterThanOrEqual(inches);
			})
		);
	});
});

describe('formatLengthBoth', () => {
	// Every value below: 1 in = 2.54 cm exactly (NIST SP 811).
	it.each<[number, LengthUnit, string, string]>([
		[6, 'in', '6 in (15.2 cm)', 'miniature limit, 6 in = 15.24 cm'],
		[6, 'cm', '15.2 cm (6 in)', 'the same limit for a society that measures in cm'],
		[8, 'in', '8 in (20.3 cm)', 'semiminiature limit, 8 in = 20.32 cm'],
		[16, 'cm', '40.6 cm (16 in)', 'large, 16 in = 40.64 cm'],
		[2.25, 'in', '2.25 in (5.7 cm)', 'a 2 1/4 in pot = 5.715 cm'],
		[2.25, 'cm', '5.7 cm (2.25 in)', 'the same pot in cm first'],
		[5.91, 'cm', '15 cm (5.91 in)', '15 cm typed and stored as 5.91 in = 15.0114 cm'],
		[1, 'cm', '2.5 cm (1 in)', '1 in = 2.54 cm, to the millimeter'],
		[0, 'in', '0 in (0 cm)', 'zero stays zero']
	])('%s in shown with %s first is %s (%s)', (inches, unit, expected) => {
		expect(formatLengthBoth(inches, unit)).toBe(expected);
	});

	it('refuses a negative length and an unknown unit', () => {
		expect(() => formatLengthBoth(-1, 'in')).toThrow(RangeError);
		expect(() => formatLengthBoth(1, 'mm' as LengthUnit)).toThrow(RangeError);
	});
});

describe('unitsFirst', () => {
	it('puts the society unit first', () => {
		expect(unitsFirst('cm')).toEqual(['cm', 'in']);
		expect(unitsFirst('in')).toEqual(['in', 'cm']);
	});
});

describe('lengthInUnit', () => {
	it.each<[number, LengthUnit, string, string]>([
		[2.25, 'in', '2.25', 'inches as stored'],
		[2.25, 'cm', '5.7', '2.25 in = 5.715 cm: NIST SP 811'],
		[6, 'cm', '15.2', '6 in = 15.24 cm: NIST SP 811']
	])('%s in in %s is %s (%s)', (inches, unit, expected) => {
		expect(lengthInUnit(inches, unit)).toBe(expected);
	});
});
