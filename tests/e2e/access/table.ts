import type { Visitor } from './people';

/**
 * What each visitor gets from a route: a status code, or 'signin' for a redirect to the sign-in
 * page. Every route of the app must have a row (the access test fails otherwise).
 */
export type Answer = 200 | 303 | 'signin' | 400 | 401 | 403 | 404 | 405 | 409;

export interface AccessRow {
	/** The route id, as in src/routes (with [params]). */
	route: string;
	method?: 'GET' | 'POST' | 'PUT' | 'PATCH' | 'DELETE';
	/** Values for the route's params, by name; defaults come from params.ts. */
	params?: Record<string, string>;
	/** Query string to add; $name takes a looked-up value (params.ts). */
	query?: string;
	answers: Record<Visitor, Answer>;
}

const all = (answer: Answer): Record<Visitor, Answer> => ({
	anon: answer,
	other: answer,
	member: answer,
	clerk: answer,
	judge: answer,
	chair: answer,
	admin: answer
});

/** A page open to the listed visitors; signed-out visitors are sent to sign in, others get 403. */
const pageFor = (...allowed: Visitor[]): Record<Visitor, Answer> => ({
	...all(403),
	anon: 'signin',
	...Object.fromEntries(allowed.map((v) => [v, 200]))
});

/** An API open to the listed visitors; signed-out visitors get 401, others 403. */
const apiFor = (...allowed: Visitor[]): Record<Visitor, Answer> => ({
	...all(403),
	anon: 401,
	...Object.fromEntries(allowed.map((v) => [v, 200]))
});

/** A plant of member@'s own collection: only its owner sees it; other members get 404. */
function ownPlant(): Record<Visitor, Answer> {
	return { ...pageFor('member'), clerk: 404, chair: 404, admin: 404, other: 404 };
}

// Who is who (demo seed): other = admin and chair of another society; member = exhibitor;
// clerk, chair and admin also hold the member role; judge1 is a judge only.
export const ACCESS_TABLE: AccessRow[] = [
	{ route: '/', answers: all(200) },
	{ route: '/signin', answers: { ...all(303), anon: 200 } },
	{ route: '/signin/check-mail', answers: all(200) },
	{ route: '/signin/problem', answers: all(200) },
	{ route: '/signout', answers: all(303) },
	{ route: '/dev/mail', answers: all(200) },
	{ route: '/home', answers: { ...all(200), anon: 'signin', member: 303, judge: 303 } },
	{ route: '/admin', answers: pageFor('admin', 'other') },
	{ route: '/admin', query: 'society=cedar-ridge', answers: { ...pageFor('other'), admin: 403 } },
	{ route: '/chair', answers: pageFor('chair', 'other') },
	// Schedule, registry, entries and the desk (issue 3).
	{ route: '/shows/[slug]', answers: all(200) },
	{ route: '/shows/[slug]/schedule.pdf', answers: all(200) },
	{ route: '/chair/shows/[slug]', answers: pageFor('chair') },
	{ route: '/chair/shows/[slug]/schedule', answers: pageFor('chair') },
	{ route: '/chair/varieties', answers: pageFor('chair', 'other') },
	{
		route: '/chair/varieties/export',
		query: 'society=larkspur-valley',
		answers: { ...pageFor('chair'), other: 403 }
	},
	{
		route: '/chair/varieties/export',
		query: 'society=cedar-ridge',
		answers: { ...pageFor('other'), chair: 403 }
	},
	{ route: '/desk/[slug]', answers: pageFor('clerk', 'chair') },
	{ route: '/desk/[slug]/entries/[number]', answers: pageFor('clerk', 'chair') },
	{ route: '/desk/[slug]/table', answers: pageFor('clerk', 'chair') },
	{ route: '/desk/[slug]/tags', query: 'numbers=1', answers: pageFor('clerk', 'chair') },
	// Entry day at the desk (issue 14): desk entries, paper sheets; typing in is the panel clerk's.
	{ route: '/desk/[slug]/enter', answers: pageFor('clerk', 'chair') },
	{ route: '/desk/[slug]/paper', answers: pageFor('clerk', 'chair') },
	{ route: '/desk/[slug]/paper/sheets', answers: pageFor('clerk', 'chair') },
	{ route: '/desk/[slug]/paper/panels', answers: pageFor('clerk', 'chair') },
	{ route: '/desk/[slug]/paper/[classId]', answers: pageFor('clerk') },
	{ route: '/api/desk/shows/[slug]/entries', answers: apiFor('clerk', 'chair') },
	{
		route: '/e/[slug]/[number]',
		answers: { ...pageFor(), clerk: 303, chair: 303, judge: 303 }
	},
	{ route: '/my/shows/[slug]', answers: pageFor('member', 'clerk', 'chair', 'admin') },
	{
		route: '/my/entries/[id]',
		params: { id: '$memberEntryId' },
		answers: { ...pageFor('member'), clerk: 404, chair: 404, admin: 404, other: 404 }
	},
	{
		route: '/api/photos/[id]',
		params: { id: '00000000-0000-4000-8000-000000000000' },
		answers: { ...all(404), anon: 401 }
	},
	{
		route: '/api/varieties',
		query: 'society=$societyId&q=a',
		answers: { ...all(200), anon: 401, other: 403 }
	},
	{ route: '/api/varieties', query: 'q=a', answers: { ...all(400), anon: 401 } },
	{
		route: '/api/my/entries',
		answers: { ...apiFor(), member: 405, clerk: 405, chair: 405, admin: 405, other: 405 }
	},
	{
		route: '/api/my/entries/check',
		answers: { ...apiFor(), member: 405, clerk: 405, chair: 405, admin: 405, other: 405 }
	},
	{ route: '/desk', answers: pageFor('clerk', 'chair', 'other') },
	// Judging (issue 4): judges, and clerks who keep a panel's sheets; judge1 and clerk@ are on
	// the panel of the class and entry used here. Chair pages are for the show's own chair.
	{ route: '/judging', answers: pageFor('judge', 'clerk') },
	{ route: '/judging/class/[classId]', answers: pageFor('judge', 'clerk') },
	{ route: '/judging/entry/[entryId]', answers: pageFor('judge', 'clerk') },
	{ route: '/api/judging/classes/[classId]', answers: apiFor('judge', 'clerk') },
	{ route: '/api/judging/sheets', answers: { ...apiFor(), judge: 405, clerk: 405 } },
	{ route: '/chair/shows/[slug]/panels', answers: pageFor('chair') },
	{ route: '/chair/shows/[slug]/board', answers: pageFor('chair') },
	{ route: '/chair/shows/[slug]/awards', answers: pageFor('chair') },
	{ route: '/chair/shows/[slug]/awards/rules', answers: pageFor('chair') },
	{ route: '/chair/shows/[slug]/audit', answers: pageFor('chair') },
	{ route: '/api/chair/shows/[slug]/board', answers: apiFor('chair') },
	{ route: '/my', answers: pageFor('member', 'clerk', 'chair', 'admin', 'other') },
	// The member's collection (issue 6): plants are private to their owner (member@), so other
	// members get 404 for them; a judge who is no member gets 403.
	{ route: '/my/plants', answers: pageFor('member', 'clerk', 'chair', 'admin', 'other') },
	{ route: '/my/plants/new', answers: pageFor('member', 'clerk', 'chair', 'admin', 'other') },
	{ route: '/my/plants/labels', answers: pageFor('member', 'clerk', 'chair', 'admin', 'other') },
	{
		route: '/my/plants/labels/pdf',
		answers: { ...pageFor(), member: 400, clerk: 400, chair: 400, admin: 400, other: 400 }
	},
	{ route: '/my/plants/readiness', answers: pageFor('member', 'clerk', 'chair', 'admin', 'other') },
	{ route: '/my/plants/[plantId]', answers: ownPlant() },
	{ route: '/my/plants/[plantId]/edit', answers: ownPlant() },
	{ route: '/my/plants/[plantId]/lineage', answers: ownPlant() },
	{
		route: '/my/plants/[plantId]/photos/[photoId]',
		params: { photoId: '00000000-0000-4000-8000-000000000000' },
		answers: { ...ownPlant(), member: 404 }
	},
	{
		route: '/my/plants/[plantId]',
		params: { plantId: 'not-an-id' },
		answers: { ...ownPlant(), member: 404 }
	},
	// Results and records (issue 16): one's own record; a society's record for its members only.
	{ route: '/my/record', answers: pageFor('member', 'clerk', 'chair', 'admin', 'other') },
	{ route: '/my/society-record', answers: pageFor('member', 'clerk', 'chair', 'admin', 'other') },
	{
		route: '/my/society-record',
		query: 'society=cedar-ridge',
		answers: { ...pageFor('other'), member: 404, clerk: 404, chair: 404, admin: 404 }
	},
	{
		route: '/my/society-record',
		query: 'society=larkspur-valley',
		answers: { ...pageFor('member', 'clerk', 'chair', 'admin'), other: 404 }
	},
	{
		route: '/my/society-record/record.csv',
		answers: pageFor('member', 'clerk', 'chair', 'admin', 'other')
	},
	{
		route: '/my/society-record/record.csv',
		query: 'society=larkspur-valley',
		answers: { ...pageFor('member', 'clerk', 'chair', 'admin'), other: 404 }
	},
	{ route: '/my/mail', answers: pageFor('member', 'clerk', 'chair', 'admin', 'other') },
	{
		route: '/api/chair/shows/[showId]/entry-reminders',
		answers: { ...apiFor(), chair: 405, other: 405 }
	},
	{ route: '/admin/members', answers: pageFor('admin', 'other') },
	{
		route: '/admin/members',
		query: 'society=cedar-ridge',
		answers: { ...pageFor('other'), admin: 403 }
	},
	{ route: '/admin/dues', answers: pageFor('admin', 'other') },
	{
		route: '/admin/dues',
		query: 'society=cedar-ridge',
		answers: { ...pageFor('other'), admin: 403 }
	},
	{
		route: '/api/admin/members',
		query: 'society=larkspur-valley&sort=duesPaidThrough',
		answers: apiFor('admin')
	},
	{
		route: '/api/admin/members',
		query: 'sort=nonsense',
		answers: { ...apiFor(), admin: 400, other: 400 }
	},
	{ route: '/my/membership', answers: pageFor('member', 'clerk', 'chair', 'admin', 'other') },
	{ route: '/my/payments', answers: pageFor('member', 'clerk', 'chair', 'admin', 'other') },
	// Public, but only a correctly signed event changes anything.
	{ route: '/api/payments/webhook', answers: all(405) },
	{ route: '/api/payments/webhook', method: 'POST', answers: all(400) },
	// Results (the spring show's are not published: the public page says so, the CSV is 404).
	{ route: '/shows/[slug]/results', answers: all(200) },
	{ route: '/shows/[slug]/results/results.csv', answers: all(404) },
	{ route: '/chair/shows/[slug]/results', answers: pageFor('chair') },
	{
		route: '/chair/shows/[slug]/results/[document]',
		params: { document: 'award-sheets.pdf' },
		answers: { ...pageFor('chair'), chair: 409 }
	},
	{ route: '/api/chair/shows/[slug]/results-mail', answers: apiFor('chair') },
	// The audit log (issue 9): the society admin reads their society's; filters it does not
	// understand are left out (the page says so), never a 5xx.
	{ route: '/admin/audit', answers: pageFor('admin', 'other') },
	{
		route: '/admin/audit',
		query: 'society=cedar-ridge',
		answers: { ...pageFor('other'), admin: 403 }
	},
	{
		route: '/admin/audit',
		query: 'action=bogus&person=1%20OR%201%3D1&from=2026-13-45&page=-1',
		answers: pageFor('admin', 'other')
	},
	// i-shows: starting a show, empty or as a copy (issue 13, item 3).
	{ route: '/chair/shows/new', answers: pageFor('chair', 'other') },
	// Operations (issue 18): health for a load balancer, open to all; failed jobs per society.
	{ route: '/healthz', answers: all(200) },
	{ route: '/readyz', answers: all(200) },
	{ route: '/admin/jobs', answers: pageFor('admin', 'other') },
	{
		route: '/admin/jobs',
		query: 'society=cedar-ridge',
		answers: { ...pageFor('other'), admin: 403 }
	},
	// i-schedule: the society's scales of points (chair; other is chair of its own society, so it
	// sees its own society's scales). An admin without the chair role stays outside /chair.
	{ route: '/chair/scales', answers: pageFor('chair', 'other') },
	{
		route: '/chair/scales',
		query: 'society=cedar-ridge',
		answers: { ...pageFor('other'), chair: 403 }
	},
	// i-society: starting a society (open to anyone signed in when CB_SOCIETY_SIGNUP=open, as in
	// the tests; closed, the page says so to everyone) and the admin's society settings.
	{ route: '/societies/new', answers: { ...all(200), anon: 'signin' } },
	{ route: '/admin/society', answers: pageFor('admin', 'other') },
	{
		route: '/admin/society',
		query: 'society=cedar-ridge',
		answers: { ...pageFor('other'), admin: 403 }
	},
	{ route: '/admin/society', query: 'society=no-such-society', answers: pageFor() }
];

export { all, apiFor, pageFor };
