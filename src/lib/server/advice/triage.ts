import { z } from 'zod';
import { dayNumber, type LevelKey } from '$lib/engine';
import { LEVEL_KEYS } from '$lib/domain';
import { readQuery } from '../db';
import { FOLLOW_UP_DUE_SQL, scoutingDue } from '../scouting/due';

export interface TriageRow {
	id: number;
	name: string;
	farmId: number;
	farmName: string;
	growerName: string;
	cropId: number;
	crop: string;
	pestId: number;
	pest: string;
	level: LevelKey | null;
	reason: string | null;
	lastVisitOn: string | null;
	rescoutDays: number;
	daysToAction: number | null;
	actionDate: string | null;
	scouts: string | null;
	scoutIds: string | null;
	openRecs: number;
	followUpDue: string | null;
	/** Derived: days since the last visit (null when never visited). */
	ageDays: number | null;
	/** Derived: days past the re-scout interval or a follow-up date (0 when not overdue). */
	overdueDays: number;
	urgency: number;
}

const SQL = `
SELECT b.id, b.name, b.farm_id AS farmId, f.name AS farmName, g.name AS growerName,
       c.id AS cropId, c.name AS crop, p.id AS pestId, p.name AS pest,
       b.current_level AS level, b.current_reason AS reason, b.last_visit_on AS lastVisitOn,
       b.rescout_days AS rescoutDays,
       JSON_VALUE(a.result, '$.forecast.daysToAction') AS daysToAction,
       JSON_VALUE(a.result, '$.forecast.actionDate') AS actionDate,
       (SELECT GROUP_CONCAT(u.name ORDER BY u.name SEPARATOR ', ') FROM scouting_assignments s
          JOIN users u ON u.id = s.scout_id WHERE s.block_id = b.id AND s.active = 1) AS scouts,
       (SELECT GROUP_CONCAT(s.scout_id ORDER BY u.name) FROM scouting_assignments s
          JOIN users u ON u.id = s.scout_id WHERE s.block_id = b.id AND s.active = 1) AS scoutIds,
       (SELECT COUNT(*) FROM recommendations r
         WHERE r.block_id = b.id AND r.status IN ('issued', 'acknowledged')) AS openRecs,
       ${FOLLOW_UP_DUE_SQL} AS followUpDue
  FROM blocks b
  JOIN farms f ON f.id = b.farm_id
  JOIN users g ON g.id = f.grower_id
  JOIN crops c ON c.id = b.crop_id
  JOIN pests p ON p.id = b.pest_id
  LEFT JOIN assessments a ON a.id = (SELECT a2.id FROM assessments a2 WHERE a2.block_id = b.id
                                      ORDER BY a2.computed_at DESC, a2.id DESC LIMIT 1)
 WHERE b.organisation_id = ?`;

const RANK: Record<LevelKey, number> = { calm: 0, stirring: 1, action: 2, severe: 3 };

/**
 * Ordering by urgency: level first; then the sooner the action threshold is forecast, the more
 * urgent; then how far scouting is overdue; then how old the last visit is.
 */
export function byUrgency(a: TriageRow, b: TriageRow) {
	const lv = (b.level ? RANK[b.level] : -1) - (a.level ? RANK[a.level] : -1);
	if (lv) return lv;
	const da = a.daysToAction ?? Infinity;
	const db_ = b.daysToAction ?? Infinity;
	if (da !== db_) return da < db_ ? -1 : 1;
	if (a.overdueDays !== b.overdueDays) return b.overdueDays - a.overdueDays;
	const aa = a.ageDays ?? Infinity;
	const ab = b.ageDays ?? Infinity;
	if (aa !== ab) return aa > ab ? -1 : 1;
	return a.name.localeCompare(b.name);
}

/** Adds age, overdue days and the urgency position to raw rows. */
export function rank(raw: Omit<TriageRow, 'ageDays' | 'overdueDays' | 'urgency'>[], today: string) {
	const t = dayNumber(today, 'today');
	const rows: TriageRow[] = raw.map((r) => {
		const { age, overdue } = scoutingDue(r, t);
		const d =
			r.daysToAction === null || r.daysToAction === undefined ? null : Number(r.daysToAction);
		return {
			...r,
			daysToAction: d !== null && Number.isFinite(d) ? Math.round(d * 10) / 10 : null,
			openRecs: Number(r.openRecs),
			ageDays: age,
			overdueDays: overdue,
			urgency: 0
		};
	});
	rows.sort(byUrgency).forEach((r, i) => (r.urgency = i + 1));
	return rows;
}

export const triageFilterSchema = z.object({
	crop: z.coerce.number().int().positive().optional().catch(undefined),
	pest: z.coerce.number().int().positive().optional().catch(undefined),
	farm: z.coerce.number().int().positive().optional().catch(undefined),
	scout: z.coerce.number().int().positive().optional().catch(undefined),
	level: z.enum(LEVEL_KEYS).optional().catch(undefined),
	sort: z
		.enum(['urgency', 'block', 'farm', 'crop', 'level', 'lastVisit', 'daysToAction', 'overdue'])
		.default('urgency')
		.catch('urgency'),
	dir: z.enum(['asc', 'desc']).default('asc').catch('asc')
});
export type TriageFilter = z.infer<typeof triageFilterSchema>;

export function readFilter(url: URL): TriageFilter {
	const o: Record<string, string> = {};
	for (const [k, v] of url.searchParams) if (v !== '') o[k] = v;
	return triageFilterSchema.parse(o);
}

const cmp = (a: unknown, b: unknown) =>
	a === b
		? 0
		: a === null || a === undefined
			? 1
			: b === null || b === undefined
				? -1
				: a < b
					? -1
					: 1;

const KEY: Record<TriageFilter['sort'], (r: TriageRow) => unknown> = {
	urgency: (r) => r.urgency,
	block: (r) => r.name.toLowerCase(),
	farm: (r) => r.farmName.toLowerCase(),
	crop: (r) => r.crop.toLowerCase(),
	level: (r) => (r.level ? 3 - RANK[r.level] : 4),
	lastVisit: (r) => r.lastVisitOn,
	daysToAction: (r) => r.daysToAction,
	overdue: (r) => -r.overdueDays
};

/** The organisation's blocks ranked, filtered and sorted; counts per level over the filters. */
export async function triage(organisationId: number, f: TriageFilter, today: string) {
	// A heavy read screen: served by a replica when one answers.
	const raw = await readQuery<Omit<TriageRow, 'ageDays' | 'overdueDays' | 'urgency'>>(SQL, [
		organisationId
	]);
	const all = rank(raw, today);
	const matching = all.filter(
		(r) =>
			(!f.crop || r.cropId === f.crop) &&
			(!f.pest || r.pestId === f.pest) &&
			(!f.farm || r.farmId === f.farm) &&
			(!f.scout || (r.scoutIds ?? '').split(',').includes(String(f.scout)))
	);
	const counts = Object.fromEntries(
		[...LEVEL_KEYS, 'none'].map((k) => [
			k,
			matching.filter((r) => (r.level ?? 'none') === k).length
		])
	) as Record<LevelKey | 'none', number>;
	const rows = matching.filter((r) => !f.level || r.level === f.level);
	const key = KEY[f.sort];
	rows.sort((a, b) => (f.dir === 'desc' ? -1 : 1) * cmp(key(a), key(b)) || a.urgency - b.urgency);
	const options = {
		crops: uniq(all.map((r) => [r.cropId, r.crop])),
		pests: uniq(all.map((r) => [r.pestId, r.pest])),
		farms: uniq(all.map((r) => [r.farmId, r.farmName])),
		scouts: uniq(
			all.flatMap((r) => {
				const ids = (r.scoutIds ?? '').split(',').filter(Boolean);
				const names = (r.scouts ?? '').split(', ');
				return ids.length === names.length
					? ids.map((id, i) => [Number(id), names[i]] as [number, string])
					: [];
			})
		)
	};
	return { rows, counts, options, total: all.length };
}

function uniq(pairs: (readonly [number, string])[]) {
	const m = new Map<number, string>();
	for (const [id, name] of pairs) m.set(id, name);
	return [...m].map(([id, name]) => ({ id, name })).sort((a, b) => a.name.localeCompare(b.name));
}
