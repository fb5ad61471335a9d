/**
 * What /readyz tells a load balancer: the database answers, every migration in migrations/ is
 * applied, and a job worker is alive (a heartbeat younger than a minute, from this process or
 * another). Each check says what it found in plain words.
 */
import { readdirSync } from 'node:fs';
import path from 'node:path';
import { QueryTypes } from 'sequelize';
import { sequelize } from './db';
import { HEARTBEAT_FRESH_SECONDS, liveWorkers } from './jobs/worker';

export interface ReadyCheck {
	ok: boolean;
	detail: string;
}

export interface Readiness {
	ready: boolean;
	checks: { database: ReadyCheck; migrations: ReadyCheck; jobs: ReadyCheck };
}

/** The migration files the app was shipped with (in the project folder, as scripts/db.ts runs them). */
function migrationFiles(root = process.cwd()): string[] {
	return readdirSync(path.join(root, 'migrations'))
		.filter((name) => name.endsWith('.cjs'))
		.sort();
}

async function within<T>(ms: number, work: Promise<T>): Promise<T> {
	let timer: NodeJS.Timeout | undefined;
	const late = new Promise<never>((_, reject) => {
		timer = setTimeout(() => reject(new Error(`no answer within ${ms} ms`)), ms);
	});
	try {
		return await Promise.race([work, late]);
	} finally {
		clearTimeout(timer);
	}
}

function reason(error: unknown): string {
	return error instanceof Error ? error.message : String(error);
}

/** Runs the three checks (each at most 2 s); ready only when all pass. */
export async function checkReadiness(): Promise<Readiness> {
	const failed = (detail: string): ReadyCheck => ({ ok: false, detail });
	let database: ReadyCheck;
	let migrations: ReadyCheck = failed('not checked: the database does not answer');
	let jobs: ReadyCheck = failed('not checked: the database does not answer');
	try {
		await within(2000, sequelize.query('SELECT 1', { type: QueryTypes.SELECT }));
		database = { ok: true, detail: 'answers' };
	} catch (error) {
		database = failed(`does not answer: ${reason(error)}`);
	}
	if (database.ok) {
		try {
			const applied = await within(
				2000,
				sequelize.query<{ name: string }>('SELECT name FROM "SequelizeMeta"', {
					type: QueryTypes.SELECT
				})
			);
			const done = new Set(applied.map((r) => r.name));
			const pending = migrationFiles().filter((name) => !done.has(name));
			migrations =
				pending.length === 0
					? { ok: true, detail: `${done.size} applied, none pending` }
					: failed(`${pending.length} pending (run npm run db -- migrate): ${pending.join(', ')}`);
		} catch (error) {
			migrations = failed(`could not be read: ${reason(error)}`);
		}
		try {
			const workers = await within(2000, liveWorkers());
			jobs =
				workers > 0
					? { ok: true, detail: `${workers} worker(s) alive` }
					: failed(
							`no job worker seen in the last ${HEARTBEAT_FRESH_SECONDS} s (start one: npm run worker)`
						);
		} catch (error) {
			jobs = failed(`could not be read: ${reason(error)}`);
		}
	}
	return {
		ready: database.ok && migrations.ok && jobs.ok,
		checks: { database, migrations, jobs }
	};
}
