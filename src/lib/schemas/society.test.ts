import { describe, expect, it } from 'vitest';
import { startSocietySchema } from './society';

const good = {
	name: 'Lakeside Violet Society',
	slug: 'lakeside-violets',
	country: 'GB',
	unit: 'cm',
	paperSize: 'a4',
	timeZone: 'Europe/London',
	currency: 'GBP'
};

describe('startSocietySchema', () => {
	it('takes a complete, sound society', () => {
		expect(startSocietySchema.parse({ ...good, name: '  Lakeside Violet Society ' })).toEqual(good);
	});

	// Short names: lower-case letters, digits and single hyphens, 3 to 60 characters (our rule).
	it.each([
		['slug', 'Lakeside', 'capitals'],
		['slug', 'lake side', 'a space'],
		['slug', '-lakeside', 'a leading hyphen'],
		['slug', 'lake--side', 'a double hyphen'],
		['slug', 'ab', 'too short'],
		['slug', 'a'.repeat(61), 'too long'],
		['name', 'ab', 'a name too short'],
		['name', 'Lake\u0007side', 'a control character'],
		['country', 'XX', 'a country not in the list'],
		['country', 'us', 'a lower-case code'],
		['unit', 'mm', 'a unit we do not show lengths in'],
		['paperSize', 'legal', 'a paper size we do not print on'],
		// IANA time zone names (tz database); "Europe/Londres" is not one.
		['timeZone', 'Europe/Londres', 'an unknown time zone'],
		['currency', 'JPY', 'a currency we do not charge in']
	])('refuses %s %j (%s) on that field', (field, value) => {
		const parsed = startSocietySchema.safeParse({ ...good, [field]: value });
		expect(parsed.success).toBe(false);
		expect(parsed.error?.issues.map((i) => i.path[0])).toEqual([field]);
	});
});
