/**
 * The job worker as its own process: npm run worker. It works every job queue (the mail outbox,
 * refunds, entry reminders on their schedule, whole-show PDFs); run any number of them beside
 * app instances started with CB_WORKER=off. Settings are checked at start like the app's.
 */
import { useConfig } from '../src/lib/server/config';
import { sequelize } from '../src/lib/server/db';
import { startJobWorker } from '../src/lib/server/jobs/worker';
import { errorFields, logger } from '../src/lib/server/log';

try {
	// This process is a worker whatever CB_WORKER says (that switch is for app processes).
	useConfig({ ...process.env, CB_WORKER: 'on', CB_OUTBOX_WORKER: 'on' });
} catch (error) {
	console.error(error instanceof Error ? error.message : error);
	process.exit(1);
}

let stop: (() => Promise<void>) | null = null;
let stopping = false;

async function startWhenReachable(): Promise<void> {
	while (!stopping) {
		try {
			stop = await startJobWorker();
			return;
		} catch (error) {
			logger().warn({ msg: 'job worker not started; trying again in 5 s', ...errorFields(error) });
			await new Promise((resolve) => setTimeout(resolve, 5000));
		}
	}
}

const shutdown = () => {
	if (stopping) return;
	stopping = true;
	void (stop ? stop() : Promise.resolve())
		.catch((error: unknown) => logger().error({ msg: 'worker stop', ...errorFields(error) }))
		.finally(() => void sequelize.close().then(() => process.exit(0)));
};
process.on('SIGTERM', shutdown);
process.on('SIGINT', shutdown);
await startWhenReachable();
