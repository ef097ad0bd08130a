// The one rule for late scouting, shared by the desk's triage, the daily digest and the
// overdue alerts. Relative imports only: the standalone alerts worker runs it outside Vite.
import { dayNumber } from '../../engine/dates';

/**
 * SQL for a block's open follow-up date (alias `b` for the block): the earliest follow-up of an
 * open recommendation that no visit has met yet.
 */
export const FOLLOW_UP_DUE_SQL = `(SELECT MIN(r.follow_up_due) FROM recommendations r
         WHERE r.block_id = b.id AND r.status IN ('issued', 'acknowledged', 'applied')
           AND r.follow_up_due IS NOT NULL
           AND (b.last_visit_on IS NULL OR r.follow_up_due > b.last_visit_on))`;

export interface DueInput {
	lastVisitOn: string | null;
	rescoutDays: number;
	followUpDue: string | null;
}

/**
 * Days since the last visit (null when never visited) and days overdue: past the re-scout
 * interval after the last visit, or past an open follow-up date, whichever is more; a block
 * never visited counts as a full interval late. `today` is a day number (engine `dayNumber`).
 */
export function scoutingDue(r: DueInput, today: number) {
	const age = r.lastVisitOn ? today - dayNumber(String(r.lastVisitOn), 'lastVisitOn') : null;
	const byInterval = age === null ? r.rescoutDays : Math.max(0, age - r.rescoutDays);
	const byFollowUp = r.followUpDue
		? Math.max(0, today - dayNumber(String(r.followUpDue), 'followUpDue'))
		: 0;
	return { age, overdue: Math.max(byInterval, byFollowUp) };
}
