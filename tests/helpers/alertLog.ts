// Outbox rows in finished or waiting states for the alert log tests. The in-process worker
// only claims pending rows that are due, so these stay as written.
import { randomUUID } from 'node:crypto';
import { Notification } from '../../src/lib/server/db/models';
import type { NotificationStatus } from '../../src/lib/domain';
import { testDb } from './db';

export interface LogRowSpec {
	organisationId: number;
	userId: number;
	blockId?: number | null;
	channel: 'sms' | 'email';
	status: NotificationStatus;
	kind?: string;
	toAddress: string;
	lastError?: string | null;
	attempts?: number;
	createdAt?: Date;
}

/** One outbox row as the producers and the worker leave it; `pending` rows wait a day. */
export async function logRow(s: LogRowSpec) {
	testDb();
	const created = s.createdAt ?? new Date();
	const sent = ['sent', 'delivered', 'undelivered'].includes(s.status);
	return Notification.create({
		organisationId: s.organisationId,
		userId: s.userId,
		blockId: s.blockId ?? null,
		recommendationId: null,
		channel: s.channel,
		kind: s.kind ?? 'level-action',
		dedupeKey: `test-log:${randomUUID()}`,
		toAddress: s.toAddress,
		subject: s.channel === 'email' ? 'Test alert' : null,
		bodyText: 'Test alert body',
		status: s.status,
		attempts: s.attempts ?? (s.status === 'pending' || s.status === 'suppressed' ? 0 : 1),
		notBefore: s.status === 'pending' ? new Date(Date.now() + 86_400_000) : created,
		providerId: sent ? `SM${randomUUID().replace(/-/g, '')}` : null,
		lastError: s.lastError ?? null,
		sentAt: sent ? new Date(created.getTime() + 2_000) : null,
		deliveredAt: s.status === 'delivered' ? new Date(created.getTime() + 9_000) : null,
		createdAt: created,
		updatedAt: created
	});
}
