import { addDays, format } from 'date-fns';
import { EngineInputError } from './errors';

const ISO_DAY = /^(\d{4})-(\d{2})-(\d{2})$/;
const MS_PER_DAY = 86_400_000;

/** Day number (days since 1970-01-01) of a yyyy-mm-dd date, or an error naming the field. */
export function dayNumber(iso: unknown, field: string): number {
	const m = typeof iso === 'string' ? ISO_DAY.exec(iso) : null;
	if (!m) throw new EngineInputError(field, 'must be a date written yyyy-mm-dd');
	const y = +m[1];
	const mo = +m[2];
	const d = +m[3];
	const ms = Date.UTC(y, mo - 1, d);
	const back = new Date(ms);
	// Date.UTC rolls 2025-02-30 over to March; a round trip catches it.
	if (back.getUTCFullYear() !== y || back.getUTCMonth() !== mo - 1 || back.getUTCDate() !== d) {
		throw new EngineInputError(field, `${iso} is not a calendar date`);
	}
	return ms / MS_PER_DAY;
}

/** The yyyy-mm-dd date a number of days after an ISO date (calendar days, date-fns). */
export function isoPlusDays(iso: string, days: number): string {
	const [y, m, d] = iso.split('-').map(Number);
	return format(addDays(new Date(y, m - 1, d), days), 'yyyy-MM-dd');
}

/** Short form for a reason line, e.g. "14 Jul". */
export function shortDate(iso: string): string {
	const [y, m, d] = iso.split('-').map(Number);
	return format(new Date(y, m - 1, d), 'd MMM');
}
