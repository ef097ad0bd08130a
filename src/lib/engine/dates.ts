import { addDays, formatISO } from 'date-fns';
import { EngineInputError } from './errors';

const DAYS_IN_MONTH = [31, 28, 31, 30, 31, 30, 31, 31, 30, 31, 30, 31];

export function digits(s: string, from: number, to: number): number {
	let v = 0;
	for (let i = from; i < to; i++) {
		const c = s.charCodeAt(i) - 48;
		if (c < 0 || c > 9) return -1;
		v = v * 10 + c;
	}
	return v;
}

/** Day number (days since 1970-01-01) of a yyyy-mm-dd date, or an error naming the field. */
export function dayNumber(iso: unknown, field: string): number {
	// Hand parsing: weather brings one date per day per block, so this runs often.
	const s =
		typeof iso === 'string' && iso.length === 10 && iso[4] === '-' && iso[7] === '-' ? iso : '';
	const y = s ? digits(s, 0, 4) : -1;
	const m = s ? digits(s, 5, 7) : -1;
	const d = s ? digits(s, 8, 10) : -1;
	if (y < 0 || m < 0 || d < 0)
		throw new EngineInputError(field, 'must be a date written yyyy-mm-dd');
	const leap = (y % 4 === 0 && y % 100 !== 0) || y % 400 === 0;
	const dim = m === 2 && leap ? 29 : DAYS_IN_MONTH[m - 1];
	if (m < 1 || m > 12 || d < 1 || d > dim)
		throw new EngineInputError(field, `${iso} is not a calendar date`);
	// Days from the civil date (H. Hinnant's algorithm), exact for the proleptic Gregorian calendar.
	const yy = m <= 2 ? y - 1 : y;
	const era = Math.floor(yy / 400);
	const yoe = yy - era * 400;
	const doy = Math.floor((153 * (m + (m > 2 ? -3 : 9)) + 2) / 5) + d - 1;
	const doe = yoe * 365 + Math.floor(yoe / 4) - Math.floor(yoe / 100) + doy;
	return era * 146097 + doe - 719468;
}

/** The yyyy-mm-dd date a number of days after an ISO date (calendar days, date-fns). */
export function isoPlusDays(iso: string, days: number): string {
	const y = digits(iso, 0, 4);
	const m = digits(iso, 5, 7);
	const d = digits(iso, 8, 10);
	return formatISO(addDays(new Date(y, m - 1, d), days), { representation: 'date' });
}

const MONTHS = ['Jan', 'Feb', 'Mar', 'Apr', 'May', 'Jun', 'Jul', 'Aug', 'Sep', 'Oct', 'Nov', 'Dec'];

/** Short form for a reason line, e.g. "14 Jul". */
export function shortDate(iso: string): string {
	return `${digits(iso, 8, 10)} ${MONTHS[digits(iso, 5, 7) - 1]}`;
}
