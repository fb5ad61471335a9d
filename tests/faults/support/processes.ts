import { spawn, type ChildProcess } from 'node:child_process';
import { closeSync, existsSync, mkdirSync, openSync, readFileSync } from 'node:fs';
import path from 'node:path';
import { faultsDir, projectDir } from './cluster';
import { GiveUp, waitFor } from './wait';

/** A process started by a fault test, with a promise that settles when it ends. */
export interface Started {
	name: string;
	child: ChildProcess;
	pid: number;
	logFile: string;
	ended: Promise<{ code: number | null; signal: NodeJS.Signals | null }>;
	/** True while the process runs. */
	running(): boolean;
}

/** Starts `node <args>` in the project folder, its output in `<logDir>/<name>.log`. */
export function startProcess(
	name: string,
	args: string[],
	env: NodeJS.ProcessEnv,
	logDir = faultsDir
): Started {
	mkdirSync(logDir, { recursive: true });
	const logFile = path.join(logDir, `${name}.log`);
	const log = openSync(logFile, 'a');
	const child = spawn(process.execPath, args, {
		cwd: projectDir,
		env,
		stdio: ['ignore', log, log]
	});
	closeSync(log);
	if (child.pid === undefined) throw new Error(`${name} did not start`);
	let done = false;
	const ended = new Promise<{ code: number | null; signal: NodeJS.Signals | null }>((resolve) =>
		child.once('exit', (code, signal) => {
			done = true;
			resolve({ code, signal });
		})
	);
	return { name, child, pid: child.pid, logFile, ended, running: () => !done };
}

/** The last lines of a process's log, for failure messages. */
export function logTail(started: Started, lines = 40): string {
	if (!existsSync(started.logFile)) return '';
	return readFileSync(started.logFile, 'utf8').split('\n').slice(-lines).join('\n');
}

/** Sends a signal and waits until the process has ended. */
export async function stopProcess(
	started: Started,
	signal: NodeJS.Signals = 'SIGTERM'
): Promise<void> {
	if (!started.running()) return;
	started.child.kill(signal);
	await started.ended;
}

async function answers(url: string): Promise<boolean> {
	try {
		await fetch(url, { signal: AbortSignal.timeout(5000) });
		return true;
	} catch {
		return false;
	}
}

/** Waits until a started process answers at a URL; stops it when it never does. */
export async function waitUntilAnswering(started: Started, url: string): Promise<void> {
	try {
		await waitFor(`${started.name} to answer at ${url}`, async () => {
			if (!started.running()) throw new GiveUp(`${started.name} ended:\n${logTail(started)}`);
			return answers(url);
		});
	} catch (error) {
		await stopProcess(started, 'SIGKILL');
		throw error;
	}
}

/**
 * Starts the built app (`node build`) as the test command's browser step does,
 * against the given database and SMTP server, and waits until it answers.
 */
export async function startBuiltApp(options: {
	name: string;
	port: number;
	databaseUrl: string;
	smtpPort: number;
	env?: NodeJS.ProcessEnv;
}): Promise<Started & { origin: string }> {
	if (!existsSync(path.join(projectDir, 'build/index.js'))) {
		throw new Error('build/index.js is missing: run `npx vite build` first');
	}
	const origin = `http://127.0.0.1:${options.port}`;
	const app = startProcess(options.name, ['build'], {
		...process.env,
		NODE_ENV: 'production',
		PORT: String(options.port),
		HOST: '127.0.0.1',
		ORIGIN: origin,
		BODY_SIZE_LIMIT: '12M',
		DATABASE_URL: options.databaseUrl,
		SMTP_URL: `smtp://127.0.0.1:${options.smtpPort}`,
		AUTH_SECRET: process.env.AUTH_SECRET ?? `fault-test-secret-${process.pid}-${Date.now()}`,
		CB_REMINDERS: 'off',
		CB_DEV_MAIL_URL: '',
		...options.env
	});
	await waitUntilAnswering(app, `${origin}/`);
	return { ...app, origin };
}

/** Starts scripts/smtp-fake.js on the given ports and waits until it answers. */
export async function startSmtpFake(options: {
	smtpPort: number;
	httpPort: number;
}): Promise<Started & { url: string }> {
	const url = `http://127.0.0.1:${options.httpPort}`;
	const fake = startProcess('smtp-fake', ['scripts/smtp-fake.js'], {
		...process.env,
		SMTP_FAKE_PORT: String(options.smtpPort),
		SMTP_FAKE_HTTP_PORT: String(options.httpPort)
	});
	await waitUntilAnswering(fake, `${url}/health`);
	return { ...fake, url };
}
