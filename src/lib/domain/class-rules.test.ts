import { describe, expect, it } from 'vitest';
import {
	CLASS_RULE_FIELDS,
	changedRuleFields,
	refuseFrozenClassChange,
	type ClassFrozenParts
} from './class-rules';
import { OPEN_CLASS_RULES, type ClassRules } from './eligibility';

const parts = (rules: Partial<ClassRules> = {}, more: Partial<ClassFrozenParts> = {}) => ({
	rules: { ...OPEN_CLASS_RULES, ...rules },
	divisionId: 'div-1',
	scaleId: 'scale-1',
	...more
});

describe('which fields of a class are rules', () => {
	it('covers every eligibility rule the check reads, and nothing else', () => {
		expect([...CLASS_RULE_FIELDS].sort()).toEqual(Object.keys(OPEN_CLASS_RULES).sort());
		expect(CLASS_RULE_FIELDS).not.toContain('name');
	});

	it('compares lists as sets and numbers by value', () => {
		const before = parts({ sizeClasses: ['miniature', 'semiminiature'], maxDiameterIn: 6 }).rules;
		const same = parts({ sizeClasses: ['semiminiature', 'miniature'], maxDiameterIn: 6.0 }).rules;
		expect(changedRuleFields(before, same)).toEqual([]);
		const other = parts({ sizeClasses: ['miniature'], maxPotIn: 4 }).rules;
		expect(changedRuleFields(before, other)).toEqual(['sizeClasses', 'maxDiameterIn', 'maxPotIn']);
	});
});

describe('refuseFrozenClassChange', () => {
	// Show rules 2018 (DOMAIN.md): entries are made under the published class rules; moving a
	// misclassified entry stays possible. The rest is common practice for a show chair.
	const none = { entries: 0, scoredSheets: 0 };
	const entered = { entries: 2, scoredSheets: 0 };
	const judged = { entries: 2, scoredSheets: 1 };
	const cases: [string, ClassFrozenParts, ClassFrozenParts, typeof none, string | null][] = [
		['no entries: any rule may change', parts(), parts({ habit: 'trailer' }), none, null],
		['entries: a rule may not change', parts(), parts({ habit: 'trailer' }), entered, 'habit'],
		[
			'entries: a per-class limit may not change',
			parts(),
			parts({ maxEntriesPerExhibitor: 3 }),
			entered,
			'maxEntriesPerExhibitor'
		],
		['entries: the pot limit may not change', parts(), parts({ maxPotIn: 5 }), entered, 'maxPotIn'],
		[
			'entries: the division may not change',
			parts(),
			parts({}, { divisionId: 'div-2' }),
			entered,
			'divisionId'
		],
		[
			'entries: the scale may change before judging',
			parts(),
			parts({}, { scaleId: 'scale-2' }),
			entered,
			null
		],
		[
			'scored: the scale may not change',
			parts(),
			parts({}, { scaleId: 'scale-2' }),
			judged,
			'scaleId'
		],
		[
			'entries: nothing changed is fine',
			parts({ habit: 'trailer' }),
			parts({ habit: 'trailer' }),
			judged,
			null
		]
	];
	it.each(cases)('%s', (_, before, after, progress, field) => {
		const refusal = refuseFrozenClassChange(before, after, progress);
		expect(refusal?.field ?? null).toBe(field);
	});

	it('names the frozen rules and the entries in its reason', () => {
		const refusal = refuseFrozenClassChange(
			parts(),
			parts({ habit: 'trailer', possessionMonths: 6 }),
			entered
		);
		expect(refusal?.message).toContain('already has 2 entries');
		expect(refusal?.message).toContain('habit and possession period cannot change');
	});
});
