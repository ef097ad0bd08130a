import { differenceInCalendarDays, parseISO } from 'date-fns';
import { levelRank, type LevelKey } from '$lib/engine';
import { blocksOfScout } from '../queries/blocks';

export interface DayBlock {
	id: number;
	name: string;
	farmName: string;
	crop: string;
	pest: string;
	level: LevelKey | null;
	reason: string | null;
	lastVisitOn: string | null;
	intervalDays: number;
	/**
	 * Days until the re-scout is due (the interval, or an earlier open follow-up date): negative
	 * when overdue, null when never visited.
	 */
	dueIn: number | null;
	status: 'never' | 'overdue' | 'today' | 'soon' | 'later';
}

/** The scout's blocks for today: overdue and never-visited first, then by level and due date. */
export async function scoutsDay(user: SessionUser, today = new Date()): Promise<DayBlock[]> {
	const rows = await blocksOfScout(user.id, user.organisationId);
	const out = rows.map((b): DayBlock => {
		// Due at the scout's interval after the last visit, or sooner at an open follow-up date
		// (the same rule as the desk and the overdue alerts, scouting/due.ts).
		const byInterval = b.lastVisitOn
			? b.rescoutDays - differenceInCalendarDays(today, parseISO(String(b.lastVisitOn)))
			: null;
		const byFollowUp = b.followUpDue
			? differenceInCalendarDays(parseISO(String(b.followUpDue).slice(0, 10)), today)
			: null;
		const dueIn =
			byInterval === null
				? null
				: byFollowUp === null
					? byInterval
					: Math.min(byInterval, byFollowUp);
		const status =
			dueIn === null
				? 'never'
				: dueIn < 0
					? 'overdue'
					: dueIn === 0
						? 'today'
						: dueIn <= 2
							? 'soon'
							: 'later';
		return {
			id: b.id,
			name: b.name,
			farmName: b.farmName,
			crop: b.crop,
			pest: b.pest,
			level: b.level,
			reason: b.reason,
			lastVisitOn: b.lastVisitOn ? String(b.lastVisitOn).slice(0, 10) : null,
			intervalDays: b.rescoutDays,
			dueIn,
			status
		};
	});
	const urgency = (b: DayBlock) => (b.dueIn === null ? -1000 : b.dueIn);
	return out.sort(
		(a, b) =>
			Math.min(urgency(a), 1) - Math.min(urgency(b), 1) ||
			(b.level ? levelRank(b.level) : -1) - (a.level ? levelRank(a.level) : -1) ||
			urgency(a) - urgency(b) ||
			a.name.localeCompare(b.name)
	);
}
