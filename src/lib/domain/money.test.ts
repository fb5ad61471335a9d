import { describe, expect, it } from 'vitest';
import { centsToDecimal, formatMoney, isCurrency, parseAmountToCents, sumCents } from './money';

// Minor units: USD, CAD, GBP, EUR have two decimal places (ISO 4217, standard).
describe('parseAmountToCents', () => {
	it.each([
		['25', 2500],
		['25.5', 2550],
		['25.50', 2550],
		['0.01', 1],
		['$ 12.00', 1200],
		['7,25', 725],
		[' 3 ', 300]
	])('reads %s as %i cents', (text, cents) => {
		expect(parseAmountToCents(text)).toBe(cents);
	});

	it.each(['', 'abc', '-5', '1.234', '1,000.00', '12.', '1e3', '0x10'])('refuses %j', (text) => {
		expect(parseAmountToCents(text)).toBeNull();
	});

	it('never loses a cent to floating point (0.1 + 0.2 is exactly 30 cents)', () => {
		expect(sumCents([parseAmountToCents('0.10')!, parseAmountToCents('0.20')!])).toBe(30);
	});
});

describe('centsToDecimal and formatMoney', () => {
	it.each([
		[0, '0.00', '$0.00'],
		[5, '0.05', '$0.05'],
		[2550, '25.50', '$25.50'],
		[123456789, '1234567.89', '$1,234,567.89']
	])('%i cents is %s, shown as %s', (cents, decimal, shown) => {
		expect(centsToDecimal(cents)).toBe(decimal);
		expect(formatMoney(cents, 'USD')).toBe(shown);
	});

	it('names other currencies', () => {
		expect(formatMoney(1000, 'GBP')).toBe('£10.00');
		expect(formatMoney(1000, 'EUR')).toBe('€10.00');
	});

	it('refuses fractions of a cent', () => {
		expect(() => centsToDecimal(10.5)).toThrow(RangeError);
		expect(() => sumCents([1, 0.5])).toThrow(RangeError);
	});

	it('knows the accepted currencies', () => {
		expect(isCurrency('USD')).toBe(true);
		expect(isCurrency('JPY')).toBe(false); // no minor unit: not accepted
		expect(isCurrency('usd')).toBe(false);
	});
});
