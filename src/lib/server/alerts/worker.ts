import { randomBytes } from 'node:crypto';
import { hostname } from 'node:os';
import type { Sequelize } from 'sequelize';
import { claimBatch, recordOutcome, releaseClaim, type ClaimedRow, type Outcome } from './claim';
import { queueDigests } from './digest';
import { mailTransport } from './mail';
import { queueOverdueAlerts } from './overdueAlerts';
import { checkUnconfirmed } from './reconcile';
import { optedOut } from './recipients';
import { sendMail, sendSms } from './send';
import { smsClient } from './sms';
import type { AlertSettings } from './settings';

export interface WorkerOptions {
	sequelize: Sequelize;
	settings: AlertSettings;
	id?: string;
	/** Queue the agronomists' daily digests (once a minute). Default on. */
	digests?: boolean;
	/** Queue scouting-overdue alerts (every ALERTS_OVERDUE_MS). Default on. */
	overdue?: boolean;
	log?: (line: string) => void;
}

/**
 * The outbox worker: claims due rows, sends them (SMS through the provider's SDK, e-mail over
 * SMTP), records the provider's id, retries with backoff and gives up after the limit. Any
 * number of workers may run against one database.
 */
export class AlertWorker {
	readonly id: string;
	private s: AlertSettings;
	private sequelize: Sequelize;
	private sms;
	private mail;
	private running = false;
	private loop: Promise<void> | null = null;
	private wake: (() => void) | null = null;
	private lastDigest = 0;
	private lastOverdue = 0;
	private lastStatusCheck = Date.now();
	sent = 0;

	constructor(private o: WorkerOptions) {
		this.s = o.settings;
		this.sequelize = o.sequelize;
		this.id = o.id ?? `${hostname()}:${process.pid}:${randomBytes(3).toString('hex')}`;
		this.sms = smsClient(this.s);
		this.mail = mailTransport(this.s);
	}

	start() {
		if (this.running) return;
		this.running = true;
		this.loop = this.run();
	}

	/** Finishes the rows in hand, then stops. */
	async stop() {
		this.running = false;
		this.wake?.();
		await this.loop;
		this.mail.close();
	}

	private async run() {
		while (this.running) {
			try {
				if (this.o.digests !== false && Date.now() - this.lastDigest > 60_000) {
					this.lastDigest = Date.now();
					await queueDigests(this.sequelize, this.s);
				}
				if (this.o.overdue !== false && Date.now() - this.lastOverdue > this.s.ALERTS_OVERDUE_MS) {
					this.lastOverdue = Date.now();
					await queueOverdueAlerts(this.sequelize, this.s);
				}
				// Lost status callbacks: ask the provider about texts that never reported back.
				if (Date.now() - this.lastStatusCheck > Math.min(60_000, this.s.ALERTS_STATUS_CHECK_MS)) {
					this.lastStatusCheck = Date.now();
					await checkUnconfirmed(this.sequelize, this.sms, this.s);
				}
				const n = await this.drainOnce();
				if (n > 0) continue;
			} catch (e) {
				this.o.log?.(`alerts worker ${this.id}: ${(e as Error).message}`);
			}
			await new Promise<void>((r) => {
				const t = setTimeout(r, this.s.ALERTS_POLL_MS);
				this.wake = () => {
					clearTimeout(t);
					r();
				};
			});
		}
	}

	/** Claims one batch and sends it; returns how many rows it handled. */
	async drainOnce(): Promise<number> {
		const rows = await claimBatch(
			this.sequelize,
			this.id,
			this.s.ALERTS_BATCH,
			this.s.ALERTS_LEASE_MS
		);
		if (!rows.length) return 0;
		const stopped = await optedOut(rows.filter((r) => r.channel === 'sms').map((r) => r.toAddress));
		let next = 0;
		const claimedAt = Date.now();
		// A row is only sent while its lease has room for the send to finish; later ones go back
		// to the queue, so a reclaiming worker never overlaps a slow but healthy one.
		const latestStart = this.s.ALERTS_LEASE_MS - 2 * this.s.ALERTS_SEND_TIMEOUT_MS;
		const lane = async () => {
			while (next < rows.length) {
				const row = rows[next++];
				if (Date.now() - claimedAt > latestStart) {
					await releaseClaim(this.sequelize, this.id, row);
					continue;
				}
				const outcome =
					stopped.has(row.toAddress) && row.channel === 'sms'
						? ({
								kind: 'suppressed',
								error: 'The number replied STOP; no SMS until it replies START.'
							} as Outcome)
						: await this.send(row);
				await recordOutcome(this.sequelize, this.id, row, outcome, {
					maxAttempts: this.s.ALERTS_MAX_ATTEMPTS,
					baseMs: this.s.ALERTS_BACKOFF_MS,
					maxMs: this.s.ALERTS_BACKOFF_MAX_MS
				});
				if (outcome.kind === 'sent') this.sent++;
			}
		};
		await Promise.all(
			Array.from({ length: Math.min(this.s.ALERTS_CONCURRENCY, rows.length) }, lane)
		);
		return rows.length;
	}

	private send(row: ClaimedRow): Promise<Outcome> {
		return row.channel === 'sms'
			? sendSms(this.sms, this.s, row)
			: sendMail(this.mail, this.s, row);
	}
}
