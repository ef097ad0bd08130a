// Bench for the alerts outbox: 1,000 queued SMS sent through the SMS fake by the app's own
// worker plus one more here (as a second instance would run), timed from queue to provider.
import { Op } from 'sequelize';
import { alertSettings } from '../../src/lib/server/alerts/settings';
import { AlertWorker } from '../../src/lib/server/alerts/worker';
import { connect } from '../../src/lib/server/db/connect';
import { Notification, Organisation } from '../../src/lib/server/db/models';

const COUNT = 1000;
const settings = alertSettings(process.env);
const sq = connect({
	url: settings.DATABASE_URL,
	pool: { max: 40, min: 0, acquire: 20_000, idle: 10_000 }
});
const org = await Organisation.findOne({ order: [['id', 'ASC']] });
if (!org) throw new Error('The bench database has no organisation: run through `npm run bench`');
const tag = `bench-${Date.now()}`;
const rows = Array.from({ length: COUNT }, (_, i) => ({
	organisationId: org.id,
	channel: 'sms' as const,
	kind: 'bench',
	dedupeKey: `${tag}:${i}`,
	toAddress: `+1701${String(5_000_000 + (i % 200)).padStart(7, '0')}`,
	bodyText: `Cornicle bench ${tag} message ${i}`,
	notBefore: new Date(Date.now() + 60_000) // held until the clock starts
}));
await Notification.bulkCreate(rows);
const where = { dedupeKey: { [Op.like]: `${tag}:%` } };
const worker = new AlertWorker({ sequelize: sq, settings, digests: false, overdue: false });
const t0 = performance.now();
await Notification.update({ notBefore: new Date(Date.now() - 1000) }, { where });
worker.start();
for (;;) {
	const left = await Notification.count({
		where: { ...where, status: { [Op.in]: ['pending', 'sending'] } }
	});
	if (left === 0) break;
	if (performance.now() - t0 > 120_000) throw new Error(`${left} alerts still queued after 120 s`);
	await new Promise((r) => setTimeout(r, 25));
}
const ms = performance.now() - t0;
await worker.stop();
const byStatus = await Notification.count({ where, group: ['status'] });
console.log(
	`alerts: ${COUNT} queued SMS handed to the provider fake in ${(ms / 1000).toFixed(2)} s (${Math.round((COUNT / ms) * 1000)}/s; target < 10 s)`
);
console.log(
	`alerts: by status ${JSON.stringify(byStatus.map((g) => [g.status, g.count]))}; this process sent ${worker.sent}, the app's worker the rest`
);
await sq.close();
