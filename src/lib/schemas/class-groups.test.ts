import { describe, expect, it } from 'vitest';
import { classSchema } from './show';
import { changedRuleFields, refuseFrozenClassChange } from '$lib/domain/class-rules';
import { OPEN_CLASS_RULES, type ClassRules } from '$lib/domain/eligibility';

const form = (over: Record<string, unknown> = {}) => ({
	divisionId: '11111111-1111-4111-8111-111111111111',
	code: '40',
	name: 'Miniature Sinningia species',
	description: '',
	habit: 'any',
	sizeClasses: ['miniature'],
	blossomTypes: '',
	blossomColours: '',
	foliage: 'any',
	minCrowns: '',
	maxCrowns: '',
	collectionSize: '',
	speciesOnly: true,
	maxDiameterIn: '',
	possessionMonths: '',
	maxEntriesPerExhibitor: '',
	maxEntriesPerVariety: '',
	maxPotIn: '',
	plantKind: 'other_gesneriad',
	genera: ['sinningia'],
	growthForms: ['rosette'],
	rootTypes: ['tuberous'],
	scaleId: '',
	...over
});

describe('a class form with group rules', () => {
	it('reads the group, genera, growth forms and root types', () => {
		const parsed = classSchema.parse(form());
		expect(parsed).toMatchObject({
			plantKind: 'other_gesneriad',
			genera: ['sinningia'],
			growthForms: ['rosette'],
			rootTypes: ['tuberous'],
			speciesOnly: true
		});
	});

	it.each([
		[{ genera: ['begonia'] }, 'genera', 'Unknown genus.'],
		[{ growthForms: ['climbing'] }, 'growthForms', 'Unknown growth form.'],
		[{ rootTypes: ['bulbous'] }, 'rootTypes', 'Unknown root type.'],
		[{ plantKind: 'orchid' }, 'plantKind', 'Choose the group the class is for.'],
		[
			{ plantKind: 'african_violet' },
			'genera',
			'A class for African violets takes no other genus; untick the genera, or make it a class for the other gesneriads.'
		]
	])('refuses %o with its reason', (over, field, message) => {
		const result = classSchema.safeParse(form(over));
		expect(result.success).toBe(false);
		expect(result.error?.issues[0].path[0]).toBe(field);
		expect(result.error?.issues[0].message).toBe(message);
	});
});

describe('the group rules freeze once a class has entries', () => {
	const before: ClassRules = { ...OPEN_CLASS_RULES, genera: ['sinningia'] };
	it('sees a change of genera, and none between a rule left out and an empty one', () => {
		expect(changedRuleFields(before, { ...before, genera: ['episcia'] })).toEqual(['genera']);
		const older: ClassRules = { ...OPEN_CLASS_RULES };
		delete older.growthForms;
		expect(changedRuleFields(older, { ...OPEN_CLASS_RULES, growthForms: [] })).toEqual([]);
	});

	it('refuses a genus change on a class with entries, naming the rule', () => {
		const refusal = refuseFrozenClassChange(
			{ rules: before, divisionId: 'd', scaleId: null },
			{ rules: { ...before, genera: ['episcia'] }, divisionId: 'd', scaleId: null },
			{ entries: 2, scoredSheets: 0 }
		);
		expect(refusal?.field).toBe('genera');
		expect(refusal?.message).toMatch(/the genera cannot change/);
	});
});
