import { TZDate } from '@date-fns/tz';
import { format } from 'date-fns';

const HHMM = /^([01]\d|2[0-3]):([0-5]\d)$/;

export function parseHhmm(s: string | null | undefined): number | null {
	const m = s ? HHMM.exec(s) : null;
	return m ? Number(m[1]) * 60 + Number(m[2]) : null;
}

/** Local date (YYYY-MM-DD), minute of the day and hour at an instant in a time zone. */
export function localTime(at: Date, timeZone: string) {
	const local = new TZDate(at.getTime(), timeZone);
	const hour = local.getHours();
	return { date: format(local, 'yyyy-MM-dd'), hour, minute: hour * 60 + local.getMinutes() };
}

export function inQuietHours(minute: number, start: number, end: number) {
	if (start === end) return false;
	return start < end ? minute >= start && minute < end : minute >= start || minute < end;
}

/**
 * When an SMS may go out: `now`, or the end of the recipient's quiet hours (local time in the
 * organisation's zone) when `now` falls inside them: today's end time when it is still ahead,
 * else tomorrow's. The zone library keeps a night that changes the clock on the local end time.
 */
export function releaseAfterQuiet(
	now: Date,
	timeZone: string,
	quietStart: string | null | undefined,
	quietEnd: string | null | undefined
): Date {
	const start = parseHhmm(quietStart);
	const end = parseHhmm(quietEnd);
	if (start === null || end === null) return now;
	const local = new TZDate(now.getTime(), timeZone);
	const minute = local.getHours() * 60 + local.getMinutes();
	if (!inQuietHours(minute, start, end)) return now;
	const release = new TZDate(
		local.getFullYear(),
		local.getMonth(),
		local.getDate() + (end > minute ? 0 : 1),
		Math.floor(end / 60),
		end % 60,
		timeZone
	);
	return new Date(release.getTime());
}
