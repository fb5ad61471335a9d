import SequelizeAdapter, { type SequelizeAdapterOptions } from '@auth/sequelize-adapter';
import { SvelteKitAuth } from '@auth/sveltekit';
import Nodemailer from '@auth/sveltekit/providers/nodemailer';
import { Account, Session, User, VerificationToken, sequelize } from './db';
import { buildSignInMessage } from './mail/sign-in-message';
import { mailFrom, sendMail, smtpUrl } from './mail/transport';
import { loadSessionUser } from './people/people';
import { claimWalkIns } from './entries/desk-entries';
import { config } from '$lib/server/config';

/** How long a sign-in link works. */
export const SIGN_IN_LINK_MINUTES = 30;

/** How long a session lasts, and how often Auth.js pushes its end further out (rolling). */
export const SESSION_MAX_AGE_SECONDS = 30 * 24 * 60 * 60;
export const SESSION_UPDATE_AGE_SECONDS = 24 * 60 * 60;

/** The session cookie, under its plain name and the name it has when served as https. */
export const SESSION_COOKIES = ['authjs.session-token', '__Secure-authjs.session-token'];

/** The session token among a request's cookies (read by name), if there is one. */
export function sessionTokenOf(cookie: (name: string) => string | undefined): string | undefined {
	return SESSION_COOKIES.map(cookie).find(Boolean);
}

/**
 * The person of a session token in one query, and whether the session is due for its rolling
 * extension (which only Auth.js makes); null for an unknown or expired session.
 */
export function findSessionUser(token: string) {
	return loadSessionUser(token, {
		maxAgeSeconds: SESSION_MAX_AGE_SECONDS,
		updateAgeSeconds: SESSION_UPDATE_AGE_SECONDS
	});
}

/**
 * The app's public address (`AUTH_URL`, else `ORIGIN`), every sign-in link is made from it: the
 * last one read, with its origin and host (parsed once, not per request).
 */
let parsedAddress: { configured: string; origin: string; host: string } | null = null;

function configuredAddress(): { origin: string; host: string } | undefined {
	const settings = config();
	const configured = settings.authUrl || settings.origin;
	if (!configured) return undefined;
	if (parsedAddress?.configured !== configured) {
		const url = new URL(configured);
		parsedAddress = { configured, origin: url.origin, host: url.host };
	}
	return parsedAddress;
}

/** `AUTH_TRUST_HOST=true`: a proxy in front sets Host and X-Forwarded-Host, and Auth.js reads them. */
function trustsProxyHost(): boolean {
	return config().authTrustHost;
}

/** True when a Host header value is a plain host[:port] that a URL can be made of. */
function isPlainHost(value: string | null): boolean {
	if (!value || !/^[a-z0-9.\-[\]:]+$/i.test(value)) return false;
	try {
		return new URL(`http://${value}`).host !== '';
	} catch {
		return false;
	}
}

/**
 * Makes Auth.js see the request at the public address: without a trusted proxy, Host is set to
 * the configured address and the X-Forwarded-Host/-Proto a client sent are dropped, so no header
 * can point a mailed link elsewhere. Returns false when the host Auth.js would read is malformed
 * (a trusted proxy's header, or no configured address): the request is then refused with 400.
 */
export function pinToPublicAddress(headers: Headers): boolean {
	const address = configuredAddress();
	if (address && !trustsProxyHost()) {
		// The Request's headers are mutable here; Auth.js reads this same object.
		headers.set('host', address.host);
		headers.delete('x-forwarded-host');
		headers.delete('x-forwarded-proto');
		return true;
	}
	return isPlainHost(headers.get('x-forwarded-host') ?? headers.get('host'));
}

/** The cookie Auth.js keeps the after-sign-in address in, under both its names. */
const CALLBACK_COOKIES = ['authjs.callback-url', '__Secure-authjs.callback-url'];

/**
 * False when an Auth.js request carries an after-sign-in address (query or cookie) that is no
 * http(s) address, like `javascript:…`: Auth.js answers those as a set-up error (500).
 */
export function hasValidCallbackUrl(
	url: URL,
	cookie: (name: string) => string | undefined
): boolean {
	if (!url.pathname.startsWith('/auth/')) return true;
	const values = [url.searchParams.get('callbackUrl'), ...CALLBACK_COOKIES.map(cookie)];
	return values.every((value) => {
		if (!value) return true;
		try {
			return ['http:', 'https:'].includes(new URL(value, url.origin).protocol);
		} catch {
			return false;
		}
	});
}

/** Auth.js's own way to ask for a link, closed: every request goes through /signin's checks. */
export function isClosedAuthPath(method: string, path: string): boolean {
	return method === 'POST' && (path === '/auth/signin' || path.startsWith('/auth/signin/'));
}

function authSecret(): string | undefined {
	const settings = config();
	if (settings.authSecret) return settings.authSecret;
	// Development only: production refuses to start without AUTH_SECRET (Auth.js checks).
	return settings.production ? undefined : 'crownbench-development-only-secret';
}

/** Auth.js set-up: e-mail link sign-in, sessions kept in PostgreSQL. */
export const {
	handle: authHandle,
	signIn,
	signOut
} = SvelteKitAuth({
	adapter: SequelizeAdapter(sequelize, {
		// Our models carry the same columns as the adapter's own; their TypeScript shapes differ.
		models: {
			User,
			Account,
			Session,
			VerificationToken
		} as unknown as SequelizeAdapterOptions['models'],
		synchronize: false
	}),
	providers: [
		Nodemailer({
			server: smtpUrl(),
			from: mailFrom(),
			maxAge: SIGN_IN_LINK_MINUTES * 60,
			async sendVerificationRequest({ identifier, url }) {
				const { host } = new URL(url);
				await sendMail({ to: identifier, ...buildSignInMessage(url, host, SIGN_IN_LINK_MINUTES) });
			}
		})
	],
	session: {
		strategy: 'database',
		maxAge: SESSION_MAX_AGE_SECONDS,
		updateAge: SESSION_UPDATE_AGE_SECONDS
	},
	secret: authSecret(),
	// Auth.js refuses every request without this; pinToPublicAddress (hooks) decides which host it sees.
	trustHost: true,
	pages: { signIn: '/signin', verifyRequest: '/signin/check-mail', error: '/signin/problem' },
	events: {
		// A walk-in entered at the desk with this address now has their entries as their own.
		async signIn({ user }) {
			if (user.id) await claimWalkIns(user.id);
		}
	},
	callbacks: {
		// What GET /auth/session tells page scripts: no session token and no internal ids.
		session({ session }) {
			return {
				expires: session.expires,
				user: { name: session.user?.name ?? null, email: session.user?.email ?? '' }
			} as typeof session;
		}
	}
});
