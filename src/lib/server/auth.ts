import SequelizeAdapter, { type SequelizeAdapterOptions } from '@auth/sequelize-adapter';
import { SvelteKitAuth } from '@auth/sveltekit';
import Nodemailer from '@auth/sveltekit/providers/nodemailer';
import { Account, Session, User, VerificationToken, sequelize } from './db';
import { buildSignInMessage } from './mail/sign-in-message';
import { mailFrom, sendMail, smtpUrl } from './mail/transport';
import { loadSessionUser } from './services/people';

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

function authSecret(): string | undefined {
	if (process.env.AUTH_SECRET) return process.env.AUTH_SECRET;
	// Development only: production refuses to start without AUTH_SECRET (Auth.js checks).
	return process.env.NODE_ENV === 'production' ? undefined : 'crownbench-development-only-secret';
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
	trustHost: true,
	pages: { signIn: '/signin', verifyRequest: '/signin/check-mail', error: '/signin/problem' },
	callbacks: {
		session({ session, user }) {
			session.user.id = user.id;
			return session;
		}
	}
});
