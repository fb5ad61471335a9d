/**
 * The outbox worker as its own process (for several app instances, run the app with
 * CB_OUTBOX_WORKER=off and one or more of these): npm run worker
 */
import { sequelize } from '../src/lib/server/db';
import { startOutboxWorker } from '../src/lib/server/mail/outbox';

const stop = startOutboxWorker();
console.log('outbox worker: sending mail from the outbox');
const shutdown = () => {
	stop();
	void sequelize.close().then(() => process.exit(0));
};
process.on('SIGTERM', shutdown);
process.on('SIGINT', shutdown);
