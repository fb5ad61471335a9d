import { sequelize } from '$lib/server/db';
import { JOB_SCHEMA } from '$lib/server/jobs/boss';
import type { JobName } from '$lib/server/jobs/queues';
import { workDueJobs } from '$lib/server/jobs/worker';

/** Makes the queue's jobs waiting out their back-off due now. */
export async function makeJobsDue(name: JobName): Promise<void> {
	await sequelize.query(
		`UPDATE ${JOB_SCHEMA}.job SET start_after = now() WHERE name = $1 AND state IN ('created', 'retry')`,
		{ bind: [name] }
	);
}

/** Works the queue until nothing is left, the back-off waited out (at most `rounds` rounds). */
export async function workAllJobs(name: JobName, rounds = 20): Promise<void> {
	for (let i = 0; i < rounds; i++) {
		await makeJobsDue(name);
		if ((await workDueJobs(name)) === 0) return;
	}
}

/** The queue's jobs by state, for one row's id in the job's data (`key`). */
export async function jobsFor(name: JobName, key: string, id: string) {
	return sequelize.query<{ id: string; state: string; retry_count: number; output: unknown }>(
		`SELECT id, state, retry_count, output FROM ${JOB_SCHEMA}.job
		  WHERE name = $1 AND data->>$2 = $3 ORDER BY created_on`,
		{ bind: [name, key, id], type: 'SELECT' as never }
	);
}
