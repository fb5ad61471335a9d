import { describe, expect, it } from 'vitest';
import { describeAuditDetails, isAuditAction } from './audit';

// Plain sentences for the log page (our own wording, common practice for change logs).
describe('describeAuditDetails', () => {
	it.each([
		[
			'roles.change',
			{ before: { roles: ['judge', 'member'] }, after: { roles: ['member'] } },
			'Roles were: judge, member; now: member.'
		],
		[
			'entry.move',
			{ before: { class: '1 Standards' }, after: { class: '12 Semiminiatures' } },
			'From class 1 Standards to class 12 Semiminiatures.'
		],
		['entry.withdraw', { fee: 'refund_requested' }, 'Fee: fee refund requested.'],
		['panel.delete', { before: { judges: 1, classes: 2 } }, 'It had 1 judge and 2 classes.'],
		['division.delete', { before: { classes: 1 } }, '1 class went with it.'],
		['score.change', { before: null, after: 92 }, 'New sheet, total 92.'],
		['score.change', { before: 92, after: 88.5, notJudged: null }, 'Total 92 → 88.5.'],
		[
			'panel.class_change',
			{ before: { panel: 'Bench One' }, after: { panel: null } },
			'Panel was Bench One; now none.'
		]
	] as const)('%s', (action, details, expected) => {
		expect(describeAuditDetails(action, details as Record<string, unknown>)).toBe(expected);
	});

	it('knows its actions and nothing else', () => {
		expect(isAuditAction('class.delete')).toBe(true);
		expect(isAuditAction('toString')).toBe(false);
		expect(isAuditAction('class.destroy')).toBe(false);
	});
});
