/**
 * The built app (`node build`) refuses to start in production with settings that would hand
 * sign-in links to anyone (issue 19, items 1 and 11), and says which variable to change:
 * - CB_DEV_MAIL_URL set without CB_ALLOW_DEV_MAIL=1 (`/dev/mail` shows every caught sign-in link);
 * - neither ORIGIN nor AUTH_URL set (sign-in links would be made from the request's Host header).
 * The refusals come from the app's init hook, before any request and before the database is used:
 * these starts get a database address where nothing listens. With CB_ALLOW_DEV_MAIL=1 (a test or
 * demo run) the app starts, and `/dev/mail` is on.
 */
import { spawn } from 'node:child_process';
import { afterAll, describe, expect, inject, it } from 'vitest';
import { projectDir } from './support/cluster';
import { freePort } from './support/ports';
import { startBuiltApp, stopProcess, type Started } from './support/processes';
import { GiveUp, waitFor } from './support/wait';

const cluster = inject('faultCluster');
const apps: Started[] = [];

afterAll(async () => {
	for (const app of apps) await stopProcess(app, 'SIGKILL');
});

/** Production settings that start: the public address set, no dev mail, no database reachable. */
async function productionEnv(): Promise<NodeJS.ProcessEnv> {
	const port = await freePort();
	return {
		PATH: process.env.PATH,
		HOME: process.env.HOME,
		NODE_ENV: 'production',
		HOST: '127.0.0.1',
		PORT: String(port),
		ORIGIN: `http://127.0.0.1:${port}`,
		AUTH_SECRET: `startup-test-${process.pid}`,
		// Nothing listens on port 1: a start that touched the database would fail differently.
		DATABASE_URL: 'postgres://nobody@127.0.0.1:1/nothing',
		CB_REMINDERS: 'off',
		CB_OUTBOX_WORKER: 'off'
	};
}

/** Runs `node build` until it ends (at most 30 s): its exit code and everything it printed. */
function runUntilEnd(env: NodeJS.ProcessEnv): Promise<{ code: number | null; output: string }> {
	return new Promise((resolve, reject) => {
		const child = spawn(process.execPath, ['build'], { cwd: projectDir, env });
		let output = '';
		child.stdout.on('data', (chunk: Buffer) => (output += chunk.toString()));
		child.stderr.on('data', (chunk: Buffer) => (output += chunk.toString()));
		const timer = setTimeout(() => {
			child.kill('SIGKILL');
			reject(new Error(`node build did not end within 30 s:\n${output}`));
		}, 30_000);
		child.once('error', reject);
		child.once('close', (code) => {
			clearTimeout(timer);
			resolve({ code, output });
		});
	});
}

describe('the built app in production', () => {
	it('starts with the settings of these tests (the refusals below come from one setting each)', async () => {
		const env = await productionEnv();
		const app = await startBuiltApp({
			name: 'startup-baseline',
			port: Number(env.PORT),
			databaseUrl: cluster.databaseUrl,
			smtpPort: await freePort(),
			env: { CB_OUTBOX_WORKER: 'off' }
		});
		apps.push(app);
		// Without CB_DEV_MAIL_URL the caught-mail page does not exist.
		expect((await fetch(`${app.origin}/dev/mail`)).status).toBe(404);
		await stopProcess(app);
	});

	it('refuses to start with CB_DEV_MAIL_URL set and CB_ALLOW_DEV_MAIL not 1, naming it', async () => {
		for (const allow of [undefined, '0', 'true']) {
			const env: NodeJS.ProcessEnv = {
				...(await productionEnv()),
				CB_DEV_MAIL_URL: 'http://127.0.0.1:9'
			};
			if (allow !== undefined) env.CB_ALLOW_DEV_MAIL = allow;
			const { code, output } = await runUntilEnd(env);
			expect(code, output).not.toBe(0);
			expect(output).toContain('Crownbench will not start');
			expect(output).toContain('CB_DEV_MAIL_URL is set: /dev/mail would show every sign-in link');
			expect(output).toContain('CB_ALLOW_DEV_MAIL=1');
			expect(output).not.toContain('Listening on');
		}
	});

	it('refuses to start without ORIGIN or AUTH_URL, naming them', async () => {
		const env = await productionEnv();
		delete env.ORIGIN;
		const { code, output } = await runUntilEnd(env);
		expect(code, output).not.toBe(0);
		expect(output).toContain('Crownbench will not start');
		expect(output).toContain('Set ORIGIN (or AUTH_URL) to the public address');
		expect(output).not.toContain('CB_DEV_MAIL_URL');
		expect(output).not.toContain('Listening on');
	});

	it('starts with AUTH_URL in place of ORIGIN', async () => {
		const env = await productionEnv();
		const origin = env.ORIGIN as string;
		delete env.ORIGIN;
		env.AUTH_URL = `${origin}/auth`;
		env.DATABASE_URL = cluster.databaseUrl;
		const child = spawn(process.execPath, ['build'], { cwd: projectDir, env, stdio: 'ignore' });
		const ended = new Promise((resolve) => child.once('exit', resolve));
		try {
			const status = await waitFor('the app started with AUTH_URL to answer', async () => {
				if (child.exitCode !== null) throw new GiveUp(`it ended with ${child.exitCode}`);
				return fetch(`${origin}/`).then(
					(r) => r.status,
					() => undefined
				);
			});
			expect(status).toBe(200);
		} finally {
			child.kill('SIGKILL');
			await ended;
		}
	});

	it('starts with CB_DEV_MAIL_URL when CB_ALLOW_DEV_MAIL=1, and /dev/mail is on', async () => {
		const env = await productionEnv();
		// No mail fake listens there: the page is on, and says the fake is not running.
		const devMail = `http://127.0.0.1:${await freePort()}`;
		const app = await startBuiltApp({
			name: 'startup-dev-mail',
			port: Number(env.PORT),
			databaseUrl: cluster.databaseUrl,
			smtpPort: await freePort(),
			env: { CB_DEV_MAIL_URL: devMail, CB_ALLOW_DEV_MAIL: '1', CB_OUTBOX_WORKER: 'off' }
		});
		apps.push(app);
		expect((await fetch(`${app.origin}/`)).status).toBe(200);
		const page = await fetch(`${app.origin}/dev/mail`);
		expect(page.status).toBe(503);
		expect(await page.text()).toContain('The local SMTP fake is not running.');
		await stopProcess(app);
	});
});
