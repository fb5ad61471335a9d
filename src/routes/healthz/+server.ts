import { json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';

/** The process answers (for a load balancer's liveness check); touches nothing else. */
export const GET: RequestHandler = () =>
	json({ status: 'ok' }, { headers: { 'Cache-Control': 'no-store' } });
