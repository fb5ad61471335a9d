import { isHttpError, isRedirect, json, type RequestEvent } from '@sveltejs/kit';
import errorTemplate from '../../../error.html?raw';

/** The usual security headers, on every answer (pages, APIs, files, redirects, errors). */
export const SECURITY_HEADERS: Record<string, string> = {
	'X-Content-Type-Options': 'nosniff',
	'Referrer-Policy': 'same-origin',
	'X-Frame-Options': 'DENY',
	'Permissions-Policy': 'camera=(self), geolocation=(), microphone=()'
};

/**
 * The content security policy of answers SvelteKit does not give one (its pages get the policy of
 * svelte.config.js): API answers, redirects, files and the plain error page. Nothing may run,
 * load or frame them; only the inline style of the plain error page is allowed.
 */
export const FALLBACK_CSP =
	"default-src 'none'; style-src 'unsafe-inline'; img-src 'self'; frame-ancestors 'none'; base-uri 'none'; form-action 'self'";

/**
 * Adds the security headers, and the fallback policy where the answer has none. PDFs keep the
 * browser's own viewer working, so they get the headers but no policy.
 */
export function withSecurityHeaders(response: Response): Response {
	const set = (r: Response) => {
		for (const [name, value] of Object.entries(SECURITY_HEADERS)) r.headers.set(name, value);
		const type = r.headers.get('content-type') ?? '';
		if (!r.headers.has('content-security-policy') && !type.startsWith('application/pdf')) {
			r.headers.set('content-security-policy', FALLBACK_CSP);
		}
	};
	try {
		set(response);
		return response;
	} catch {
		// Redirects made with Response.redirect() have immutable headers: copy them first.
		const copy = new Response(response.body, response);
		set(copy);
		return copy;
	}
}

/** Which of JSON and HTML the request prefers (SvelteKit's rule: ties go to JSON). */
function prefersJson(accept: string): boolean {
	const parts = accept
		.split(',')
		.map((part, i) => {
			const m = /^\s*([^/\s]+)\/([^;\s]+)\s*(?:;\s*q=([0-9.]+))?/.exec(part);
			return m ? { type: m[1], sub: m[2], q: Number(m[3] ?? '1'), i } : null;
		})
		.filter((p) => p !== null)
		.sort((a, b) => b.q - a.q || Number(a.sub === '*') - Number(b.sub === '*') || a.i - b.i);
	const rank = (type: string, sub: string) =>
		parts.findIndex((p) => (p.type === type || p.type === '*') && (p.sub === sub || p.sub === '*'));
	const j = rank('application', 'json');
	const h = rank('text', 'html');
	return j !== -1 && (h === -1 || j <= h);
}

function escapeHtml(text: string): string {
	return text.replace(
		/[&<>"']/g,
		(c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[c]!
	);
}

/**
 * The answer SvelteKit would give for a redirect or error thrown in a handle hook, as a Response
 * the hooks can still add headers to (SvelteKit answers thrown ones outside every hook). Anything
 * else is thrown on.
 */
export function answerThrown(event: RequestEvent, thrown: unknown): Response {
	const accept = event.request.headers.get('accept') || 'text/html';
	if (isRedirect(thrown)) {
		if (event.isDataRequest) return json({ type: 'redirect', location: thrown.location });
		if (event.request.method === 'POST' && prefersJson(accept)) {
			return json({ type: 'redirect', status: thrown.status, location: thrown.location });
		}
		return new Response(null, { status: thrown.status, headers: { location: thrown.location } });
	}
	if (isHttpError(thrown)) {
		const body: App.Error = { ...thrown.body, message: thrown.body.message || 'Unknown Error' };
		if (event.isDataRequest || prefersJson(accept)) return json(body, { status: thrown.status });
		const page = errorTemplate
			.replaceAll('%sveltekit.status%', String(thrown.status))
			.replaceAll('%sveltekit.error.message%', escapeHtml(body.message));
		return new Response(page, {
			status: thrown.status,
			headers: { 'content-type': 'text/html; charset=utf-8' }
		});
	}
	throw thrown;
}
