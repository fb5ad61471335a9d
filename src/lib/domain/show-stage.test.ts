import { describe, expect, it } from 'vitest';
import {
	STAGE_WORDS,
	SHOW_STAGES,
	checkChange,
	datesForCopy,
	datesOutOfOrder,
	stageOf,
	type ShowChange,
	type ShowStage,
	type StageFacts
} from './show-stage';
import { todayIn } from './dates';

/**
 * A spring show laid out in the trade's usual sequence (common practice): entries open some
 * weeks ahead, close about two weeks before the show, plants come in on entry day (the day before
 * judging) and judging follows.
 */
const SPRING: StageFacts = {
	entriesOpen: '2027-03-01',
	entriesClose: '2027-04-30',
	entryDay: '2027-05-14',
	judgingDay: '2027-05-15',
	schedulePublished: true,
	resultsPublished: false
};

describe('stageOf', () => {
	const cases: [string, Partial<StageFacts>, string, ShowStage][] = [
		['nothing published, long before', { schedulePublished: false }, '2027-01-10', 'planning'],
		[
			'nothing published, dates already here',
			{ schedulePublished: false },
			'2027-03-05',
			'planning'
		],
		['schedule public, before entries open', {}, '2027-02-28', 'announced'],
		['the day entries open', {}, '2027-03-01', 'taking_entries'],
		['the day entries close (still open all day)', {}, '2027-04-30', 'taking_entries'],
		['the day after entries close', {}, '2027-05-01', 'entries_closed'],
		['the day before entry day', {}, '2027-05-13', 'entries_closed'],
		['entry day', {}, '2027-05-14', 'show_days'],
		['judging day', {}, '2027-05-15', 'show_days'],
		['the day after judging, results not out', {}, '2027-05-16', 'awaiting_results'],
		['a year later, results never out', {}, '2028-05-16', 'awaiting_results'],
		['results out on judging day', { resultsPublished: true }, '2027-05-15', 'results_out'],
		['the day after, results out', { resultsPublished: true }, '2027-05-16', 'past']
	];
	it.each(cases)('%s', (_label, overrides, today, expected) => {
		expect(stageOf({ ...SPRING, ...overrides }, today)).toBe(expected);
	});

	it('entries open and close on one day: that day takes entries (common practice for small clubs)', () => {
		const oneDay = { ...SPRING, entriesOpen: '2027-04-30' };
		expect(stageOf(oneDay, '2027-04-29')).toBe('announced');
		expect(stageOf(oneDay, '2027-04-30')).toBe('taking_entries');
	});

	it('every stage has its own words', () => {
		const labels = SHOW_STAGES.map((s) => STAGE_WORDS[s].label);
		expect(new Set(labels).size).toBe(SHOW_STAGES.length);
	});
});

describe('todayIn', () => {
	// 2027-05-15 03:30 UTC is still 14 May in Chicago (UTC-5 in May, daylight time) and already
	// 15 May in London (UTC+1) and Auckland (UTC+12): tz database offsets.
	const moment = new Date('2027-05-15T03:30:00Z');
	it.each([
		['America/Chicago', '2027-05-14'],
		['Europe/London', '2027-05-15'],
		['Pacific/Auckland', '2027-05-15'],
		['UTC', '2027-05-15']
	])('%s', (zone, expected) => {
		expect(todayIn(zone, moment)).toBe(expected);
	});

	it('decides the stage in the society’s zone: entry day starts at local midnight', () => {
		const late = new Date('2027-05-14T04:30:00Z'); // 23:30 on 13 May in Chicago
		expect(stageOf(SPRING, todayIn('America/Chicago', late))).toBe('entries_closed');
		expect(stageOf(SPRING, todayIn('Europe/London', late))).toBe('show_days');
	});
});

describe('checkChange', () => {
	const matrix: [ShowStage, ShowChange, boolean][] = [
		['planning', 'schedule', true],
		['announced', 'schedule', false],
		['taking_entries', 'schedule', false],
		['show_days', 'schedule', false],
		['planning', 'panels', true],
		['show_days', 'panels', true],
		['awaiting_results', 'panels', true],
		['results_out', 'panels', false],
		['past', 'panels', false],
		['taking_entries', 'fees', true],
		['results_out', 'fees', false],
		// The desk's window is an entry-day matter: the chair may change it until results are out.
		['show_days', 'desk_window', true],
		['awaiting_results', 'desk_window', true],
		['results_out', 'desk_window', false],
		['results_out', 'schedule', false],
		['past', 'schedule', false],
		['announced', 'publish_schedule', false],
		['planning', 'hide_schedule', false],
		['announced', 'hide_schedule', true],
		['past', 'hide_schedule', false]
	];
	it.each(matrix)('%s: %s allowed %s', (stage, change, allowed) => {
		const verdict = checkChange(stage, change, {
			entryCount: 0,
			classes: [{ code: '1', scaleId: 'scale' }]
		});
		expect(verdict.allowed).toBe(allowed);
		if (!verdict.allowed) expect(verdict.reason.length).toBeGreaterThan(20);
	});

	it('locked stages say why', () => {
		const verdict = checkChange('past', 'schedule');
		expect(verdict).toEqual({ allowed: false, reason: expect.stringContaining('published') });
	});

	it('publishing needs a class, and a scale of points for each class', () => {
		expect(checkChange('planning', 'publish_schedule', { classes: [] })).toEqual({
			allowed: false,
			reason: expect.stringContaining('no class')
		});
		const verdict = checkChange('planning', 'publish_schedule', {
			classes: [
				{ code: '1', scaleId: 's' },
				{ code: '4', scaleId: null },
				{ code: '7', scaleId: null }
			]
		});
		expect(verdict).toEqual({
			allowed: false,
			reason: expect.stringContaining('Classes 4, 7 have no scale of points')
		});
		expect(
			checkChange('planning', 'publish_schedule', { classes: [{ code: '1', scaleId: 's' }] })
		).toEqual({ allowed: true });
	});

	it('a public schedule hides only while nobody has entered', () => {
		expect(checkChange('taking_entries', 'hide_schedule', { entryCount: 1 }).allowed).toBe(false);
		expect(checkChange('taking_entries', 'hide_schedule', { entryCount: 0 }).allowed).toBe(true);
	});
});

describe('datesOutOfOrder', () => {
	it.each([
		[{ ...SPRING }, null],
		[{ ...SPRING, entriesClose: '2027-02-01' }, 'entriesClose'],
		[{ ...SPRING, entryDay: '2027-04-29' }, 'entryDay'],
		[{ ...SPRING, judgingDay: '2027-05-13' }, 'judgingDay'],
		// all on one day is in order (a one-day show where entries are taken at the door)
		[
			{
				entriesOpen: '2027-05-15',
				entriesClose: '2027-05-15',
				entryDay: '2027-05-15',
				judgingDay: '2027-05-15'
			},
			null
		]
	])('%o -> %s', (dates, field) => {
		expect(datesOutOfOrder(dates)?.field ?? null).toBe(field);
	});
});

describe('datesForCopy', () => {
	it('keeps each date’s distance from judging day (worked case)', () => {
		// Earlier show: judging Sat 15 May 2027; entries opened 75 days before, closed 15 days
		// before, entry day the day before. Next year judging is Sat 13 May 2028.
		expect(datesForCopy(SPRING, { judgingDay: '2028-05-13' })).toEqual({
			entriesOpen: '2028-02-28',
			entriesClose: '2028-04-28',
			entryDay: '2028-05-12',
			judgingDay: '2028-05-13'
		});
	});

	it('takes any date the chair gives instead', () => {
		expect(
			datesForCopy(SPRING, { judgingDay: '2028-05-13', entriesOpen: '2028-03-01', entryDay: '' })
		).toEqual({
			entriesOpen: '2028-03-01',
			entriesClose: '2028-04-28',
			entryDay: '2028-05-12',
			judgingDay: '2028-05-13'
		});
	});

	it('crosses a leap day and a year end', () => {
		const winter = {
			entriesOpen: '2027-12-20',
			entriesClose: '2028-02-27',
			entryDay: '2028-03-01',
			judgingDay: '2028-03-02'
		};
		// 2028 is a leap year: 29 February lies between entries closing and entry day.
		expect(datesForCopy(winter, { judgingDay: '2029-03-02' })).toEqual({
			entriesOpen: '2028-12-19',
			entriesClose: '2029-02-26',
			entryDay: '2029-03-01',
			judgingDay: '2029-03-02'
		});
	});
});
