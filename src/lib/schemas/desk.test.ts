import { describe, expect, it } from 'vitest';
import { checkInSchema, deskEntrySchema } from './desk';

// The desk's measure form as the clerk fills it in: text fields, in the society's unit.
const form = { diameter: '5', crowns: '1', potSize: '2.5', unit: 'in' };

describe('checkInSchema: the longest leaf blade', () => {
	it('is optional: an empty or missing field means it was not measured', () => {
		expect(checkInSchema.parse({ ...form, leaf: '' }).leaf).toBeUndefined();
		expect(checkInSchema.parse(form).leaf).toBeUndefined();
	});

	it('takes a length in the unit chosen, as the diameter', () => {
		// Miniature Sinningia: leaf blade at most 2.5 in (The Gesneriad Society convention show
		// schedule 2018; New England chapter schedule 2022); 6.35 cm = 2.5 in (1 in = 2.54 cm, NIST SP 811)
		expect(checkInSchema.parse({ ...form, leaf: '2.5' })).toEqual({
			diameter: 5,
			leaf: 2.5,
			crowns: 1,
			potSize: 2.5,
			unit: 'in'
		});
		expect(checkInSchema.parse({ ...form, leaf: '6.35', unit: 'cm' }).leaf).toBe(6.35);
	});

	it.each([
		['-2', 'The longest leaf blade must be more than 0.'],
		['0', 'The longest leaf blade must be more than 0.'],
		['61', 'The longest leaf blade must be at most 60.'],
		['1e9', 'The longest leaf blade must be at most 60.'],
		['two', 'Give the longest leaf blade as a number.'],
		['Infinity', 'Give the longest leaf blade as a number.']
	])('refuses %s with a clear message', (leaf, message) => {
		const parsed = checkInSchema.safeParse({ ...form, leaf });
		expect(parsed.success).toBe(false);
		expect(parsed.error?.issues.map((i) => [i.path.join('.'), i.message])).toEqual([
			['leaf', message]
		]);
	});

	it('is part of the desk entry form too', () => {
		const entry = {
			...form,
			who: 'walk_in',
			memberId: '',
			walkInName: 'Tamsin Orrery',
			walkInEmail: '',
			walkInHousehold: '',
			classId: '0b5e8f2e-3c1a-4d7b-9a61-2f4c8d9e1a23',
			varietyId: '6a7d1c44-8e2b-4f0a-b3c5-d9e8f7a6b5c4',
			acquiredOn: ''
		};
		expect(deskEntrySchema.parse({ ...entry, leaf: '2' }).leaf).toBe(2);
		expect(deskEntrySchema.safeParse({ ...entry, leaf: '-1' }).success).toBe(false);
	});
});
