const HHMM = /^([01]\d|2[0-3]):([0-5]\d)$/;

export function parseHhmm(s: string | null | undefined): number | null {
	const m = s ? HHMM.exec(s) : null;
	return m ? Number(m[1]) * 60 + Number(m[2]) : null;
}

const formatters = new Map<string, Intl.DateTimeFormat>();

/** Local date (YYYY-MM-DD), minute of the day and hour at an instant in a time zone. */
export function localTime(at: Date, timeZone: string) {
	let f = formatters.get(timeZone);
	if (!f) {
		f = new Intl.DateTimeFormat('en-CA', {
			timeZone,
			hourCycle: 'h23',
			year: 'numeric',
			month: '2-digit',
			day: '2-digit',
			hour: '2-digit',
			minute: '2-digit'
		});
		formatters.set(timeZone, f);
	}
	const p = Object.fromEntries(f.formatToParts(at).map((x) => [x.type, x.value]));
	const hour = Number(p.hour);
	return { date: `${p.year}-${p.month}-${p.day}`, hour, minute: hour * 60 + Number(p.minute) };
}

export function inQuietHours(minute: number, start: number, end: number) {
	if (start === end) return false;
	return start < end ? minute >= start && minute < end : minute >= start || minute < end;
}

/**
 * When an SMS may go out: `now`, or the end of the recipient's quiet hours (local time in the
 * organisation's zone) when `now` falls inside them. A night that changes the clock is
 * corrected once so the release lands on the local end time.
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
	const local = localTime(now, timeZone).minute;
	if (!inQuietHours(local, start, end)) return now;
	const wait = (end - local + 1440) % 1440;
	const base = new Date(Math.floor(now.getTime() / 60_000) * 60_000);
	let at = new Date(base.getTime() + wait * 60_000);
	const drift = end - localTime(at, timeZone).minute;
	if (drift !== 0 && Math.abs(drift) <= 120) at = new Date(at.getTime() + drift * 60_000);
	return at;
}
