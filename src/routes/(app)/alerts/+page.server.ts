import { QueryTypes } from 'sequelize';
import { alertLogQuerySchema, type AlertLogQuery } from '$lib/schemas/alerts';
import { maskPhone } from '$lib/phone';
import { db } from '$lib/server/db';
import { requireRole } from '$lib/server/guard';
import { alertLog, toDate, type LogRow } from '$lib/server/queries/alertLog';
import type { PageServerLoad } from './$types';

const maskEmail = (a: string) => a.replace(/^(.)[^@]*/, '$1•••');

function timeFormat(timeZone: string) {
	const f = new Intl.DateTimeFormat('en-GB', {
		timeZone,
		day: 'numeric',
		month: 'short',
		hour: '2-digit',
		minute: '2-digit',
		hourCycle: 'h23'
	});
	return (v: LogRow['sentAt']) => (v ? f.format(toDate(v)) : null);
}

function linkTo(url: URL, key: 'older' | 'newer' | null, at: string | null) {
	const q = new URLSearchParams(url.searchParams);
	q.delete('older');
	q.delete('newer');
	if (key && at) q.set(key, at);
	return `/alerts?${q}`;
}

/** Every message of the organisation's outbox, newest first, with its delivery state. */
export const load: PageServerLoad = async (event) => {
	const user = requireRole(event, 'agronomist', 'admin');
	const raw: Record<string, string> = {};
	for (const [k, v] of event.url.searchParams) if (v !== '') raw[k] = v;
	const parsed = alertLogQuerySchema.safeParse(raw);
	const query: AlertLogQuery = parsed.success ? parsed.data : {};
	const problems = parsed.success
		? []
		: parsed.error.issues.map((i) =>
				i.code === 'unrecognized_keys'
					? `${i.keys.join(', ')}: not a filter of this page (use status, channel, kind, from, to)`
					: i.message
			);
	const [org] = await db().query<{ timezone: string }>(
		'SELECT timezone FROM organisations WHERE id = ?',
		{ replacements: [user.organisationId], type: QueryTypes.SELECT }
	);
	const timeZone = org?.timezone || 'UTC';
	const page = problems.length
		? { rows: [], newer: null, older: null }
		: await alertLog(user.organisationId, query, timeZone);
	const at = timeFormat(timeZone);
	const now = Date.now();
	return {
		query,
		problems,
		timeZone,
		links: {
			newest: linkTo(event.url, null, null),
			newer: page.newer ? linkTo(event.url, 'newer', page.newer) : null,
			older: page.older ? linkTo(event.url, 'older', page.older) : null
		},
		rows: page.rows.map((r) => ({
			id: r.id,
			channel: r.channel,
			kind: r.kind,
			recipient: r.recipient,
			address: r.channel === 'sms' ? maskPhone(r.toAddress) : maskEmail(r.toAddress),
			blockId: r.blockId,
			blockName: r.blockName,
			farmName: r.farmName,
			status: r.status,
			attempts: Number(r.attempts),
			lastError: r.lastError,
			queuedAt: at(r.createdAt),
			waitsUntil:
				r.status === 'pending' && toDate(r.notBefore).getTime() > now ? at(r.notBefore) : null,
			sentAt: at(r.sentAt),
			deliveredAt: at(r.deliveredAt)
		}))
	};
};
