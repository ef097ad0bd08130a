// A standalone outbox worker: `DATABASE_URL=... tsx src/lib/server/alerts/cli.ts`. The app runs
// one in-process (hooks.server.ts); extra ones may run beside it, on any machine.
import { connect } from '../db/connect';
import { alertSettings } from './settings';
import { AlertWorker } from './worker';

const settings = alertSettings(process.env);
const sequelize = connect({
	url: settings.DATABASE_URL,
	pool: { max: settings.ALERTS_CONCURRENCY + 2, min: 0, acquire: 10_000, idle: 10_000 }
});
const worker = new AlertWorker({
	sequelize,
	settings,
	id: process.env.ALERTS_WORKER_ID || undefined,
	digests: process.env.ALERTS_DIGESTS !== 'off',
	overdue: process.env.ALERTS_OVERDUE !== 'off',
	log: (l) => console.error(l)
});
worker.start();
console.log(`alerts worker ${worker.id} started`);

let stopping = false;
for (const sig of ['SIGINT', 'SIGTERM'] as const) {
	process.on(sig, () => {
		if (stopping) return;
		stopping = true;
		void worker.stop().then(async () => {
			await sequelize.close();
			console.log(`alerts worker ${worker.id} stopped after ${worker.sent} sends`);
			process.exit(0);
		});
	});
}
