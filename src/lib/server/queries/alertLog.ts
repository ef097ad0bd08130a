import { TZDate } from '@date-fns/tz';
import { QueryTypes } from 'sequelize';
import type { Channel, NotificationStatus } from '$lib/domain';
import type { AlertLogQuery } from '$lib/schemas/alerts';
import { db } from '../db';

export const LOG_PAGE = 50;

export interface LogRow {
	id: number;
	channel: Channel;
	kind: string;
	toAddress: string;
	recipient: string | null;
	blockId: number | null;
	blockName: string | null;
	farmName: string | null;
	status: NotificationStatus;
	attempts: number;
	lastError: string | null;
	createdAt: Date | string;
	notBefore: Date | string;
	sentAt: Date | string | null;
	deliveredAt: Date | string | null;
}

/** UTC instant of local midnight on `day` (YYYY-MM-DD) in `timeZone`. */
export function zonedMidnight(day: string, timeZone: string): Date {
	const [y, m, d] = day.split('-').map(Number);
	return new Date(new TZDate(y, m - 1, d, timeZone).getTime());
}

export const toDate = (v: Date | string) =>
	v instanceof Date ? v : new Date(/[zZ]|[+-]\d\d:?\d\d$/.test(v) ? v : `${v.replace(' ', 'T')}Z`);

/** The cursor of a row: its creation time in Unix seconds and its id. */
export const cursorOf = (r: Pick<LogRow, 'createdAt' | 'id'>) =>
	`${Math.floor(toDate(r.createdAt).getTime() / 1000)}-${r.id}`;

/**
 * One page of an organisation's outbox, newest first, in one query. Keyset paging on
 * (created_at, id) reads one range of the (organisation, status|kind, created_at) indexes, so
 * a page costs the same on the first page and the thousandth.
 */
export async function alertLog(organisationId: number, q: AlertLogQuery, timeZone: string) {
	const where = ['n.organisation_id = :org'];
	const r: Record<string, unknown> = { org: organisationId, limit: LOG_PAGE + 1 };
	const add = (sql: string, key: string, value: unknown) => {
		where.push(sql);
		r[key] = value;
	};
	if (q.status) add('n.status = :status', 'status', q.status);
	if (q.channel) add('n.channel = :channel', 'channel', q.channel);
	if (q.kind) add('n.kind = :kind', 'kind', q.kind);
	if (q.from) add('n.created_at >= :from', 'from', zonedMidnight(q.from, timeZone));
	if (q.to) {
		const next = new Date(`${q.to}T12:00:00Z`);
		next.setUTCDate(next.getUTCDate() + 1);
		add('n.created_at < :to', 'to', zonedMidnight(next.toISOString().slice(0, 10), timeZone));
	}
	const at = q.older ?? q.newer;
	if (at) {
		const [secs, id] = at.split('-');
		r.at = new Date(Number(secs) * 1000);
		r.atId = id;
		where.push(
			q.older
				? 'n.created_at <= :at AND (n.created_at < :at OR n.id < :atId)'
				: 'n.created_at >= :at AND (n.created_at > :at OR n.id > :atId)'
		);
	}
	const dir = q.newer ? 'ASC' : 'DESC';
	// MariaDB, given ORDER BY ... LIMIT, prefers walking the organisation's part of the index
	// over the created_at range (seen: 650 ms instead of 3 ms for a page 40 days deep over
	// 300,000 rows); naming the index that matches the filter keeps it a range scan.
	const index = q.status
		? 'notifications_org_status_created'
		: q.kind
			? 'notifications_org_kind_created'
			: 'notifications_organisation_id_created_at';
	const rows = await db().query<LogRow>(
		`SELECT n.id, n.channel, n.kind, n.to_address AS toAddress, u.name AS recipient,
		        n.block_id AS blockId, b.name AS blockName, f.name AS farmName, n.status, n.attempts,
		        n.last_error AS lastError, n.created_at AS createdAt, n.not_before AS notBefore,
		        n.sent_at AS sentAt, n.delivered_at AS deliveredAt
		   FROM notifications n FORCE INDEX (${index})
		   LEFT JOIN users u ON u.id = n.user_id
		   LEFT JOIN blocks b ON b.id = n.block_id AND b.organisation_id = n.organisation_id
		   LEFT JOIN farms f ON f.id = b.farm_id
		  WHERE ${where.join(' AND ')}
		  ORDER BY n.created_at ${dir}, n.id ${dir}
		  LIMIT :limit`,
		{ replacements: r, type: QueryTypes.SELECT }
	);
	const more = rows.length > LOG_PAGE;
	const page = rows.slice(0, LOG_PAGE);
	if (q.newer) page.reverse();
	return {
		rows: page,
		newer: q.newer
			? more
				? cursorOf(page[0])
				: null
			: q.older && page.length
				? cursorOf(page[0])
				: null,
		older: q.newer
			? page.length
				? cursorOf(page[page.length - 1])
				: null
			: more
				? cursorOf(page[page.length - 1])
				: null
	};
}
