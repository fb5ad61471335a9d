import { readdirSync, readFileSync } from 'node:fs';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { ConfigError, readConfig, societySignup } from './config';

describe('societySignup (CB_SOCIETY_SIGNUP)', () => {
	it.each([
		[undefined, 'closed'],
		['', 'closed'],
		['closed', 'closed'],
		['open', 'open']
	])('reads %j as %s', (value, expected) => {
		expect(societySignup({ CB_SOCIETY_SIGNUP: value })).toBe(expected);
	});

	it.each(['Open', 'yes', 'true', ' open', 'anyone'])(
		'refuses %j, naming the variable',
		(value) => {
			expect(() => societySignup({ CB_SOCIETY_SIGNUP: value })).toThrow(/CB_SOCIETY_SIGNUP/);
			expect(() => readConfig({ CB_SOCIETY_SIGNUP: value })).toThrow(/CB_SOCIETY_SIGNUP/);
		}
	);
});

const PRODUCTION = {
	NODE_ENV: 'production',
	ORIGIN: 'https://shows.example.org',
	AUTH_SECRET: 'a-secret-of-sixteen-or-more'
};

describe('readConfig', () => {
	it('gives the defaults when nothing is set, and reads what is', () => {
		const c = readConfig({});
		expect(c).toMatchObject({
			production: false,
			dbPoolMax: 10,
			signInLimitPerAddress: 5,
			signInLimitPerClient: 50,
			outboxMaxAttempts: 8,
			worker: true,
			reminders: true,
			jobsPollSeconds: 2,
			logLevel: 'info'
		});
		expect(readConfig({ DB_POOL_MAX: '25', CB_WORKER: 'off', LOG_LEVEL: 'warn' })).toMatchObject({
			dbPoolMax: 25,
			worker: false,
			logLevel: 'warn'
		});
		// The older name of the worker switch still works.
		expect(readConfig({ CB_OUTBOX_WORKER: 'off' }).worker).toBe(false);
	});

	it('gives the folders and the payment service settings the code reads, and nothing else does', () => {
		const c = readConfig({});
		expect(c.uploadDir).toBe(path.join(process.cwd(), '.data', 'uploads'));
		expect(c.fontsDir).toBe(path.join(process.cwd(), 'fonts'));
		expect(c.stripeApiPort).toBeUndefined();
		expect(
			readConfig({
				UPLOAD_DIR: 'photos',
				CB_FONTS_DIR: '/srv/fonts',
				STRIPE_API_PORT: '12111',
				STRIPE_API_PROTOCOL: 'http'
			})
		).toMatchObject({
			uploadDir: path.resolve('photos'),
			fontsDir: '/srv/fonts',
			stripeApiPort: 12111,
			stripeApiProtocol: 'http'
		});
		expect(() => readConfig({ STRIPE_API_PORT: 'http' })).toThrow(/STRIPE_API_PORT expects/);
	});

	it('is the only reader of process.env in the server code', () => {
		const root = path.join(process.cwd(), 'src', 'lib', 'server');
		const readers = readdirSync(root, { recursive: true, encoding: 'utf8' })
			.filter((f) => f.endsWith('.ts') && !f.endsWith('.test.ts'))
			.filter((f) => readFileSync(path.join(root, f), 'utf8').includes('process.env'))
			.map((f) => f.split(path.sep).join('/'));
		// config() itself, and the start-up checks, which are handed the environment to check.
		expect(readers.sort()).toEqual(['config.ts', 'startup-checks.ts']);
	});

	it.each([
		['DB_POOL_MAX', '1O', /DB_POOL_MAX expects a whole number from 1 to 500; it is "1O"/],
		['DB_POOL_MAX', '0', /DB_POOL_MAX expects a whole number from 1 to 500/],
		['CB_OUTBOX_MAX_ATTEMPTS', 'eight', /CB_OUTBOX_MAX_ATTEMPTS expects a whole number/],
		['CB_JOBS_POLL_SECONDS', '-1', /CB_JOBS_POLL_SECONDS expects a whole number from 1 to 60/],
		['DATABASE_URL', 'mysql://x@y/z', /DATABASE_URL expects a postgres:\/\/ address/],
		['ORIGIN', 'shows.example.org', /ORIGIN expects the public http\(s\):\/\/ address/],
		['SMTP_URL', 'http://mail', /SMTP_URL expects an smtp:\/\/ or smtps:\/\/ address/],
		['CB_WORKER', 'no', /CB_WORKER expects "on" or "off"/],
		['LOG_LEVEL', 'loud', /LOG_LEVEL expects "fatal" or "error"/],
		['AUTH_SECRET', 'short', /AUTH_SECRET expects a secret of at least 16 characters/],
		['CB_OUTBOX_INTERVAL_MS', '2000', /CB_OUTBOX_INTERVAL_MS is no longer used/]
	])('refuses %s=%j, naming it and what it expects', (name, value, message) => {
		expect(() => readConfig({ [name]: value })).toThrow(ConfigError);
		expect(() => readConfig({ [name]: value })).toThrow(message);
	});

	it('names every wrong variable at once', () => {
		try {
			readConfig({ DB_POOL_MAX: 'x', CB_REMINDERS: 'maybe' });
			expect.unreachable();
		} catch (error) {
			expect((error as ConfigError).problems).toEqual([
				expect.stringMatching(/^DB_POOL_MAX /),
				expect.stringMatching(/^CB_REMINDERS /)
			]);
		}
	});

	it('refuses the development-only settings in production unless a test run opts in', () => {
		expect(readConfig(PRODUCTION).production).toBe(true);
		expect(() => readConfig({ ...PRODUCTION, CB_DEV_MAIL_URL: 'http://127.0.0.1:2536' })).toThrow(
			/CB_DEV_MAIL_URL is set/
		);
		expect(
			readConfig({
				...PRODUCTION,
				CB_DEV_MAIL_URL: 'http://127.0.0.1:2536',
				CB_ALLOW_DEV_MAIL: '1'
			}).allowDevMail
		).toBe(true);
		expect(() => readConfig({ ...PRODUCTION, STRIPE_API_HOST: '127.0.0.1' })).toThrow(
			/STRIPE_API_HOST is set/
		);
		expect(
			readConfig({ ...PRODUCTION, STRIPE_API_HOST: '127.0.0.1', CB_ALLOW_FAKES: '1' }).allowFakes
		).toBe(true);
		expect(() => readConfig({ ...PRODUCTION, AUTH_SECRET: '' })).toThrow(/Set AUTH_SECRET/);
		// Development: the demo's own mail page and fakes are the point.
		expect(
			readConfig({ CB_DEV_MAIL_URL: 'http://127.0.0.1:2536', STRIPE_API_HOST: 'x' })
		).toBeTruthy();
	});
});
