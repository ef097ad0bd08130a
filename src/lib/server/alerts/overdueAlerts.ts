import { QueryTypes, type Sequelize, type Transaction } from 'sequelize';
import type { LevelKey } from '../../engine';
import { dayNumber, isoPlusDays } from '../../engine/dates';
import { FOLLOW_UP_DUE_SQL, scoutingDue } from '../scouting/due';
import { rank } from './levelAlerts';
import { blockLink, settingsLink } from './links';
import { overdueMessage } from './overdueMessage';
import { rowFor, writeRows, type OutboxRow } from './outbox';
import { localTime } from './quiet';
import { optedOut, recipientsForBlock, type Recipient } from './recipients';
import type { AlertSettings } from './settings';

export const OVERDUE_KIND = 'scouting-overdue';

interface BlockRow {
	id: number;
	name: string;
	farmId: number;
	farm: string;
	level: LevelKey | null;
	lastVisitOn: string | Date;
	rescoutDays: number;
	followUpDue: string | Date | null;
}

const BLOCKS = `
SELECT b.id, b.name, b.farm_id AS farmId, f.name AS farm, b.current_level AS level,
       b.last_visit_on AS lastVisitOn, b.rescout_days AS rescoutDays, ${FOLLOW_UP_DUE_SQL} AS followUpDue
  FROM blocks b JOIN farms f ON f.id = b.farm_id
 WHERE b.organisation_id = :org AND b.last_visit_on IS NOT NULL
 ORDER BY b.id`;

const day = (v: string | Date | null) =>
	v === null ? null : v instanceof Date ? v.toISOString().slice(0, 10) : String(v).slice(0, 10);

const select = <T extends object>(
	sq: Sequelize,
	t: Transaction,
	sql: string,
	replacements: Record<string, unknown>
) => sq.query<T>(sql, { replacements, type: QueryTypes.SELECT, transaction: t }) as Promise<T[]>;

/** Who hears of a late block: its assigned scouts always, agronomists from their lowest level. */
function hears(r: Recipient, level: LevelKey | null) {
	if (r.role === 'scout') return true;
	return r.role === 'agronomist' && rank(level) >= rank(r.minLevel);
}

/**
 * Outbox rows for blocks whose re-scout is past due, by the desk's rule (`scouting/due.ts`:
 * the re-scout interval after the last visit, or an open follow-up date), to the scouts
 * assigned to them (by each assignment's own interval, as on their rounds) and to the
 * organisation's agronomists whose lowest level the block's level reaches. Growers and admins
 * are not told: the visit is the scouts' and agronomists' work. A block never visited has no
 * re-scout to miss: it heads the scout's rounds and the digest instead. One row per person,
 * channel, block and due date (the dedupe key), none for a person alerted for the block within
 * the repeat window; SMS waits out quiet hours. Each organisation is one transaction, so a failure
 * leaves none of its rows.
 */
export async function queueOverdueAlerts(
	sq: Sequelize,
	s: AlertSettings,
	now = new Date(),
	onlyOrg?: number
): Promise<number> {
	const orgs = await sq.query<{ id: number; timezone: string }>(
		`SELECT id, timezone FROM organisations ${onlyOrg ? 'WHERE id = :only' : ''}`,
		{ replacements: { only: onlyOrg ?? 0 }, type: QueryTypes.SELECT }
	);
	// One transaction per organisation: each one's rows are written whole or not at all, and one
	// that fails (a bad time zone, say) does not hold back the others' alerts.
	let queued = 0;
	for (const org of orgs) {
		try {
			queued += await sweepWithRetry(sq, s, now, org);
		} catch (e) {
			if (onlyOrg) throw e;
			console.error(`overdue alerts: organisation ${org.id} skipped: ${(e as Error).message}`);
		}
	}
	return queued;
}

async function sweepWithRetry(
	sq: Sequelize,
	s: AlertSettings,
	now: Date,
	org: { id: number; timezone: string }
): Promise<number> {
	for (let attempt = 1; ; attempt++) {
		try {
			return await sq.transaction((t) => queueForOrganisation(sq, s, t, org, now));
		} catch (e) {
			// Two workers sweeping at once may deadlock on the outbox's unique key; the victim's
			// transaction rolled back whole, so running it again is safe.
			const errno = (e as { parent?: { errno?: number } }).parent?.errno;
			if (attempt >= 3 || (errno !== 1213 && errno !== 1205)) throw e;
			await new Promise((r) => setTimeout(r, 20 + Math.random() * 80 * attempt));
		}
	}
}

async function queueForOrganisation(
	sq: Sequelize,
	s: AlertSettings,
	t: Transaction,
	org: { id: number; timezone: string },
	now: Date
) {
	const timeZone = org.timezone || 'UTC';
	const today = localTime(now, timeZone).date;
	const todayN = dayNumber(today, 'today');
	const since = new Date(now.getTime() - s.ALERTS_REPEAT_HOURS * 3_600_000);
	const [blocks, assignments, recent] = await Promise.all([
		select<BlockRow>(sq, t, BLOCKS, { org: org.id }),
		select<{ blockId: number; scoutId: number; intervalDays: number }>(
			sq,
			t,
			`SELECT a.block_id AS blockId, a.scout_id AS scoutId, a.interval_days AS intervalDays
			   FROM scouting_assignments a JOIN blocks b ON b.id = a.block_id
			  WHERE a.active = 1 AND b.organisation_id = :org`,
			{ org: org.id }
		),
		select<{ blockId: number; userId: number; channel: string }>(
			sq,
			t,
			`SELECT block_id AS blockId, user_id AS userId, channel FROM notifications
			  WHERE organisation_id = :org AND kind = :kind AND created_at > :since
			    AND status NOT IN ('failed', 'undelivered')`,
			{ org: org.id, kind: OVERDUE_KIND, since }
		)
	]);
	const interval = new Map(assignments.map((a) => [`${a.blockId}:${a.scoutId}`, a.intervalDays]));
	const already = new Set(recent.map((r) => `${r.blockId}:${r.userId}:${r.channel}`));
	let queued = 0;
	for (const b of blocks) {
		const lastVisitOn = day(b.lastVisitOn)!;
		const row = { lastVisitOn, followUpDue: day(b.followUpDue) };
		// Cheap test first: is the block late by the shortest interval anyone scouts it at?
		const shortest = Math.min(
			b.rescoutDays,
			...assignments.filter((a) => a.blockId === b.id).map((a) => a.intervalDays)
		);
		if (!scoutingDue({ ...row, rescoutDays: shortest }, todayN).overdue) continue;
		const people = (await recipientsForBlock({ ...b, organisationId: org.id }, t)).filter(
			(r) => hears(r, b.level) && !already.has(`${b.id}:${r.userId}:${r.channel}`)
		);
		if (!people.length) continue;
		const stopped = await optedOut(
			people.flatMap((r) => (r.phone ? [r.phone] : [])),
			t
		);
		const rows: OutboxRow[] = [];
		for (const r of people) {
			const days =
				r.role === 'scout' ? (interval.get(`${b.id}:${r.userId}`) ?? b.rescoutDays) : b.rescoutDays;
			const due = scoutingDue({ ...row, rescoutDays: days }, todayN);
			if (!due.overdue) continue;
			// The day it fell due, from the same figure, so the key holds until the next visit.
			const dueOn = isoPlusDays(today, -due.overdue);
			const msg = overdueMessage({
				block: b.name,
				farm: b.farm,
				lastVisitOn,
				dueOn,
				overdueDays: due.overdue,
				intervalDays: days,
				followUpDue: row.followUpDue,
				level: b.level,
				link: blockLink(s, r.role, b.id),
				settingsUrl: settingsLink(s)
			});
			const out = rowFor(r, msg, {
				organisationId: org.id,
				blockId: b.id,
				recommendationId: null,
				kind: OVERDUE_KIND,
				dedupeBase: `overdue:b${b.id}:${dueOn}`,
				now,
				timeZone,
				urgent: false,
				optedOut: stopped
			});
			if (out) rows.push(out);
		}
		if (!rows.length) continue;
		const written = await select<{ k: string }>(
			sq,
			t,
			'SELECT dedupe_key AS k FROM notifications WHERE dedupe_key IN (:keys)',
			{ keys: rows.map((x) => x.dedupeKey) }
		);
		const done = new Set(written.map((w) => w.k));
		queued += await writeRows(
			rows.filter((x) => !done.has(x.dedupeKey)),
			t
		);
	}
	return queued;
}
