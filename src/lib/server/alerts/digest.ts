import { QueryTypes, type Sequelize } from 'sequelize';
import { DECISION_LABELS, type Decision } from '../../domain';
import type { LevelKey } from '../../engine';
import { dayNumber } from '../../engine/dates';
import { FOLLOW_UP_DUE_SQL, scoutingDue } from '../scouting/due';
import { LEVEL_LABEL } from './compose';
import { mailHtml, mailText, type MailParts } from './html';
import { settingsLink } from './links';
import { localTime } from './quiet';
import type { AlertSettings } from './settings';

interface BlockRow {
	id: number;
	name: string;
	farm: string;
	level: LevelKey | null;
	reason: string | null;
	lastVisitOn: string | Date | null;
	rescoutDays: number;
	followUpDue: string | Date | null;
}

interface OpenRow {
	block: string;
	farm: string;
	decision: Decision;
	product: string | null;
	iracGroup: string | null;
	targetDate: string | null;
	rescoutBy: string | null;
	issuedAt: Date;
}

const day = (v: string | Date | null) =>
	v === null ? null : v instanceof Date ? v.toISOString().slice(0, 10) : String(v).slice(0, 10);

/** One open recommendation as a digest line: what, with which product, since when. */
function openLine(r: OpenRow) {
	const what =
		r.decision === 'treat' && r.product
			? `Treat with ${r.product}${r.iracGroup ? ` (IRAC group ${r.iracGroup})` : ''}${r.targetDate ? ` by ${day(r.targetDate)}` : ''}`
			: r.decision === 'rescout' && r.rescoutBy
				? `Re-scout by ${day(r.rescoutBy)}`
				: DECISION_LABELS[r.decision];
	return `${r.block} (${r.farm}): ${what}; issued ${new Date(r.issuedAt).toISOString().slice(0, 10)}`;
}

const q = <T extends object>(sq: Sequelize, sql: string, replacements: Record<string, unknown>) =>
	sq.query<T>(sql, { replacements, type: QueryTypes.SELECT }) as Promise<T[]>;

/** The day's digest for one organisation: where pressure stands, what changed, what is late. */
export async function digestParts(
	sq: Sequelize,
	s: AlertSettings,
	organisationId: number,
	localDate: string
): Promise<MailParts> {
	const [blocks, changes, open, failures] = await Promise.all([
		q<BlockRow>(
			sq,
			`SELECT b.id, b.name, f.name AS farm, b.current_level AS level, b.current_reason AS reason,
			        b.last_visit_on AS lastVisitOn, b.rescout_days AS rescoutDays,
			        ${FOLLOW_UP_DUE_SQL} AS followUpDue
			   FROM blocks b JOIN farms f ON f.id = b.farm_id
			  WHERE b.organisation_id = :org
			  ORDER BY FIELD(b.current_level, 'severe', 'action', 'stirring', 'calm') , f.name, b.name`,
			{ org: organisationId }
		),
		q<{ n: number }>(
			sq,
			`SELECT COUNT(*) AS n FROM audit_log WHERE organisation_id = :org AND action = 'level-changed'
			    AND created_at > NOW(3) - INTERVAL 1 DAY`,
			{ org: organisationId }
		),
		q<OpenRow>(
			sq,
			`SELECT b.name AS block, f.name AS farm, r.decision, p.name AS product, p.irac_group AS iracGroup,
			        r.target_date AS targetDate, r.rescout_by AS rescoutBy, r.issued_at AS issuedAt
			   FROM recommendations r
			   JOIN blocks b ON b.id = r.block_id JOIN farms f ON f.id = b.farm_id
			   LEFT JOIN products p ON p.id = r.product_id
			  WHERE r.organisation_id = :org AND r.status = 'issued' ORDER BY r.issued_at, r.id`,
			{ org: organisationId }
		),
		q<{ n: number }>(
			sq,
			`SELECT COUNT(*) AS n FROM notifications WHERE organisation_id = :org
			    AND status IN ('failed', 'undelivered') AND updated_at > NOW(3) - INTERVAL 1 DAY`,
			{ org: organisationId }
		)
	]);
	const high = blocks.filter((b) => b.level === 'severe' || b.level === 'action');
	const today = dayNumber(localDate, 'localDate');
	const overdue = blocks.flatMap((b) => {
		const lastVisitOn = day(b.lastVisitOn);
		const due = scoutingDue(
			{ lastVisitOn, rescoutDays: b.rescoutDays, followUpDue: day(b.followUpDue) },
			today
		);
		return due.overdue ? [{ ...b, lastVisitOn, days: due.overdue }] : [];
	});
	const counts = (['severe', 'action', 'stirring', 'calm'] as const)
		.map((l) => `${blocks.filter((b) => b.level === l).length} ${LEVEL_LABEL[l]}`)
		.join(', ');
	return {
		heading: `Daily digest, ${localDate}`,
		intro: [
			`${blocks.length} blocks: ${counts}.`,
			`${Number(changes[0]?.n ?? 0)} change(s) of level in the last 24 hours; ${Number(failures[0]?.n ?? 0)} alert(s) could not be delivered.`
		],
		figures: [],
		sections: [
			{
				title: 'Action due or severe',
				lines: high.length
					? high.map((b) =>
							`${b.name} (${b.farm}): ${LEVEL_LABEL[b.level!]}. ${b.reason ?? ''}`.trim()
						)
					: ['None today.']
			},
			{
				title: 'Scouting overdue',
				lines: overdue.length
					? overdue.map((b) =>
							b.lastVisitOn
								? `${b.name} (${b.farm}): last visit ${b.lastVisitOn}, ${b.days} day(s) overdue`
								: `${b.name} (${b.farm}): no visit yet`
						)
					: ['None.']
			},
			{
				title: 'Recommendations not yet acknowledged',
				lines: open.length ? open.map(openLine) : ['None.']
			}
		],
		link: { href: new URL('/desk', s.PUBLIC_BASE_URL).href, label: 'Open the desk' },
		// The digest lists recommendations: it carries the cautions whenever it lists one.
		cautions: open.length > 0,
		settingsUrl: settingsLink(s)
	};
}

/**
 * Queues the daily digest e-mail for each agronomist with an active e-mail subscription, once
 * per local day, after the digest hour in their organisation's time zone. Safe to call from
 * every worker: the dedupe key makes the second insert a no-op.
 */
export async function queueDigests(
	sq: Sequelize,
	s: AlertSettings,
	now = new Date(),
	onlyOrg?: number
) {
	const orgs = await q<{ id: number; timezone: string }>(
		sq,
		`SELECT id, timezone FROM organisations ${onlyOrg ? 'WHERE id = :only' : ''}`,
		{ only: onlyOrg ?? 0 }
	);
	let queued = 0;
	for (const org of orgs) {
		const local = localTime(now, org.timezone || 'UTC');
		if (local.hour < s.ALERTS_DIGEST_HOUR) continue;
		const people = await q<{ id: number; email: string }>(
			sq,
			`SELECT DISTINCT u.id, u.email FROM memberships m JOIN users u ON u.id = m.user_id
			   JOIN subscriptions s ON s.user_id = u.id AND s.channel = 'email' AND s.active = 1
			  WHERE m.organisation_id = :org AND m.role = 'agronomist'
			    AND NOT EXISTS (SELECT 1 FROM notifications n WHERE n.dedupe_key = CONCAT('digest:u', u.id, ':', :day))`,
			{ org: org.id, day: local.date }
		);
		if (!people.length) continue;
		const parts = await digestParts(sq, s, org.id, local.date);
		const subject = `Cornicle digest ${local.date}`;
		const text = mailText(parts);
		const html = mailHtml(parts);
		for (const p of people) {
			const [, inserted] = await sq.query(
				`INSERT IGNORE INTO notifications (organisation_id, user_id, channel, kind, dedupe_key, to_address,
				   subject, body_text, body_html, status, attempts, not_before, created_at, updated_at)
				 VALUES (:org, :user, 'email', 'digest', :key, :to, :subject, :text, :html, 'pending', 0, NOW(3), NOW(3), NOW(3))`,
				{
					// INSERT IGNORE is not recognised as an insert without the type, and the count is lost.
					type: QueryTypes.INSERT,
					replacements: {
						org: org.id,
						user: p.id,
						key: `digest:u${p.id}:${local.date}`,
						to: p.email,
						subject,
						text,
						html
					}
				}
			);
			queued += Number(inserted) || 0;
		}
	}
	return queued;
}
