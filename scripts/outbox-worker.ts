/**
 * The outbox worker as its own process (for several app instances, run the app with
 * CB_OUTBOX_WORKER=off and one or more of these): npm run worker. It sends the mail outbox and
 * the requested refunds, the two jobs the app processes then leave to it.
 */
import { sequelize } from '../src/lib/server/db';
import { startOutboxWorker } from '../src/lib/server/mail/outbox';
import { startRefundSender } from '../src/lib/server/services/refunds';

const stop = startOutboxWorker();
const stopRefunds = startRefundSender();
console.log('outbox worker: sending mail from the outbox, and requested refunds');
const shutdown = () => {
	stop();
	stopRefunds();
	void sequelize.close().then(() => process.exit(0));
};
process.on('SIGTERM', shutdown);
process.on('SIGINT', shutdown);
