import { describe, expect, it } from 'vitest';
import { deskTakesEntries, type DeskWindowFacts } from './desk-window';

// Until when a desk takes entries is the show chair's choice (common practice: walk-in entries are
// taken on entry day, before judging starts); the dates are examples.
const facts = (over: Partial<DeskWindowFacts> = {}): DeskWindowFacts => ({
	until: 'judging_starts',
	stage: 'show_days',
	today: '2026-04-17',
	entryDay: '2026-04-17',
	judgingStarted: false,
	...over
});

describe('deskTakesEntries', () => {
	it.each<[string, Partial<DeskWindowFacts>, boolean]>([
		['entry day, judging not started', {}, true],
		['judging day before the first score', { today: '2026-04-18' }, true],
		['judging started', { today: '2026-04-18', judgingStarted: true }, false],
		['until the end of entry day, on entry day', { until: 'entry_day_ends' }, true],
		[
			'until the end of entry day, the day after',
			{ until: 'entry_day_ends', today: '2026-04-18' },
			false
		],
		['never', { until: 'never' }, false],
		['before entry day', { stage: 'entries_closed', today: '2026-04-10' }, false],
		['while members still enter online', { stage: 'taking_entries', today: '2026-04-01' }, false],
		['after judging', { stage: 'awaiting_results', today: '2026-04-19' }, false],
		['results out', { stage: 'results_out', today: '2026-04-19' }, false]
	])('%s', (_, over, open) => {
		expect(deskTakesEntries(facts(over)).open).toBe(open);
	});

	it('says why it is closed', () => {
		expect(deskTakesEntries(facts({ judgingStarted: true }))).toEqual({
			open: false,
			reason: 'Judging has started, so the desk takes no more entries.'
		});
		const early = deskTakesEntries(facts({ stage: 'entries_closed', today: '2026-04-10' }));
		expect(early.open === false && early.reason).toMatch(
			/^The desk takes entries from entry day, /
		);
	});
});
