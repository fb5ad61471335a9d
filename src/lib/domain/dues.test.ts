import { describe, expect, it } from 'vitest';
import {
	duesStanding,
	extendPaidThrough,
	initialFeeStatus,
	periodAddsTime,
	refundAllowed
} from './dues';

// Good standing: dues paid through the day that counts (for a show, its judging day). Common
// practice of societies that open shows only to members in good standing (DOMAIN.md).
describe('duesStanding', () => {
	it.each([
		['2027-03-31', '2027-03-31', 'current'], // paid through the very day: still current
		['2027-12-31', '2027-03-31', 'current'],
		['2027-03-30', '2027-03-31', 'lapsed'],
		[null, '2027-03-31', 'none']
	] as const)('paid through %s, on %s: %s', (paidThrough, on, standing) => {
		expect(duesStanding(paidThrough, on)).toBe(standing);
	});
});

describe('extendPaidThrough', () => {
	it.each([
		[null, '2027-12-31', '2027-12-31'],
		['2026-12-31', '2027-12-31', '2027-12-31'],
		// an older period paid late, or the same period twice, never shortens standing
		['2027-12-31', '2026-12-31', '2027-12-31'],
		['2027-12-31', '2027-12-31', '2027-12-31']
	] as const)('paid through %s, pays a period to %s: %s', (before, end, after) => {
		expect(extendPaidThrough(before, end)).toBe(after);
		expect(periodAddsTime(before, end)).toBe(before === null || after !== before);
	});
});

// Refund policies are a per-show setting (common practice: some shows refund a withdrawn entry
// up to the close of entries, others not at all).
describe('refundAllowed', () => {
	const show = { entriesClose: '2027-04-01', entryDay: '2027-04-10' };
	it.each([
		['none', '2027-03-01', false],
		['until_entries_close', '2027-04-01', true],
		['until_entries_close', '2027-04-02', false],
		['until_entry_day', '2027-04-09', true],
		['until_entry_day', '2027-04-10', false]
	] as const)('policy %s, withdrawn %s: %s', (policy, on, allowed) => {
		expect(refundAllowed(policy, show, on)).toBe(allowed);
	});
});

describe('initialFeeStatus', () => {
	it('is due only where the show charges a fee', () => {
		expect(initialFeeStatus(0)).toBe('not_required');
		expect(initialFeeStatus(300)).toBe('due');
	});
});
