import { json } from '@sveltejs/kit';
import { checkReadiness } from '$lib/server/health';
import type { RequestHandler } from './$types';

/** Ready for traffic: database reachable, migrations current, a job worker alive (200, else 503). */
export const GET: RequestHandler = async () => {
	const readiness = await checkReadiness();
	return json(
		{ status: readiness.ready ? 'ready' : 'not ready', checks: readiness.checks },
		{ status: readiness.ready ? 200 : 503, headers: { 'Cache-Control': 'no-store' } }
	);
};
