import type { Visitor } from '../access/people';

/**
 * How the bad-input test reaches each form action and endpoint: who sends it (someone allowed to
 * use it, so the input itself is what gets checked), which fields the input has, and what is
 * corrupted. Every action and endpoint method of the app needs an entry (the test fails otherwise).
 */
export interface BadInputTarget {
	as: Visitor;
	/** The fields the action or endpoint reads; samples corrupt them and add others. */
	fields: string[];
	/** body: the form or JSON; path: the route's params (and query); query: the query string. */
	corrupt: 'form' | 'json' | 'path' | 'query+path';
	/** Route params (a leading $ names a value looked up by access/params.ts). */
	params?: Record<string, string>;
	/** Samples always carry at least one of the fields (an empty form is a valid one here). */
	needsField?: boolean;
	/** A reason this target takes no input that could be bad (the test then skips it). */
	noInput?: string;
}

/** A well-formed id that names nothing. */
const NOTHING = '00000000-0000-4000-8000-000000000000';

const PLANT_FIELDS = [
	'name',
	'varietyId',
	'obtainedOn',
	'obtainedHow',
	'potSize',
	'unit',
	'crowns',
	'diameter',
	'note',
	'parentId',
	'label'
];
const CLASS_FIELDS = [
	'id',
	'divisionId',
	'code',
	'name',
	'sizeClasses',
	'habit',
	'speciesOnly',
	'blossomTypes',
	'maxCrowns',
	'plantKind',
	'genera',
	'growthForms',
	'rootTypes',
	'sort'
];

export const BAD_INPUT_TARGETS: Record<string, BadInputTarget> = {
	// Society admin: dues, fees and members (issue 7).
	'/admin/dues action:addPeriod': {
		as: 'admin',
		corrupt: 'form',
		fields: ['societyId', 'label', 'amountCents', 'startsOn', 'endsOn']
	},
	'/admin/dues action:removePeriod': {
		as: 'admin',
		corrupt: 'form',
		fields: ['societyId', 'periodId', 'confirm']
	},
	'/admin/dues action:setCurrency': {
		as: 'admin',
		corrupt: 'form',
		fields: ['societyId', 'currency']
	},
	'/admin/dues action:setFee': {
		as: 'admin',
		corrupt: 'form',
		fields: ['societyId', 'showId', 'entryFeeCents', 'entryFeeRefund']
	},
	'/admin/members action:invite': {
		as: 'admin',
		corrupt: 'form',
		fields: ['societyId', 'email', 'name', 'roles']
	},
	'/admin/members action:changeRoles': {
		as: 'admin',
		corrupt: 'form',
		fields: ['societyId', 'userId', 'roles', 'confirm']
	},
	'/api/admin/members api:GET': {
		as: 'admin',
		corrupt: 'query+path',
		fields: ['society', 'sort', 'dir', 'q', 'role', 'standing', 'page']
	},
	'/api/payments/webhook api:POST': {
		as: 'anon',
		corrupt: 'json',
		fields: ['id', 'type', 'data', 'created']
	},
	'/my/membership action:pay': {
		as: 'member',
		corrupt: 'form',
		fields: ['societyId', 'periodId']
	},
	'/my/payments action:pay': { as: 'member', corrupt: 'form', fields: ['showId'] },
	// Results (issue 5).
	'/api/chair/shows/[slug]/results-mail api:GET': { as: 'chair', corrupt: 'path', fields: [] },
	'/chair/shows/[slug]/results action:resend': { as: 'chair', corrupt: 'form', fields: ['id'] },
	// Whole-show PDFs built by the worker (issue 18): which document to build.
	'/chair/shows/[slug]/results action:build': {
		as: 'chair',
		corrupt: 'form',
		fields: ['document']
	},
	'/chair/shows/[slug]/results/[document] api:GET': {
		as: 'chair',
		corrupt: 'path',
		fields: [],
		params: { document: 'award-sheets' }
	},
	'/shows/[slug]/results/results.csv api:GET': { as: 'member', corrupt: 'path', fields: [] },
	'/api/chair/shows/[showId]/entry-reminders api:POST': {
		as: 'chair',
		corrupt: 'path',
		fields: []
	},
	'/api/chair/shows/[slug]/board api:GET': { as: 'chair', corrupt: 'path', fields: [] },
	'/api/desk/shows/[slug]/entries api:GET': { as: 'clerk', corrupt: 'path', fields: [] },
	'/api/judging/classes/[classId] api:GET': { as: 'judge', corrupt: 'path', fields: [] },
	'/api/judging/sheets api:PUT': {
		as: 'judge',
		corrupt: 'json',
		fields: [
			'changeId',
			'entryId',
			'baseVersion',
			'deductions',
			'comment',
			'notJudged',
			'judgesChoiceRank'
		]
	},
	'/api/my/entries api:POST': {
		as: 'member',
		corrupt: 'json',
		fields: ['showSlug', 'classId', 'varietyId', 'acquiredOn']
	},
	'/api/my/entries/check api:POST': {
		as: 'member',
		corrupt: 'json',
		fields: ['showSlug', 'classId', 'varietyId', 'acquiredOn']
	},
	'/api/photos/[id] api:GET': {
		as: 'member',
		corrupt: 'path',
		fields: [],
		params: { id: NOTHING }
	},
	'/api/varieties api:GET': { as: 'member', corrupt: 'query+path', fields: ['society', 'q'] },
	'/chair/shows/[slug] action:save': {
		as: 'chair',
		corrupt: 'form',
		fields: [
			'name',
			'venue',
			'entryDay',
			'judgingDay',
			'entriesOpen',
			'entriesClose',
			'possessionMonths',
			'maxEntriesPerClass',
			'requireGoodStanding',
			'publicHours'
		]
	},
	'/chair/shows/[slug] action:sharePoints': { as: 'chair', corrupt: 'form', fields: ['share'] },
	'/chair/shows/[slug] action:deskEntries': { as: 'chair', corrupt: 'form', fields: ['until'] },
	'/chair/shows/[slug] action:publish': {
		as: 'chair',
		corrupt: 'form',
		fields: ['published', 'confirm']
	},
	'/chair/shows/[slug]/awards action:publish': {
		as: 'chair',
		corrupt: 'form',
		fields: ['allowIncomplete', 'confirm']
	},
	'/chair/shows/[slug]/awards/rules action:default': {
		as: 'chair',
		corrupt: 'form',
		fields: [
			'awardSystem',
			'blue',
			'red',
			'white',
			'honourable',
			'bestInClassMin',
			'topAwards',
			'tieBreak',
			'useJudgesChoice',
			// i-awards: the three award settings (issue 13, item 6)
			'honorableMentions.rule',
			'honorableMentions.count',
			'meanRounding',
			'topAwardsPerPlant'
		]
	},
	'/chair/shows/[slug]/panels action:createPanel': {
		as: 'chair',
		corrupt: 'form',
		fields: ['name']
	},
	'/chair/shows/[slug]/panels action:deletePanel': {
		as: 'chair',
		corrupt: 'form',
		fields: ['panelId', 'confirm']
	},
	'/chair/shows/[slug]/panels action:addJudge': {
		as: 'chair',
		corrupt: 'form',
		fields: ['panelId', 'userId']
	},
	'/chair/shows/[slug]/panels action:removeJudge': {
		as: 'chair',
		corrupt: 'form',
		fields: ['panelId', 'userId', 'confirm']
	},
	'/chair/shows/[slug]/panels action:setClerk': {
		as: 'chair',
		corrupt: 'form',
		fields: ['panelId', 'userId', 'confirm']
	},
	'/chair/shows/[slug]/panels action:assignClass': {
		as: 'chair',
		corrupt: 'form',
		fields: ['classId', 'panelId', 'confirm']
	},
	'/chair/shows/[slug]/schedule action:saveDivision': {
		as: 'chair',
		corrupt: 'form',
		fields: ['id', 'code', 'name', 'sort']
	},
	'/chair/shows/[slug]/schedule action:deleteDivision': {
		as: 'chair',
		corrupt: 'form',
		fields: ['id', 'confirm']
	},
	'/chair/shows/[slug]/schedule action:saveClass': {
		as: 'chair',
		corrupt: 'form',
		fields: CLASS_FIELDS
	},
	'/chair/shows/[slug]/schedule action:deleteClass': {
		as: 'chair',
		corrupt: 'form',
		fields: ['id', 'confirm']
	},
	'/chair/varieties action:save': {
		as: 'chair',
		corrupt: 'form',
		fields: [
			'societyId',
			'id',
			'name',
			'hybridizer',
			'isSpecies',
			'plantGroup',
			'growthForm',
			'botanicalName',
			'sizeClass',
			'blossomType',
			'blossomColours',
			'foliage',
			'description'
		]
	},
	'/chair/varieties action:import': {
		as: 'chair',
		corrupt: 'form',
		fields: ['societyId', 'file', 'goodRowsOnly']
	},
	'/chair/varieties/export api:GET': { as: 'chair', corrupt: 'query+path', fields: ['society'] },
	'/desk/[slug]/entries/[number] action:checkIn': {
		as: 'clerk',
		corrupt: 'form',
		fields: ['crowns', 'diameter', 'leaf', 'unit', 'note']
	},
	'/desk/[slug]/entries/[number] action:move': {
		as: 'clerk',
		corrupt: 'form',
		fields: ['classId', 'confirm']
	},
	'/desk/[slug]/entries/[number] action:scratch': {
		as: 'clerk',
		corrupt: 'form',
		fields: ['reason', 'confirm']
	},
	'/desk/[slug]/tags api:GET': { as: 'clerk', corrupt: 'query+path', fields: ['numbers'] },
	'/desk/[slug] action:fixNumbers': { as: 'clerk', corrupt: 'form', fields: ['confirm'] },
	'/desk/[slug]/entries/[number] action:arrived': {
		as: 'clerk',
		corrupt: 'form',
		fields: [],
		noInput:
			'One tap: the action reads no field; its show and entry come from the path, as for check-in.'
	},
	'/desk/[slug]/enter action:enter': {
		as: 'clerk',
		corrupt: 'form',
		fields: [
			'memberId',
			'walkInName',
			'walkInEmail',
			'walkInHousehold',
			'classId',
			'varietyId',
			'acquiredOn',
			'diameter',
			'leaf',
			'crowns',
			'potSize',
			'unit'
		]
	},
	'/desk/[slug]/paper/sheets api:GET': { as: 'clerk', corrupt: 'query+path', fields: ['class'] },
	'/desk/[slug]/paper/panels api:GET': { as: 'clerk', corrupt: 'query+path', fields: ['panel'] },
	'/desk/[slug]/paper/[classId] action:type': {
		as: 'clerk',
		corrupt: 'form',
		fields: ['version', 'comment', 'symmetry']
	},
	'/e/[slug]/[number] api:GET': { as: 'clerk', corrupt: 'path', fields: [] },
	'/my/entries/[id] action:upload': {
		as: 'member',
		corrupt: 'form',
		fields: ['photo'],
		params: { id: '$memberEntryId' }
	},
	'/my/entries/[id] action:deletePhoto': {
		as: 'member',
		corrupt: 'form',
		fields: ['photoId', 'confirm'],
		params: { id: '$memberEntryId' }
	},
	'/my/mail action:default': {
		as: 'member',
		corrupt: 'form',
		fields: ['reminders', 'results'],
		needsField: true // nothing ticked is a valid answer
	},
	'/my/plants/[plantId] action:log': {
		as: 'member',
		corrupt: 'form',
		fields: ['kind', 'happenedOn', 'diameter', 'unit', 'crowns', 'potSize', 'note']
	},
	'/my/plants/[plantId] action:deleteEvent': {
		as: 'member',
		corrupt: 'form',
		fields: ['id', 'confirm']
	},
	'/my/plants/[plantId] action:potSucker': {
		as: 'member',
		corrupt: 'form',
		fields: ['happenedOn', 'potSize', 'label']
	},
	'/my/plants/[plantId] action:photo': {
		as: 'member',
		corrupt: 'form',
		fields: ['photo', 'caption']
	},
	'/my/plants/[plantId] action:deletePhoto': {
		as: 'member',
		corrupt: 'form',
		fields: ['id', 'confirm']
	},
	'/my/plants/[plantId] action:gone': {
		as: 'member',
		corrupt: 'form',
		fields: ['goneOn', 'note', 'confirm']
	},
	'/my/plants/[plantId]/edit action:default': {
		as: 'member',
		corrupt: 'form',
		fields: PLANT_FIELDS
	},
	'/my/plants/[plantId]/photos/[photoId] api:GET': {
		as: 'member',
		corrupt: 'path',
		fields: [],
		params: { photoId: NOTHING }
	},
	'/my/society-record/record.csv api:GET': {
		as: 'member',
		corrupt: 'query+path',
		fields: ['society']
	},
	'/my/plants/labels/pdf api:GET': { as: 'member', corrupt: 'query+path', fields: ['plant'] },
	'/my/plants/new action:default': { as: 'member', corrupt: 'form', fields: PLANT_FIELDS },
	'/my/plants/readiness action:enter': {
		as: 'member',
		corrupt: 'form',
		fields: ['plantId', 'classId', 'showId', 'show']
	},
	'/my/shows/[slug] action:enter': {
		as: 'member',
		corrupt: 'form',
		fields: ['classId', 'varietyId', 'acquiredOn', 'plantId']
	},
	'/my/shows/[slug] action:withdraw': {
		as: 'member',
		corrupt: 'form',
		fields: ['entryId', 'confirm']
	},
	'/shows/[slug]/schedule.pdf api:GET': { as: 'anon', corrupt: 'path', fields: [] },
	'/signin action:default': { as: 'anon', corrupt: 'form', fields: ['email', 'redirectTo'] },
	'/signout action:default': {
		as: 'member',
		corrupt: 'form',
		fields: [],
		noInput:
			'signing out reads no input: whatever is sent, the session ends (checked in sign-in-and-roles.spec.ts)'
	},
	// i-shows: starting a show, empty or as a copy (issue 13, item 3).
	'/chair/shows/new action:create': {
		as: 'chair',
		corrupt: 'form',
		fields: [
			'societyId',
			'name',
			'slug',
			'venue',
			'entriesOpen',
			'entriesClose',
			'entryDay',
			'judgingDay',
			'awardSystem',
			'panelScoreMethod'
		]
	},
	'/chair/shows/new action:copy': {
		as: 'chair',
		corrupt: 'form',
		fields: [
			'societyId',
			'sourceShowId',
			'name',
			'slug',
			'venue',
			'entriesOpen',
			'entriesClose',
			'entryDay',
			'judgingDay'
		]
	},
	// i-schedule: schedule order and text, the society's scales of points.
	'/chair/shows/[slug]/schedule action:moveDivision': {
		as: 'chair',
		corrupt: 'form',
		fields: ['id', 'direction']
	},
	'/chair/shows/[slug]/schedule action:moveClass': {
		as: 'chair',
		corrupt: 'form',
		fields: ['id', 'direction']
	},
	'/chair/shows/[slug]/schedule action:saveText': {
		as: 'chair',
		corrupt: 'form',
		fields: ['part', 'text']
	},
	'/chair/scales action:save': {
		as: 'chair',
		corrupt: 'form',
		fields: ['societyId', 'id', 'name', 'label', 'maxPoints', 'key']
	},
	'/chair/scales action:copy': { as: 'chair', corrupt: 'form', fields: ['societyId', 'id'] },
	// i-society: starting a society, and the admin's society settings.
	'/societies/new action:default': {
		as: 'member',
		corrupt: 'form',
		fields: ['name', 'slug', 'country', 'unit', 'paperSize', 'timeZone', 'currency']
	},
	'/admin/society action:save': {
		as: 'admin',
		corrupt: 'form',
		fields: ['societyId', 'name', 'slug', 'country', 'unit', 'paperSize', 'timeZone', 'currency']
	},
	// Operations (issue 18): health for a load balancer, and the society's failed jobs.
	'/healthz api:GET': {
		as: 'anon',
		corrupt: 'path',
		fields: [],
		noInput: 'the liveness answer reads nothing from the request'
	},
	'/readyz api:GET': {
		as: 'anon',
		corrupt: 'path',
		fields: [],
		noInput: 'the readiness answer reads nothing from the request'
	},
	'/admin/jobs action:retry': { as: 'admin', corrupt: 'form', fields: ['societyId', 'jobId'] }
};
