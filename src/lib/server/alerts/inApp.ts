import type { Sequelize } from 'sequelize';
import { alertSettings, useSettings } from './settings';
import { AlertWorker } from './worker';

let worker: AlertWorker | null = null;

/**
 * Called once from the server's `init` hook: fixes the alert settings from the app's
 * environment and, unless ALERTS_WORKER=off, starts an outbox worker in this process.
 */
export function startAlertsInApp(
	env: Record<string, string | undefined>,
	sequelize: () => Sequelize
) {
	const settings = alertSettings(env);
	useSettings(settings);
	if (env.ALERTS_WORKER === 'off' || worker) return null;
	worker = new AlertWorker({ sequelize: sequelize(), settings, log: (l) => console.error(l) });
	worker.start();
	return worker;
}

/** Stops this process's outbox worker, letting a send in progress finish and record itself. */
export async function stopAlertsInApp() {
	const w = worker;
	worker = null;
	await w?.stop();
}
