import { addDays, differenceInCalendarDays, formatISO, parseISO, startOfISOWeek } from 'date-fns';

export const MAX_WEEKS = 26;
export const DEFAULT_WEEKS = 10;

const day = (d: Date) => formatISO(d, { representation: 'date' });

/**
 * Whole ISO weeks (Monday to Sunday) covering `from`..`to`; by default the last 10 weeks up to
 * and including the week of `today`. Each week has its first day and the day after its last.
 */
export function weeksBetween(q: { from?: string; to?: string }, today = new Date()) {
	const to = startOfISOWeek(q.to ? parseISO(q.to) : today);
	const from = startOfISOWeek(q.from ? parseISO(q.from) : addDays(to, -7 * (DEFAULT_WEEKS - 1)));
	const n = Math.floor(differenceInCalendarDays(to, from) / 7) + 1;
	if (n > MAX_WEEKS)
		return { message: `Ask for at most ${MAX_WEEKS} weeks at a time (asked for ${n}).` };
	return {
		weeks: Array.from({ length: n }, (_, i) => {
			const start = addDays(from, 7 * i);
			return { start: day(start), next: day(addDays(start, 7)) };
		})
	};
}
