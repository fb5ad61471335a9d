/**
 * Host settings, read once and checked with zod at start: the app's init hook passes SvelteKit's
 * `$env/dynamic/private` (useConfig), scripts and tests read process.env on first use (config).
 * A wrong value stops the process with a message naming the variable and what it expects.
 */
import path from 'node:path';
import { z } from 'zod';

type Env = Record<string, string | undefined>;

/** Who may start a society on this host: anyone signed in (open), or only its operator (closed). */
export type SocietySignup = 'open' | 'closed';

/** Empty means unset, as a shell's `NAME=` does. */
const unsetWhenEmpty = (value: unknown) => (value === '' ? undefined : value);

function wholeNumber(min: number, max: number, fallback: number) {
	return z.preprocess(
		unsetWhenEmpty,
		z
			.string()
			.regex(/^\d+$/, `expects a whole number from ${min} to ${max}`)
			.transform(Number)
			.pipe(
				z
					.number()
					.min(min, `expects a whole number from ${min} to ${max}`)
					.max(max, `expects a whole number from ${min} to ${max}`)
			)
			.default(fallback)
	);
}

function oneOf<const T extends readonly [string, ...string[]]>(values: T, fallback: T[number]) {
	const words = values.map((v) => `"${v}"`).join(' or ');
	return z.preprocess(
		unsetWhenEmpty,
		z.enum(values, { error: `expects ${words}` }).default(fallback as never)
	) as unknown as z.ZodType<T[number]>;
}

function address(schemes: string[], what: string) {
	return z.preprocess(
		unsetWhenEmpty,
		z
			.string()
			.refine((value) => {
				try {
					return schemes.includes(new URL(value).protocol);
				} catch {
					return false;
				}
			}, `expects ${what}`)
			.optional()
	);
}

const text = z.preprocess(unsetWhenEmpty, z.string().optional());

const LOG_LEVELS = ['fatal', 'error', 'warn', 'info', 'debug', 'trace', 'silent'] as const;

/** Every setting the app and its worker read, with what each expects. */
export const configSchema = z.object({
	NODE_ENV: oneOf(['development', 'production', 'test'], 'development'),
	DATABASE_URL: address(['postgres:', 'postgresql:'], 'a postgres:// address'),
	DB_POOL_MAX: wholeNumber(1, 500, 10),
	ORIGIN: address(['http:', 'https:'], 'the public http(s):// address of the app'),
	AUTH_URL: address(['http:', 'https:'], 'the public http(s):// address of the app'),
	AUTH_SECRET: z.preprocess(
		unsetWhenEmpty,
		z.string().min(16, 'expects a secret of at least 16 characters').optional()
	),
	AUTH_TRUST_HOST: oneOf(['true', 'false'], 'false'),
	SMTP_URL: address(['smtp:', 'smtps:'], 'an smtp:// or smtps:// address'),
	MAIL_FROM: text,
	CB_DEV_MAIL_URL: address(['http:', 'https:'], 'the http:// address of the SMTP fake'),
	/** Only "1" opts in (anything else, as before, does not). */
	CB_ALLOW_DEV_MAIL: text,
	CB_ALLOW_FAKES: text,
	CB_SOCIETY_SIGNUP: oneOf(['open', 'closed'], 'closed'),
	CB_SIGNIN_LIMIT_PER_ADDRESS: wholeNumber(1, 100_000, 5),
	CB_SIGNIN_LIMIT_PER_IP: wholeNumber(1, 10_000_000, 50),
	CB_OUTBOX_MAX_ATTEMPTS: wholeNumber(1, 50, 8),
	CB_OUTBOX_BASE_DELAY_SECONDS: wholeNumber(1, 3600, 5),
	/** Whether this app process also works the job queues (off: run `npm run worker`). */
	CB_WORKER: oneOf(['on', 'off'], 'on'),
	/** The older name of CB_WORKER, still understood. */
	CB_OUTBOX_WORKER: oneOf(['on', 'off'], 'on'),
	CB_REMINDERS: oneOf(['on', 'off'], 'on'),
	CB_JOBS_POLL_SECONDS: wholeNumber(1, 60, 2),
	STRIPE_SECRET_KEY: text,
	STRIPE_WEBHOOK_SECRET: text,
	STRIPE_API_HOST: text,
	STRIPE_API_PORT: z.preprocess(unsetWhenEmpty, wholeNumber(1, 65535, 0).optional()),
	STRIPE_API_PROTOCOL: z.preprocess(
		unsetWhenEmpty,
		z.enum(['http', 'https'], { error: 'expects "http" or "https"' }).optional()
	),
	UPLOAD_DIR: text,
	CB_FONTS_DIR: text,
	LOG_LEVEL: oneOf(LOG_LEVELS, 'info')
});

/** Settings that did something once and do nothing now: refused, so a stale file is noticed. */
const RETIRED: Record<string, string> = {
	CB_OUTBOX_INTERVAL_MS: 'the mail outbox runs on the job queue now (CB_JOBS_POLL_SECONDS)',
	CB_REFUND_INTERVAL_MS: 'refunds run on the job queue now (CB_JOBS_POLL_SECONDS)',
	CB_REMINDER_INTERVAL_MS: 'entry reminders run on an hourly schedule of the job queue now'
};

type Parsed = z.infer<typeof configSchema>;

/** The checked settings, in the words the code uses. */
export interface Config {
	production: boolean;
	databaseUrl: string | undefined;
	dbPoolMax: number;
	origin: string | undefined;
	authUrl: string | undefined;
	authSecret: string | undefined;
	authTrustHost: boolean;
	smtpUrl: string | undefined;
	mailFrom: string | undefined;
	devMailUrl: string | undefined;
	allowDevMail: boolean;
	allowFakes: boolean;
	societySignup: SocietySignup;
	signInLimitPerAddress: number;
	signInLimitPerClient: number;
	outboxMaxAttempts: number;
	outboxBaseDelaySeconds: number;
	/** This process works the job queues (the app unless CB_WORKER=off; always the worker). */
	worker: boolean;
	reminders: boolean;
	jobsPollSeconds: number;
	stripeApiHost: string | undefined;
	stripeSecretKey: string | undefined;
	stripeWebhookSecret: string | undefined;
	stripeApiPort: number | undefined;
	stripeApiProtocol: 'http' | 'https' | undefined;
	/** Where uploaded photos are kept: UPLOAD_DIR, default .data/uploads (git-ignored). */
	uploadDir: string;
	/** The TTF files PDFs are made with: CB_FONTS_DIR, default fonts/. */
	fontsDir: string;
	logLevel: (typeof LOG_LEVELS)[number];
	/** The raw values, for the few readers that keep their own defaults. */
	raw: Parsed;
}

/** A setting that is wrong: the message names every variable at fault and what it expects. */
export class ConfigError extends Error {
	constructor(readonly problems: string[]) {
		super(`Crownbench will not start: ${problems.join(' ')}`);
		this.name = 'ConfigError';
	}
}

/**
 * Settings the app refuses to start with in production, as plain sentences (none: it starts).
 * `/dev/mail` shows every sign-in link to anyone, so CB_DEV_MAIL_URL needs CB_ALLOW_DEV_MAIL=1;
 * the payment fake (STRIPE_API_HOST) needs CB_ALLOW_FAKES=1.
 */
export function productionProblems(c: Parsed): string[] {
	if (c.NODE_ENV !== 'production') return [];
	const problems: string[] = [];
	if (c.CB_DEV_MAIL_URL && c.CB_ALLOW_DEV_MAIL !== '1') {
		problems.push(
			'CB_DEV_MAIL_URL is set: /dev/mail would show every sign-in link to anyone. Unset it (a test or demo run sets CB_ALLOW_DEV_MAIL=1).'
		);
	}
	if (c.STRIPE_API_HOST && c.CB_ALLOW_FAKES !== '1') {
		problems.push(
			'STRIPE_API_HOST is set: payments would go to a local fake, not the payment service. Unset it (a test or demo run sets CB_ALLOW_FAKES=1).'
		);
	}
	if (!c.ORIGIN && !c.AUTH_URL && c.AUTH_TRUST_HOST !== 'true') {
		problems.push(
			'Set ORIGIN (or AUTH_URL) to the public address: sign-in links are made from it.'
		);
	}
	if (!c.AUTH_SECRET) {
		problems.push('Set AUTH_SECRET (at least 16 characters): sessions are signed with it.');
	}
	return problems;
}

/**
 * Checks the environment and returns the settings; throws ConfigError naming what is wrong. The
 * production refusals apply unless `production: false` (modules read at import, even by the
 * build's analysis, which runs as production: the app's start checks them again).
 */
export function readConfig(env: Env, checks: { production?: boolean } = {}): Config {
	const problems: string[] = [];
	for (const [name, why] of Object.entries(RETIRED)) {
		if (env[name]) problems.push(`${name} is no longer used (${why}); remove it.`);
	}
	const parsed = configSchema.safeParse(env);
	if (!parsed.success) {
		for (const issue of parsed.error.issues) {
			const name = String(issue.path[0]);
			problems.push(`${name} ${issue.message}; it is "${env[name] ?? ''}".`);
		}
		throw new ConfigError(problems);
	}
	const c = parsed.data;
	if (checks.production !== false) problems.push(...productionProblems(c));
	if (problems.length > 0) throw new ConfigError(problems);
	return {
		production: c.NODE_ENV === 'production',
		databaseUrl: c.DATABASE_URL,
		dbPoolMax: c.DB_POOL_MAX,
		origin: c.ORIGIN,
		authUrl: c.AUTH_URL,
		authSecret: c.AUTH_SECRET,
		authTrustHost: c.AUTH_TRUST_HOST === 'true',
		smtpUrl: c.SMTP_URL,
		mailFrom: c.MAIL_FROM,
		devMailUrl: c.CB_DEV_MAIL_URL,
		allowDevMail: c.CB_ALLOW_DEV_MAIL === '1',
		allowFakes: c.CB_ALLOW_FAKES === '1',
		societySignup: c.CB_SOCIETY_SIGNUP,
		signInLimitPerAddress: c.CB_SIGNIN_LIMIT_PER_ADDRESS,
		signInLimitPerClient: c.CB_SIGNIN_LIMIT_PER_IP,
		outboxMaxAttempts: c.CB_OUTBOX_MAX_ATTEMPTS,
		outboxBaseDelaySeconds: c.CB_OUTBOX_BASE_DELAY_SECONDS,
		worker: c.CB_WORKER === 'on' && c.CB_OUTBOX_WORKER === 'on',
		reminders: c.CB_REMINDERS === 'on',
		jobsPollSeconds: c.CB_JOBS_POLL_SECONDS,
		stripeApiHost: c.STRIPE_API_HOST,
		stripeSecretKey: c.STRIPE_SECRET_KEY,
		stripeWebhookSecret: c.STRIPE_WEBHOOK_SECRET,
		stripeApiPort: c.STRIPE_API_PORT,
		stripeApiProtocol: c.STRIPE_API_PROTOCOL,
		uploadDir: path.resolve(c.UPLOAD_DIR ?? path.join(process.cwd(), '.data', 'uploads')),
		fontsDir: path.resolve(c.CB_FONTS_DIR ?? path.join(process.cwd(), 'fonts')),
		logLevel: c.LOG_LEVEL,
		raw: c
	};
}

let current: Config | null = null;

/** Reads and keeps the settings (the app's init hook, with `$env/dynamic/private`). */
export function useConfig(env: Env): Config {
	current = readConfig(env);
	return current;
}

/**
 * The settings read at start; code that runs before (modules at import) or without the app's
 * start (scripts, tests) reads process.env, its values checked, its production refusals left to
 * the start (useConfig, the worker script).
 */
export function config(): Config {
	current ??= readConfig(process.env, { production: false });
	return current;
}

/** CB_SOCIETY_SIGNUP: 'open' or 'closed'; closed when unset or empty. Throws on any other value. */
export function societySignup(env?: Env): SocietySignup {
	return (env ? readConfig(env) : config()).societySignup;
}
